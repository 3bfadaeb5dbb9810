import { streamRng } from '../parallel/seeds.js';
import type { Channel } from './channel.js';
import type { DecoderOptions } from './css-decoder.js';
import { errorSamples, type ErrorSamples, FixedWeightErrors, sampleChannel, sampleFixedWeight } from './error-samples.js';
import { type DecoderMatrix, type MatrixCounts, type TrialCode, TrialEngine } from './trial-engine.js';

/** Where the errors of a point come from. */
export type SampleMode =
  | { readonly kind: 'channel' }
  | { readonly kind: 'weight'; readonly weight: number; readonly exhaustive: boolean };

/**
 * One numbered batch of one point: a pure function of this (structured-clonable) description. Random batches
 * draw from streamRng(seed, batchIndex) only, so a batch is the same whichever worker runs it; exhaustive
 * batches decode errors first .. first+count-1 of the enumeration.
 */
export interface TrialBatchTask {
  /** Identifies (code, matrices, decoder options) so that a worker can reuse the engine it built. */
  readonly key: string;
  readonly code: TrialCode;
  readonly matrices: readonly DecoderMatrix[];
  readonly decoder: DecoderOptions;
  readonly channel: Channel;
  readonly samples: SampleMode;
  readonly seed: string | number;
  readonly batchIndex: number;
  readonly first: number;
  readonly count: number;
}

export interface TrialBatchResult {
  readonly batchIndex: number;
  readonly counts: MatrixCounts[];
}

interface Prepared {
  engine: TrialEngine;
  samples: ErrorSamples;
  perm: Int32Array;
  enumeration: FixedWeightErrors | null;
}

// Engines built in this thread, by task key (a worker keeps its decoders between batches).
const prepared = new Map<string, Prepared>();
const KEEP = 4;

function prepare(task: TrialBatchTask): Prepared {
  let p = prepared.get(task.key);
  if (!p) {
    p = {
      engine: new TrialEngine(task.code, task.matrices, task.decoder),
      samples: errorSamples(task.code.n, task.count),
      perm: new Int32Array(task.code.n),
      enumeration: null,
    };
    if (prepared.size >= KEEP) prepared.delete(prepared.keys().next().value!);
    prepared.set(task.key, p);
  }
  if (p.samples.capacity < task.count) p.samples = errorSamples(task.code.n, task.count);
  return p;
}

/** The errors of one batch, into `out` (shots 0..count-1). */
export function fillBatch(task: Pick<TrialBatchTask, 'code' | 'channel' | 'samples' | 'seed' | 'batchIndex' | 'first' | 'count'>, out: ErrorSamples, perm: Int32Array, enumeration?: FixedWeightErrors): void {
  const mode = task.samples;
  if (mode.kind === 'channel') {
    sampleChannel(task.channel, streamRng(task.seed, task.batchIndex), out, task.count);
  } else if (!mode.exhaustive) {
    for (let j = 0; j < perm.length; j++) perm[j] = j;
    sampleFixedWeight(task.channel.model, mode.weight, streamRng(task.seed, task.batchIndex), perm, out, task.count);
  } else {
    const e = enumeration ?? new FixedWeightErrors(task.channel.model, task.code.n, mode.weight);
    e.fill(task.first, task.count, out);
  }
}

/** Run one batch (the `trial-batch` task kind). `clock` in milliseconds, for decodes/s only. */
export function trialBatch(task: TrialBatchTask, clock?: () => number): TrialBatchResult {
  const p = prepare(task);
  const mode = task.samples;
  if (mode.kind === 'weight' && mode.exhaustive) {
    const e = p.enumeration;
    if (!e || e.t !== mode.weight || e.model !== task.channel.model) p.enumeration = new FixedWeightErrors(task.channel.model, task.code.n, mode.weight);
  }
  fillBatch(task, p.samples, p.perm, p.enumeration ?? undefined);
  p.engine.setChannel(task.channel);
  return { batchIndex: task.batchIndex, counts: p.engine.decodeSamples(p.samples, task.count, clock) };
}

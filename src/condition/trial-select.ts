import { type BitMatrix, fromRowVectors } from '../gf2/bitmatrix.js';
import type { TrialPlan } from '../decode/runner.js';
import { trialPoint } from '../decode/runner.js';
import { decoderMatrix, type TrialCode } from '../decode/trial-engine.js';
import type { DecoderOptions } from '../decode/css-decoder.js';
import type { NoiseModel } from '../decode/channel.js';
import type { TrialSelector } from './condition.js';
import type { Pool } from './select.js';
import { ShortCycleDelta } from './cycle-delta.js';

/** How candidate matrices are scored by decoding: the same error samples for every candidate (common random numbers). */
export interface TrialScoring {
  readonly code: TrialCode;
  readonly decoder: DecoderOptions;
  readonly noise: NoiseModel;
  readonly ps: readonly number[];
  readonly shots: number;
  readonly seed: string | number;
}

/** Failures of each matrix pair, summed over the scoring points, all on the same samples. */
export function scorePairs(s: TrialScoring, pairs: readonly { label: string; dx: BitMatrix; dz: BitMatrix }[]): { failures: number[]; shots: number } {
  const matrices = pairs.map((p) => decoderMatrix(s.code, p.label, p.dx, p.dz));
  const plan: TrialPlan = {
    code: s.code, matrices, decoder: s.decoder, noise: s.noise, ps: s.ps, samples: { kind: 'channel' }, shots: s.shots,
    failures: null, timeLimit: null, batch: 256, seed: s.seed,
  };
  const failures = pairs.map(() => 0);
  let shots = 0;
  for (const p of s.ps) {
    const pc = trialPoint(plan, p);
    pc.counts.forEach((c, i) => (failures[i] = failures[i]! + c.failures));
    shots += pc.counts[0]?.shots ?? 0;
  }
  return { failures, shots };
}

/**
 * Batch selection by measured decoding performance. Candidates are ranked by the fewest new 4- and
 * 6-cycles (greedy, as the fewest-cycles strategy), the longest prefix that fits the budget is found, and
 * nested prefixes of 0, 1/8, 1/4, 1/2, 3/4 and all of it are decoded on the same error samples at every
 * scoring point; the prefix with the fewest failures wins (ties: the smaller one). `other` builds the
 * decoder pair for this side's candidate matrix (the other side's matrix stays fixed).
 */
/** What the trial strategy measured: failures of each nested prefix (summed over the scoring points), and the pick. */
export interface TrialSelection {
  /** Shots per prefix, summed over the scoring points. */
  readonly shots: number;
  readonly ps: readonly number[];
  readonly prefixes: readonly { readonly added: number; readonly failures: number }[];
  /** Added rows of the prefix kept. */
  readonly chosen: number;
}

export function trialSelector(
  s: TrialScoring,
  cols: number,
  other: (thisSide: BitMatrix) => { dx: BitMatrix; dz: BitMatrix },
  onScored?: (selection: TrialSelection) => void,
): TrialSelector {
  return (base, pool: Pool, fits) => {
    const order = cycleOrder(cols, base, pool);
    let longest: number[] = [];
    for (const i of order) {
      const next = [...longest, i];
      if (fits(next)) longest = next;
    }
    const sizes = [...new Set([0, 1 / 8, 1 / 4, 1 / 2, 3 / 4, 1].map((f) => Math.round(f * longest.length)))].sort((a, b) => a - b);
    const pairs = sizes.map((size) => {
      const rows = [...base, ...longest.slice(0, size).map((i) => pool.words[i]!)];
      return { label: `prefix ${size}`, ...other(fromRowVectors(cols, rows)) };
    });
    const { failures, shots } = scorePairs(s, pairs);
    let best = 0;
    failures.forEach((f, i) => {
      if (f < failures[best]!) best = i;
    });
    onScored?.({ shots, ps: [...s.ps], prefixes: sizes.map((added, i) => ({ added, failures: failures[i]! })), chosen: sizes[best]! });
    return longest.slice(0, sizes[best]!);
  };
}

/** Candidates in the order the fewest-cycles greedy would add them (ignoring budgets). */
function cycleOrder(cols: number, base: readonly Uint32Array[], pool: Pool): number[] {
  const cyc = new ShortCycleDelta(cols);
  for (const v of base) cyc.add(v);
  const left = new Set(pool.words.map((_, i) => i));
  const order: number[] = [];
  while (left.size > 0) {
    let best = -1;
    let key: [number, number, number] = [Infinity, Infinity, Infinity];
    for (const i of left) {
      const d = cyc.delta(pool.words[i]!);
      const k: [number, number, number] = [d.d4, d.d6, pool.weights[i]!];
      if (k[0] < key[0] || (k[0] === key[0] && (k[1] < key[1] || (k[1] === key[1] && k[2] < key[2])))) {
        best = i;
        key = k;
      }
    }
    left.delete(best);
    order.push(best);
    cyc.add(pool.words[best]!);
  }
  return order;
}

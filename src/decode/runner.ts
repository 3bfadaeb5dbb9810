import type { BitMatrix } from '../gf2/bitmatrix.js';
import { runOrdered, type TaskPool } from '../parallel/pool.js';
import type { Channel, NoiseModel } from './channel.js';
import type { DecoderOptions } from './css-decoder.js';
import { FixedWeightErrors } from './error-samples.js';
import { pairedDifferenceInterval, wilsonInterval } from './statistics.js';
import { type SampleMode, trialBatch, type TrialBatchResult, type TrialBatchTask } from './trial-batch.js';
import { addCounts, type DecoderMatrix, emptyCounts, type MatrixCounts, type TrialCode } from './trial-engine.js';
import { shardBatchCount, shardExactness, type TrialShardRecord } from './trial-shard.js';

/** Everything a trial run needs. Matrix 0 is the baseline of the paired comparisons. */
export interface TrialPlan {
  readonly code: TrialCode;
  readonly matrices: readonly DecoderMatrix[];
  readonly decoder: DecoderOptions;
  readonly noise: NoiseModel;
  readonly ps: readonly number[];
  readonly samples: SampleMode;
  /** Shots per point (cap); ignored for exhaustive points, which decode every error of the weight. */
  readonly shots: number;
  /** Stop a point once every matrix has at least this many failures (checked after each batch, in order). */
  readonly failures: number | null;
  /** Seconds for the whole run, shared out evenly over the points still to run. */
  readonly timeLimit: number | null;
  /** Shots per numbered batch (fixes the random streams; any worker count gives the same result). */
  readonly batch: number;
  readonly seed: string | number;
  /**
   * Run only the batches i ≡ index (mod count) of every point: N shards together decode exactly the batches
   * of one run (for a fixed shot count). The failure rule then applies to this shard's own batches with
   * threshold ⌈failures / count⌉, which no longer reproduces one run (see trial-shard.ts).
   */
  readonly shard?: { readonly index: number; readonly count: number };
}

/** Why a point stopped; 'interrupted' by a signal (hooks.shouldStop), 'partial' only in merged results with shards missing. */
export type StopReason = 'shots' | 'failures' | 'time' | 'interrupted' | 'partial';

/** One (matrix, p) point. */
export interface PointResult {
  label: string;
  p: number;
  shots: number;
  failures: number;
  syndromeFailures: number;
  logicalFailures: number;
  rate: number;
  interval: [number, number];
  meanIterations: number;
  /** Sum of BP iterations over the shots (meanIterations × shots, kept exact for merging). */
  iterationSum: number;
  maxIterations: number;
  osdRuns: number;
  decodesPerSecond: number;
  stoppedBy: StopReason;
}

/** Paired comparison of a matrix with the baseline (matrix 0) at one p, on the same shots. */
export interface Comparison {
  label: string;
  baseline: string;
  p: number;
  shots: number;
  /** rate(label) − rate(baseline). */
  difference: number;
  interval: [number, number];
  onlyThisFailed: number;
  onlyBaselineFailed: number;
}

export interface TrialResult {
  points: PointResult[];
  comparisons: Comparison[];
  seed: string | number;
  batch: number;
  ps: number[];
  /** Shot cap per point (or the size of the enumeration for exhaustive points). */
  shots: number;
  /** The --failures rule, null when not given. */
  failures: number | null;
  noise: NoiseModel;
  samples: SampleMode;
  decoder: DecoderOptions;
  elapsedSeconds: number;
  /** With plan.shard: which batches this run decoded, for `overcheck merge`. */
  shard?: TrialShardRecord;
}

/** Counts of all matrices at one point, and why it stopped. */
export interface PointCounts {
  counts: MatrixCounts[];
  stoppedBy: StopReason;
}

/** Number of shots of a point: the shot cap, or the size of the enumeration for exhaustive points. */
export function pointShots(plan: Pick<TrialPlan, 'samples' | 'shots' | 'code' | 'noise'>): number {
  const s = plan.samples;
  if (s.kind === 'weight' && s.exhaustive) return new FixedWeightErrors(plan.noise, plan.code.n, s.weight).total;
  return plan.shots;
}

/** A stable key for (code, matrices, decoder options): FNV-1a over the packed data. */
export function planKey(plan: Pick<TrialPlan, 'code' | 'matrices' | 'decoder'>): string {
  let h = 0x811c9dc5;
  const mix = (x: number) => {
    h = Math.imul(h ^ (x >>> 0), 0x01000193);
  };
  const mat = (m: BitMatrix) => {
    mix(m.rows);
    mix(m.cols);
    for (let i = 0; i < m.data.length; i++) mix(m.data[i]!);
  };
  mat(plan.code.hx);
  mat(plan.code.hz);
  mat(plan.code.lx);
  mat(plan.code.lz);
  for (const m of plan.matrices) {
    mat(m.dx);
    mat(m.dz);
  }
  const text = JSON.stringify(plan.decoder);
  for (let i = 0; i < text.length; i++) mix(text.charCodeAt(i));
  return `${(h >>> 0).toString(16)}:${plan.matrices.length}:${plan.code.n}`;
}

function batchTask(plan: TrialPlan, key: string, ch: Channel, total: number, i: number): TrialBatchTask {
  const first = i * plan.batch;
  return {
    key,
    code: plan.code,
    matrices: plan.matrices,
    decoder: plan.decoder,
    channel: ch,
    samples: plan.samples,
    seed: plan.seed,
    batchIndex: i,
    first,
    count: Math.min(plan.batch, total - first),
  };
}

/** Merge one batch (in index order); returns whether the failure rule (threshold, null: none) now stops the point. */
function mergeBatch(threshold: number | null, into: MatrixCounts[], r: TrialBatchResult): boolean {
  r.counts.forEach((c, k) => addCounts(into[k]!, c));
  return threshold !== null && into.every((c) => c.failures >= threshold);
}

/** The failure threshold a process applies: the whole rule unsharded, ⌈F/N⌉ of its own batches as shard I/N. */
export function failureThreshold(plan: Pick<TrialPlan, 'failures' | 'shard'>): number | null {
  if (plan.failures === null) return null;
  return plan.shard ? Math.ceil(plan.failures / plan.shard.count) : plan.failures;
}

/**
 * One point, synchronously on this thread: the batches a run of `runTrial` would decode for this p, merged
 * with the same stopping rule (so the counts are identical). For stages that call the engine as a library.
 */
export function trialPoint(plan: TrialPlan, p: number, clock?: () => number): PointCounts {
  const ch: Channel = { model: plan.noise, p };
  const total = pointShots(plan);
  const key = planKey(plan);
  const counts = plan.matrices.map(emptyCounts);
  const batches = Math.ceil(total / plan.batch);
  for (let i = 0; i < batches; i++) {
    if (mergeBatch(plan.failures, counts, trialBatch(batchTask(plan, key, ch, total, i), clock))) return { counts, stoppedBy: 'failures' };
  }
  return { counts, stoppedBy: 'shots' };
}

export interface RunHooks {
  /** Milliseconds, for the time limit and decodes/s. */
  now: () => number;
  /** Asked before each batch is started (a signal): a yes ends this point and skips the rest ('interrupted'). */
  shouldStop?: () => boolean;
  /** Called after each merged batch. */
  onProgress?: (p: number, pointIndex: number, counts: readonly MatrixCounts[], totalShots: number) => void;
}

/** Run every point of the plan on the pool (batches in flight on all workers, merged in index order). */
export async function runTrial(plan: TrialPlan, pool: TaskPool, hooks: RunHooks): Promise<TrialResult> {
  const key = planKey(plan);
  const total = pointShots(plan);
  const batches = Math.ceil(total / plan.batch);
  // this process's batches: all of them, or with shard I/N those ≡ I (mod N), in increasing order
  const shard = plan.shard ?? { index: 0, count: 1 };
  const mine = shardBatchCount(batches, shard.index, shard.count);
  const batchId = (t: number) => shard.index + t * shard.count;
  // the shard's own share of the failure rule
  const threshold = failureThreshold(plan);
  const started = hooks.now();
  const points: PointResult[] = [];
  const comparisons: Comparison[] = [];
  const record: TrialShardRecord['points'] = [];
  for (let pi = 0; pi < plan.ps.length; pi++) {
    const p = plan.ps[pi]!;
    const ch: Channel = { model: plan.noise, p };
    const counts = plan.matrices.map(emptyCounts);
    let stoppedBy: StopReason | null = null;
    let merged = 0;
    const deadline = plan.timeLimit === null ? Infinity : hooks.now() + (started + plan.timeLimit * 1000 - hooks.now()) / (plan.ps.length - pi);
    await runOrdered<TrialBatchResult>(
      pool,
      mine,
      (t) => ({ kind: 'trial-batch', payload: batchTask(plan, key, ch, total, batchId(t)) }),
      (_, r) => {
        if (stoppedBy !== null) return; // a batch started before the stop: not part of the point
        merged++;
        if (mergeBatch(threshold, counts, r)) stoppedBy = 'failures';
        else if (hooks.now() > deadline) stoppedBy = 'time';
        hooks.onProgress?.(p, pi, counts, total);
      },
      () => stoppedBy !== null || hooks.now() > deadline || (hooks.shouldStop?.() ?? false),
    );
    const reason: StopReason = stoppedBy ?? (merged < mine ? (hooks.shouldStop?.() ? 'interrupted' : 'time') : 'shots');
    points.push(...pointResults(plan, p, counts, reason));
    comparisons.push(...pointComparisons(plan, p, counts));
    record.push({ p, batches, done: { [String(shard.index)]: merged }, stoppedBy: { [String(shard.index)]: reason } });
  }
  const result: TrialResult = {
    points,
    comparisons,
    seed: plan.seed,
    batch: plan.batch,
    ps: [...plan.ps],
    shots: total,
    failures: plan.failures,
    noise: plan.noise,
    samples: plan.samples,
    decoder: plan.decoder,
    elapsedSeconds: (hooks.now() - started) / 1000,
  };
  if (plan.shard) {
    const exact = shardExactness(record, [shard.index], shard.count, plan.failures, points);
    result.shard = { count: shard.count, parts: [shard.index], failuresPerShard: threshold, points: record, exact: exact.exact, ...(exact.why ? { why: exact.why } : {}) };
  }
  return result;
}

export function pointResults(plan: { readonly matrices: readonly { readonly label: string }[] }, p: number, counts: readonly MatrixCounts[], stoppedBy: StopReason): PointResult[] {
  return counts.map((c, k) => ({
    label: plan.matrices[k]!.label,
    p,
    shots: c.shots,
    failures: c.failures,
    syndromeFailures: c.syndromeFailures,
    logicalFailures: c.logicalFailures,
    rate: c.shots > 0 ? c.failures / c.shots : 0,
    interval: wilsonInterval(c.failures, c.shots),
    meanIterations: c.shots > 0 ? c.iterationSum / c.shots : 0,
    iterationSum: c.iterationSum,
    maxIterations: c.iterationMax,
    osdRuns: c.osdRuns,
    decodesPerSecond: c.seconds > 0 ? c.shots / c.seconds : 0,
    stoppedBy,
  }));
}

export function pointComparisons(plan: { readonly matrices: readonly { readonly label: string }[] }, p: number, counts: readonly MatrixCounts[]): Comparison[] {
  const out: Comparison[] = [];
  for (let k = 1; k < counts.length; k++) {
    const c = counts[k]!;
    const both = c.failures - c.onlyThisFailed;
    const d = pairedDifferenceInterval({ both, onlyFirst: c.onlyThisFailed, onlySecond: c.onlyBaselineFailed, neither: c.shots - both - c.onlyThisFailed - c.onlyBaselineFailed });
    out.push({
      label: plan.matrices[k]!.label,
      baseline: plan.matrices[0]!.label,
      p,
      shots: c.shots,
      difference: d.difference,
      interval: d.interval,
      onlyThisFailed: c.onlyThisFailed,
      onlyBaselineFailed: c.onlyBaselineFailed,
    });
  }
  return out;
}

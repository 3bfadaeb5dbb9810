import type { IsdSettings, PairCounts, SternCounts } from './isd.js';
import { InputError } from '../errors.js';
import { grayChunkCount, grayLowBits } from './gray.js';
import { choose, logChoose, segmentMissProbability, sternSuccess } from './probability.js';

/** How a row-space search will run, and why; every field is reported with the result. */
export type SearchPlan =
  | { method: 'exhaustive'; reason: string; lowBits: number; chunks: number; combinations: number }
  | {
      method: 'isd';
      reason: string;
      settings: IsdSettings;
      /** Information sets per chunk (a multiple of the segment). */
      chunkIterations: number;
      /** Estimated cost of one information set (STEP_COST units, about 1 ns of one core each). */
      costPerIteration: number;
      /** Iterations needed for the requested miss probability at weight maxWeight (if one was given). */
      iterationsForTarget: number | null;
    };

/** Word-operation budget under which exhaustive enumeration is preferred (a few seconds per core). */
export const EXHAUSTIVE_BUDGET = 2 ** 33;
/** Cost (STEP_COST units) one chunk aims at. */
const CHUNK_WORK = 6e7;

/** Per-weight miss probability of one word after `iterations` information sets with these settings. */
export function missProbability(n: number, k: number, w: number, s: IsdSettings, iterations: number): number {
  if (iterations <= 0) return 1;
  if (s.variant === 'stern') {
    const q = sternSuccess(n, k, w, s.p, s.window);
    return q >= 1 ? 0 : Math.exp(iterations * Math.log1p(-q));
  }
  const seg = s.segment;
  const full = Math.floor(iterations / seg);
  const rest = iterations - full * seg;
  const a = full > 0 ? Math.exp(full * Math.log(segmentMissProbability(n, k, w, s.p, seg))) : 1;
  return a * (rest > 0 ? segmentMissProbability(n, k, w, s.p, rest) : 1);
}

/** Iterations needed so that a word of weight w is missed with probability below target. */
export function iterationsFor(n: number, k: number, w: number, s: IsdSettings, target: number): number {
  if (s.variant === 'stern') {
    const q = sternSuccess(n, k, w, s.p, s.window);
    if (q >= 1) return 1;
    if (q <= 0) return Infinity;
    return Math.ceil(Math.log(target) / Math.log1p(-q));
  }
  const m = segmentMissProbability(n, k, w, s.p, s.segment);
  if (m <= 0) return s.segment;
  if (m >= 1) return Infinity;
  return s.segment * Math.ceil(Math.log(target) / Math.log(m));
}

/**
 * Cost of the kernels' steps (isd.ts), in units of about one nanosecond of one core of the development
 * machine: fitted to one-thread timings of every variant on bb, gb, hgp and random codes against exact
 * operation counts (scripts/bench/planner.ts prints the check; DEVELOPERS.md has the figures). Only their
 * ratios matter for the choice; their scale sets the chunk length.
 */
export const STEP_COST = {
  /** per word copied or column shuffled when a fresh information set starts */
  setup: 26,
  /** per row XORed in a pivot step (loop, bit test, branch), and per word of it */
  rowXor: 12,
  wordXor: 0.75,
  /** per row scanned in a column swap (finding the rows that cover the new column, then the pivot step's tests) */
  swapScan: 16.5,
  /** per pair of rows tested on its first two words (Lee–Brickell p = 2) */
  pair: 3.25,
  /** per pair that passes that test, and per further word read for it */
  pairWord: 7.8,
  /** per sum of weight ≤ W sent to the word store */
  keep: 38,
  /** per half-sum bucketed or looked up (Stern) */
  subset: 12.5,
  /** per window collision, and per word combined for it (Stern) */
  collision: 9,
  collisionWord: 4.3,
  /** per window bit projected, row shuffled into a half, or four columns cleared from the window marks (Stern) */
  window: 5.2,
} as const;

/** Kernel counts measured on a probe information set (isd.ts pairProbe, sternProbe); the model's stand-ins otherwise. */
export interface MeasuredCounts {
  readonly pairs?: PairCounts;
  readonly stern?: (p: number, window: number) => SternCounts;
}

/** Fraction of a fresh elimination's pivot steps that XOR a given row, per unit of systematic-row density (fitted, 0.65–0.78). */
const FILL = 0.72;

/** P(Binomial(m, q) ≤ t). */
function binomialAtMost(m: number, q: number, t: number): number {
  if (t < 0) return 0;
  if (t >= m) return 1;
  if (q <= 0) return 1;
  if (q >= 1) return 0;
  let sum = 0;
  for (let i = 0; i <= t; i++) sum += Math.exp(logChoose(m, i) + i * Math.log(q) + (m - i) * Math.log1p(-q));
  return Math.min(1, sum);
}

/**
 * Estimated cost of one information set under the settings (STEP_COST units): elimination (fresh, or one
 * column swap within a segment), then the Lee–Brickell rows and pairs or the Stern step. The counts that
 * depend on the code's structure (pairs passing the early test, Stern window collisions, sums kept) come
 * from `measured` when given; otherwise from a random-code model at the given systematic-row density, which
 * underestimates sparse codes.
 */
export function iterationCost(n: number, k: number, maxWeight: number, s: IsdSettings, density = 0.5, measured?: MeasuredCounts): number {
  const C = STEP_COST;
  const W = maxWeight;
  const stride = Math.ceil(n / 32);
  const d = Math.min(1, Math.max(0, density));
  const rowWork = C.rowXor + C.wordXor * stride;
  const fresh = C.setup * (n + k * stride) + FILL * d * k * k * rowWork;
  const swap = C.swapScan * k + d * k * rowWork;
  const elim = (fresh + (s.segment - 1) * swap) / s.segment;
  // random-code stand-ins: a row has density d outside I, a sum of two rows 2d(1 − d)
  const outside = Math.max(0, n - k);
  const rho2 = Math.max(1e-6, 2 * d * (1 - d));
  const early = Math.min(stride, 1 + Math.ceil((W + 1) / (32 * rho2)));
  if (s.variant === 'lee-brickell') {
    const pairsMeasured = measured?.pairs;
    const keptRows = pairsMeasured ? pairsMeasured.keptRows : k * binomialAtMost(outside, d, W - 1);
    let cost = elim + C.keep * keptRows;
    if (s.p < 2) return cost;
    const pairs = (k * (k - 1)) / 2;
    let words: number;
    let keptPairs: number;
    if (pairsMeasured) {
      words = pairsMeasured.words;
      keptPairs = pairsMeasured.keptPairs;
    } else {
      // the first two words cover about min(64, n)·(n − k)/n columns outside I and the two pivots' share
      const head = Math.min(64, n);
      const pass = binomialAtMost(Math.round((head * outside) / n), rho2, W - Math.round((2 * head) / n));
      words = pairs * pass * (1 + Math.min(Math.max(0, stride - 2), (W + 1) / (32 * rho2 * (outside / n))));
      keptPairs = pairs * binomialAtMost(outside, rho2, W - 2);
    }
    cost += C.pair * pairs + C.pairWord * words + C.keep * keptPairs;
    return cost;
  }
  const k1 = Math.floor(k / 2);
  let subsets = 0;
  for (let i = 0; i <= s.p; i++) subsets += choose(k1, i) + choose(k - k1, i);
  let counts = measured?.stern?.(s.p, s.window);
  if (!counts) {
    // two sums of about p rows agree on one window bit with probability 1 − 2b(1 − b), b = P(bit = 1)
    const b = (1 - Math.pow(1 - 2 * d, Math.max(1, s.p))) / 2;
    const agree = 1 - 2 * b * (1 - b);
    const collisions = Math.exp(logSubsets(k1, s.p) + logSubsets(k - k1, s.p)) * Math.pow(agree, s.window);
    counts = { collisions, words: collisions * early, kept: 0 };
  }
  return elim + C.window * (n / 4 + k * s.window + k) + C.subset * subsets + C.collision * counts.collisions + C.collisionWord * counts.words + C.keep * counts.kept;
}

function logSubsets(m: number, p: number): number {
  let t = 0;
  for (let i = 0; i <= p; i++) t += choose(m, i);
  return Math.log(t);
}

/**
 * The information-set variants the planner compares: Lee–Brickell p = 1, 2 with fresh information sets or
 * segments of swaps, and (unless more than 5% of the systematic rows are far sparser than the mean) Stern
 * p = 1, 2 with windows around log2 of the half-enumeration size. Duplicates (equal windows) are dropped.
 */
export function isdCandidates(n: number, k: number, W: number, sparseRows = 0): IsdSettings[] {
  const candidates: IsdSettings[] = [];
  const segments = [1, 8, Math.max(8, Math.round(k / 2))];
  for (const p of [1, 2]) for (const segment of new Set(segments)) candidates.push({ variant: 'lee-brickell', p, window: 0, segment });
  for (const p of sparseRows > 0.05 ? [] : [1, 2]) {
    const base = Math.round(Math.log2(Math.max(2, Math.exp(logSubsets(Math.floor(k / 2), p)))));
    const windows = new Set<number>();
    for (const d of [-2, 0, 2]) {
      const window = Math.max(1, Math.min(20, n - k - W, base + d));
      if (window >= 1 && n - k - window >= W) windows.add(window);
    }
    for (const window of windows) candidates.push({ variant: 'stern', p, window, segment: 1 });
  }
  return candidates;
}

export interface PlanRequest {
  n: number;
  k: number;
  maxWeight: number;
  method: 'auto' | 'exhaustive' | 'isd';
  /** Miss probability the run aims for (used to compare methods). */
  targetMiss: number;
  /** Mean density of the systematic rows outside the information set (0.5 for a random code). */
  density?: number;
  /** Fraction of systematic rows far sparser than the mean: Stern is not considered when above 5%. */
  sparseRows?: number;
  /**
   * Kernel counts measured on a probe information set: Lee–Brickell pairs passing the early test, Stern window
   * collisions and the words combined for them (far more exact on sparse codes than the random-code model).
   */
  measured?: MeasuredCounts;
}

/**
 * Choose the method: exhaustive Gray-code enumeration when 2^k·stride fits EXHAUSTIVE_BUDGET (or when
 * asked), else the information-set variant with the least estimated time to reach targetMiss at the
 * heaviest weight asked for (the hardest to hit), among Lee–Brickell p = 1, 2 with fresh or swapped
 * information sets and Stern p = 1, 2 with windows around log2 of the half-enumeration size.
 */
export function planSearch(req: PlanRequest): SearchPlan {
  const { n, k, maxWeight: W } = req;
  const stride = Math.ceil(n / 32);
  const exhaustiveWork = 2 ** k * stride;
  if (req.method === 'exhaustive' || (req.method === 'auto' && exhaustiveWork <= EXHAUSTIVE_BUDGET)) {
    if (k > 48) throw new InputError(`--method exhaustive: enumerating all 2^${k} words of the row space is out of reach (at most 2^48); use --method isd or auto`);
    return {
      method: 'exhaustive',
      reason: req.method === 'exhaustive' ? 'requested' : `2^${k} combinations × ${stride} words fits the exhaustive budget`,
      lowBits: grayLowBits(k),
      chunks: grayChunkCount(k),
      combinations: 2 ** k,
    };
  }
  const candidates = isdCandidates(n, k, W, req.sparseRows ?? 0);
  let best: { s: IsdSettings; total: number; iters: number } | null = null;
  for (const s of candidates) {
    let iters = 0;
    for (let w = 1; w <= W; w++) iters = Math.max(iters, iterationsFor(n, k, w, s, req.targetMiss));
    const total = iters * iterationCost(n, k, W, s, req.density, req.measured);
    if (!Number.isFinite(total)) continue;
    if (!best || total < best.total) best = { s, total, iters };
  }
  if (!best) {
    throw new InputError(
      `information-set search cannot reach weight ${W} here: a word is found only with at most 2 ones on the information set, ` +
        `but only n − k = ${n - k} columns lie outside it; use --method exhaustive or a lower --max-weight`,
    );
  }
  const cost = iterationCost(n, k, W, best.s, req.density, req.measured);
  // chunks of about CHUNK_WORK cost units (a few hundredths of a second), but at least 16 of them for the planned run (parallelism)
  const byWork = Math.max(1, Math.round(CHUNK_WORK / cost / best.s.segment));
  const byTarget = Number.isFinite(best.iters) ? Math.max(1, Math.ceil(best.iters / 16 / best.s.segment)) : byWork;
  // ... and never below an eighth of the work size, so the main thread's merge keeps up with the workers
  const per = Math.max(Math.min(byWork, byTarget), Math.ceil(byWork / 8)) * best.s.segment;
  const name = best.s.variant === 'stern' ? `Stern p=${best.s.p} window=${best.s.window}` : `Lee–Brickell p=${best.s.p}`;
  return {
    method: 'isd',
    reason: `${name}, ${best.s.segment > 1 ? `${best.s.segment - 1} column swaps per fresh information set` : 'fresh information sets'}: least estimated time (${best.total.toExponential(2)} cost units of about 1 ns, ${best.iters} information sets at systematic-row density ${(req.density ?? 0.5).toFixed(3)}${req.measured ? ', kernel counts from a probe information set' : ''}) to miss probability ${req.targetMiss} at every weight ≤ ${W}; exhaustive would need 2^${k}·${stride} = ${exhaustiveWork.toExponential(2)}`,
    settings: best.s,
    chunkIterations: per,
    costPerIteration: cost,
    iterationsForTarget: Number.isFinite(best.iters) ? best.iters : null,
  };
}


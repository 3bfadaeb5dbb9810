import type { IsdSettings } from './isd.js';
import { InputError } from '../errors.js';
import { grayChunkCount, grayLowBits } from './gray.js';
import { choose, segmentMissProbability, sternSuccess } from './probability.js';

/** How a row-space search will run, and why; every field is reported with the result. */
export type SearchPlan =
  | { method: 'exhaustive'; reason: string; lowBits: number; chunks: number; combinations: number }
  | {
      method: 'isd';
      reason: string;
      settings: IsdSettings;
      /** Information sets per chunk (a multiple of the segment). */
      chunkIterations: number;
      /** Estimated word operations per information set. */
      costPerIteration: number;
      /** Iterations needed for the requested miss probability at weight maxWeight (if one was given). */
      iterationsForTarget: number | null;
    };

/** Word-operation budget under which exhaustive enumeration is preferred (a few seconds per core). */
export const EXHAUSTIVE_BUDGET = 2 ** 33;
const CHUNK_WORK = 3e7;

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

/** Word operations per information set under the settings (elimination, swaps, enumeration). */
export function iterationCost(n: number, k: number, maxWeight: number, s: IsdSettings, density = 0.5, measuredCollisions?: (p: number, window: number) => number): number {
  const stride = Math.ceil(n / 32);
  // popcount stops once the weight exceeds W: about (W + 1) / (32·ρ₂) words, ρ₂ the density of a sum of two rows
  const rho2 = Math.max(1e-6, 2 * density * (1 - density));
  const early = Math.min(stride, 1 + Math.ceil((maxWeight + 1) / (32 * rho2)));
  const fresh = (k * k * stride) / 2 + n * k / 8;
  const swap = (k * stride) / 2 + k;
  const elim = (fresh + (s.segment - 1) * swap) / s.segment;
  if (s.variant === 'lee-brickell') return elim + k * early + (s.p >= 2 ? (k * (k - 1) / 2) * early : 0);
  const k1 = Math.floor(k / 2);
  let subsets = 0;
  for (let i = 0; i <= s.p; i++) subsets += choose(k1, i) + choose(k - k1, i);
  // two sums of about p rows agree on one window bit with probability 1 − 2b(1 − b), b = P(bit = 1)
  const b = (1 - Math.pow(1 - 2 * density, Math.max(1, s.p))) / 2;
  const agree = 1 - 2 * b * (1 - b);
  const collisions = measuredCollisions ? measuredCollisions(s.p, s.window) : Math.exp(logSubsets(k1, s.p) + logSubsets(k - k1, s.p)) * Math.pow(agree, s.window);
  return elim + k * s.window / 4 + subsets * 2 + 2 ** s.window / 8 + collisions * early * 2;
}

function logSubsets(m: number, p: number): number {
  let t = 0;
  for (let i = 0; i <= p; i++) t += choose(m, i);
  return Math.log(t);
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
  /** Window collisions of one Stern step measured on a probe information set (more exact than the model). */
  sternCollisions?: (p: number, window: number) => number;
}

/**
 * Choose the method: exhaustive Gray-code enumeration when 2^k·stride fits EXHAUSTIVE_BUDGET (or when
 * asked), else the information-set variant with the least estimated work to reach targetMiss at the
 * heaviest weight asked for (the hardest to hit), among Lee–Brickell p = 1, 2 with fresh or swapped
 * information sets and Stern p = 1, 2 with windows around log2 of the half-enumeration size.
 */
export function planSearch(req: PlanRequest): SearchPlan {
  const { n, k, maxWeight: W } = req;
  const stride = Math.ceil(n / 32);
  const exhaustiveWork = 2 ** k * stride;
  if (req.method === 'exhaustive' || (req.method === 'auto' && exhaustiveWork <= EXHAUSTIVE_BUDGET)) {
    if (k > 48) throw new RangeError(`exhaustive enumeration of 2^${k} words is out of reach`);
    return {
      method: 'exhaustive',
      reason: req.method === 'exhaustive' ? 'requested' : `2^${k} combinations × ${stride} words fits the exhaustive budget`,
      lowBits: grayLowBits(k),
      chunks: grayChunkCount(k),
      combinations: 2 ** k,
    };
  }
  const candidates: IsdSettings[] = [];
  const segments = [1, 8, Math.max(8, Math.round(k / 2))];
  for (const p of [1, 2]) for (const segment of segments) candidates.push({ variant: 'lee-brickell', p, window: 0, segment });
  for (const p of (req.sparseRows ?? 0) > 0.05 ? [] : [1, 2]) {
    const base = Math.round(Math.log2(Math.max(2, Math.exp(logSubsets(Math.floor(k / 2), p)))));
    for (const d of [-2, 0, 2]) {
      const window = Math.max(1, Math.min(20, n - k - W, base + d));
      if (window >= 1 && n - k - window >= W) candidates.push({ variant: 'stern', p, window, segment: 1 });
    }
  }
  let best: { s: IsdSettings; total: number; iters: number } | null = null;
  for (const s of candidates) {
    let iters = 0;
    for (let w = 1; w <= W; w++) iters = Math.max(iters, iterationsFor(n, k, w, s, req.targetMiss));
    const total = iters * iterationCost(n, k, W, s, req.density, req.sternCollisions);
    if (!Number.isFinite(total)) continue;
    if (!best || total < best.total) best = { s, total, iters };
  }
  if (!best) {
    throw new InputError(
      `information-set search cannot reach weight ${W} here: a word is found only with at most 2 ones on the information set, ` +
        `but only n − k = ${n - k} columns lie outside it; use --method exhaustive or a lower --max-weight`,
    );
  }
  const cost = iterationCost(n, k, W, best.s, req.density, req.sternCollisions);
  // chunks of about CHUNK_WORK word operations, but at least 16 of them for the planned run (parallelism)
  const byWork = Math.max(1, Math.round(CHUNK_WORK / cost / best.s.segment));
  const byTarget = Number.isFinite(best.iters) ? Math.max(1, Math.ceil(best.iters / 16 / best.s.segment)) : byWork;
  // ... and never below an eighth of the work size, so the main thread's merge keeps up with the workers
  const per = Math.max(Math.min(byWork, byTarget), Math.ceil(byWork / 8)) * best.s.segment;
  const name = best.s.variant === 'stern' ? `Stern p=${best.s.p} window=${best.s.window}` : `Lee–Brickell p=${best.s.p}`;
  return {
    method: 'isd',
    reason: `${name}, ${best.s.segment > 1 ? `${best.s.segment - 1} column swaps per fresh information set` : 'fresh information sets'}: least estimated work (${best.total.toExponential(2)} word operations at systematic-row density ${(req.density ?? 0.5).toFixed(3)}) to miss probability ${req.targetMiss} at every weight ≤ ${W}; exhaustive would need 2^${k}·${stride} = ${exhaustiveWork.toExponential(2)}`,
    settings: best.s,
    chunkIterations: per,
    costPerIteration: cost,
    iterationsForTarget: Number.isFinite(best.iters) ? best.iters : null,
  };
}


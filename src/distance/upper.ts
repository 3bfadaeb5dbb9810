/**
 * Upper bounds on the minimum weight of the filtered words of a code (for a CSS code: the lightest
 * logical operator of one type) by randomized information-set search, and the confidence that comes with it.
 *
 * Interim kernel: plain random information sets with Lee–Brickell p = 1 (each row of the systematic form
 * is a codeword with exactly one 1 on the information set). The shared information-set library of the
 * search stage will replace `leeBrickellChunk`; the driver below only needs "words found in a numbered
 * chunk" and "per-iteration success probability for weight w".
 */
import { type Xoshiro128, streamRng } from '../parallel/seeds.js';
import { type TaskPool, runOrdered } from '../parallel/pool.js';
import type { AugmentedBasis } from './augmented.js';
import { keyOf, type WordCollection } from './words.js';

/** Iterations per numbered chunk: the unit of seeding, merging and stopping (independent of workers). */
export const ISD_CHUNK_ITERATIONS = 64;

export interface IsdChunkResult {
  readonly iterations: number;
  /** Distinct words found (weight ≤ maxWeight, passing the filter), packed, count × codeWords. */
  readonly words: Uint32Array;
  readonly count: number;
}

/**
 * `iterations` rounds of: random column order, Gauss–Jordan elimination taking pivots in that order
 * (an information set of `dim` columns), then every row of the systematic form is checked.
 * Rows of weight ≤ maxWeight that pass the filter are returned, deduplicated within the chunk.
 * Buffers are allocated once per chunk, not per iteration.
 */
export function leeBrickellChunk(b: AugmentedBasis, maxWeight: number, iterations: number, rng: Xoshiro128): IsdChunkResult {
  const { n, dim, rowWords: S, codeWords: C } = b;
  const work = new Uint32Array(b.rows.length);
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  const seen = new Set<string>();
  const found: number[] = [];
  const filtered = S > C;
  for (let it = 0; it < iterations; it++) {
    work.set(b.rows);
    for (let i = n - 1; i > 0; i--) {
      const j = rng.below(i + 1);
      const tmp = order[i]!;
      order[i] = order[j]!;
      order[j] = tmp;
    }
    let r = 0;
    for (let ci = 0; ci < n && r < dim; ci++) {
      const c = order[ci]!;
      const w = c >>> 5;
      const bit = 1 << (c & 31);
      let p = -1;
      for (let i = r; i < dim; i++) {
        if (work[i * S + w]! & bit) {
          p = i;
          break;
        }
      }
      if (p < 0) continue;
      const ro = r * S;
      if (p !== r) {
        const po = p * S;
        for (let k = 0; k < S; k++) {
          const tmp = work[ro + k]!;
          work[ro + k] = work[po + k]!;
          work[po + k] = tmp;
        }
      }
      for (let i = 0; i < dim; i++) {
        if (i !== r && work[i * S + w]! & bit) {
          const io = i * S;
          for (let k = 0; k < S; k++) work[io + k] = work[io + k]! ^ work[ro + k]!;
        }
      }
      r++;
    }
    for (let i = 0; i < dim; i++) {
      const o = i * S;
      let wt = 0;
      for (let k = 0; k < C; k++) {
        let x = work[o + k]!;
        x = x - ((x >>> 1) & 0x55555555);
        x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
        wt += Math.imul((x + (x >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24;
      }
      if (wt > maxWeight || wt === 0) continue;
      if (filtered) {
        let nz = 0;
        for (let k = C; k < S; k++) nz |= work[o + k]!;
        if (nz === 0) continue;
      }
      const key = keyOf(work.subarray(o, o + C), C);
      if (seen.has(key)) continue;
      seen.add(key);
      for (let k = 0; k < C; k++) found.push(work[o + k]!);
    }
  }
  return { iterations, words: Uint32Array.from(found), count: found.length / Math.max(1, C) };
}

// ---------------------------------------------------------------------------------------------------------
// Success and miss probabilities

const logFactorials: number[] = [0];
function logFactorial(n: number): number {
  while (logFactorials.length <= n) logFactorials.push(logFactorials[logFactorials.length - 1]! + Math.log(logFactorials.length));
  return logFactorials[n]!;
}

function logBinomial(n: number, k: number): number {
  if (k < 0 || k > n) return -Infinity;
  return logFactorial(n) - logFactorial(k) - logFactorial(n - k);
}

/**
 * Per-iteration probability that Lee–Brickell p = 1 returns a given codeword of weight w: the chance that a
 * uniformly random information set of size `dim` among n columns meets its support in exactly one column,
 * w·C(n−w, dim−1) / C(n, dim) (the standard model: information sets treated as uniform random subsets).
 */
export function leeBrickellSuccess(n: number, dim: number, w: number): number {
  if (w < 1 || w > n || dim < 1) return 0;
  return Math.exp(Math.log(w) + logBinomial(n - w, dim - 1) - logBinomial(n, dim));
}

/**
 * Probability that a given word of some weight w in [from, to] was missed by `iterations` independent
 * iterations: the largest (1 − p_w)^iterations over that range (0 when the range is empty).
 */
export function missProbability(success: (w: number) => number, iterations: number, from: number, to: number): number {
  let worst = 0;
  for (let w = Math.max(1, from); w <= to; w++) {
    const p = success(w);
    const miss = p >= 1 ? 0 : Math.exp(iterations * Math.log1p(-p));
    if (miss > worst) worst = miss;
  }
  return worst;
}

// ---------------------------------------------------------------------------------------------------------
// Driver

export interface IsdPhaseOptions {
  readonly seed: string | number;
  /** Stream index of chunk 0; chunk c uses streamRng(seed, streamBase + c). */
  readonly streamBase: number;
  /** Iterations done by earlier phases on the same streams (chunk numbering continues after them). */
  readonly startIteration: number;
  readonly maxIterations: number;
  /** Stop once the miss probability for weights in [lowerBound, U − 1] is ≤ this (0: never). */
  readonly targetMiss: number;
  readonly lowerBound: number;
}

export type IsdStop = 'target-miss' | 'iterations' | 'stopped';

export interface IsdPhaseResult {
  readonly iterations: number;
  readonly stoppedBy: IsdStop;
}

export interface IsdChunkPayload {
  readonly basis: AugmentedBasis;
  readonly maxWeight: number;
  readonly iterations: number;
  readonly seed: string | number;
  readonly stream: number;
}

/** Worker task body: one numbered chunk of the search. */
export function isdChunkTask(p: IsdChunkPayload): IsdChunkResult {
  return leeBrickellChunk(p.basis, p.maxWeight, p.iterations, streamRng(p.seed, p.stream));
}

/** Per-iteration success probability of the kernel in use, for weight w. */
export function kernelSuccess(b: AugmentedBasis): (w: number) => number {
  return (w) => leeBrickellSuccess(b.n, b.dim, w);
}

/**
 * Run numbered chunks of the search, merging them in chunk order into `collection` (adaptive: it keeps
 * the lightest words). Each chunk is dispatched with W = the current limit, which is never below the final
 * one, so the merged minimum-weight set is the same for any worker count. The stop rules are evaluated
 * after each merged chunk, in order; chunks already running past the stopping point are ignored.
 */
export async function runInformationSetPhase(
  pool: TaskPool,
  basis: AugmentedBasis,
  collection: WordCollection,
  o: IsdPhaseOptions,
  shouldStop: () => boolean,
  onChunk?: (iterations: number, miss: number) => void,
): Promise<IsdPhaseResult> {
  const success = kernelSuccess(basis);
  const firstChunk = Math.floor(o.startIteration / ISD_CHUNK_ITERATIONS);
  const budget = o.maxIterations;
  const chunks = Number.isFinite(budget) ? Math.ceil(budget / ISD_CHUNK_ITERATIONS) : Number.MAX_SAFE_INTEGER;
  let done = 0;
  let stopAt: IsdStop | null = null;
  const missNow = (iters: number) => missProbability(success, o.startIteration + iters, o.lowerBound, collection.limit - 1);
  if (o.targetMiss > 0 && missNow(0) <= o.targetMiss) return { iterations: 0, stoppedBy: 'target-miss' };
  await runOrdered<IsdChunkResult>(
    pool,
    chunks,
    (c) => {
      const iterations = Number.isFinite(budget) ? Math.min(ISD_CHUNK_ITERATIONS, budget - c * ISD_CHUNK_ITERATIONS) : ISD_CHUNK_ITERATIONS;
      const payload: IsdChunkPayload = { basis, maxWeight: collection.limit, iterations, seed: o.seed, stream: o.streamBase + firstChunk + c };
      return { kind: 'distance.isd', payload };
    },
    (_c, r) => {
      if (stopAt) return;
      const C = basis.codeWords;
      for (let i = 0; i < r.count; i++) collection.add(r.words.subarray(i * C, (i + 1) * C));
      done += r.iterations;
      const miss = missNow(done);
      onChunk?.(done, miss);
      if (o.targetMiss > 0 && miss <= o.targetMiss) stopAt = 'target-miss';
      else if (done >= budget) stopAt = 'iterations';
    },
    () => stopAt !== null || shouldStop(),
  );
  return { iterations: done, stoppedBy: stopAt ?? (done >= budget ? 'iterations' : 'stopped') };
}

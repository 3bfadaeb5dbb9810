/**
 * Upper bounds on the minimum weight of the filtered words of a code (for a CSS code: the lightest
 * logical operator of one type) by randomized information-set search, and the confidence that comes with it.
 *
 * The kernel is the search stage's (src/search/isd.ts: random information sets, Canteaut–Chabaud swap
 * steps, Lee–Brickell p ≤ 2, Stern), called with the filter so that only words w with w·filterᵀ ≠ 0 come
 * back (LZ for the X side: the nontrivial X logicals), and the per-weight miss probabilities come from the
 * same stage's analysis (src/search/plan.ts). This module only drives it for a minimum-distance question.
 */
import type { IsdChunkResult, IsdChunkTask, IsdSettings } from '../search/isd.js';
import { systematicDensity } from '../search/isd.js';
import { missProbability as settingsMiss, planSearch } from '../search/plan.js';
import { leeBrickellSuccess } from '../search/probability.js';
import { type TaskPool, runOrdered } from '../parallel/pool.js';
import { InputError } from '../errors.js';
import type { AugmentedBasis } from './augmented.js';
import type { WordCollection } from './words.js';

/**
 * One planned stretch of the search: the settings it used, the information sets it visited, and how many
 * chunks of each length it ran (each chunk starts a fresh information set, so its miss probability is the
 * analysis for its own length; a chunk can be shorter than planned at the end of a budget or when it fills).
 */
export interface IsdStage {
  readonly settings: IsdSettings;
  readonly iterations: number;
  readonly chunks: Map<number, number>;
}

/** Stage lengths in chunks: short first (the upper bound drops fast), then 16 chunks per re-plan. */
const STAGE_CHUNKS = [2, 4, 8, 16];
/** Distinct words one chunk may return (the count stays "at least" anyway). */
export const CHUNK_MAX_WORDS = 1 << 14;

/** The code and filter in the form the search kernel takes, plus what its analysis needs. */
export interface IsdCode {
  readonly n: number;
  readonly dim: number;
  /** Distinct nonzero columns: the length the uniform-information-set analysis is run on. */
  readonly effectiveLength: number;
  readonly generator: Uint32Array;
  readonly filter?: { readonly rows: number; readonly data: Uint32Array };
  readonly density: { readonly mean: number; readonly sparseRows: number };
}

export function isdCode(b: AugmentedBasis, filter?: { rows: number; data: Uint32Array }): IsdCode {
  const generator = new Uint32Array(b.dim * b.codeWords);
  for (let i = 0; i < b.dim; i++) generator.set(b.rows.subarray(i * b.rowWords, i * b.rowWords + b.codeWords), i * b.codeWords);
  return {
    n: b.n,
    dim: b.dim,
    effectiveLength: distinctColumns(generator, b.dim, b.n),
    generator,
    ...(filter ? { filter } : {}),
    density: systematicDensity(b.dim, b.n, generator),
  };
}

function distinctColumns(g: Uint32Array, rows: number, n: number): number {
  const stride = (n + 31) >>> 5;
  const seen = new Set<string>();
  for (let c = 0; c < n; c++) {
    let key = '';
    for (let r = 0; r < rows; r++) if ((g[r * stride + (c >>> 5)]! >>> (c & 31)) & 1) key += `${r},`;
    if (key !== '') seen.add(key);
  }
  return seen.size;
}

/** Probability that one given word of weight w was missed by all the stages (they are independent). */
export function stagesMiss(code: Pick<IsdCode, 'effectiveLength' | 'dim'>, stages: readonly IsdStage[], w: number): number {
  let m = 1;
  for (const s of stages) {
    for (const [length, count] of s.chunks) m *= Math.pow(settingsMiss(code.effectiveLength, code.dim, w, s.settings, length), count);
  }
  return m;
}

/** The largest per-word miss probability over weights [from, to] (0 when the range is empty). */
export function rangeMiss(code: Pick<IsdCode, 'effectiveLength' | 'dim'>, stages: readonly IsdStage[], from: number, to: number): number {
  let worst = 0;
  for (let w = Math.max(1, from); w <= to; w++) worst = Math.max(worst, stagesMiss(code, stages, w));
  return worst;
}

/**
 * The heaviest weight below U that a run can hit at all (Lee–Brickell p = 2 success ≥ 1e-12 per information
 * set), or a value below max(1, lowerBound) when there is none worth searching for.
 */
export function reachableWeight(code: Pick<IsdCode, 'effectiveLength' | 'dim'>, U: number): number {
  let w = U - 1;
  while (w >= 1 && leeBrickellSuccess(code.effectiveLength, code.dim, w, 2) < 1e-12) w--;
  return w;
}

/**
 * A fixed information-set search (the form sharded runs use, see fixed-plan.ts): one stage planned as the
 * first stage of runInformationSetPhase would be, W = U for every chunk, and a total fixed in advance.
 */
export interface FixedIsdPlan {
  readonly settings: IsdSettings;
  /** Weight limit of every chunk (the upper bound when the plan was made). */
  readonly maxWeight: number;
  /** Information sets of the whole run, and per chunk (the last chunk takes the rest). */
  readonly iterations: number;
  readonly chunkIterations: number;
  readonly chunks: number;
  /** What fixed the total: the miss target (over weights lower..reachable) or --iterations. */
  readonly rule: 'target-miss' | 'iterations';
  readonly targetMiss: number | null;
}

/** Largest information-set total a fixed plan derives from a target by itself. */
const FIXED_MAX_ITERATIONS = 1e13;

/**
 * Plan a fixed search for words lighter than U, given a proven lower bound: the settings for the heaviest
 * reachable weight below U, and the fewest whole chunks after which every weight in [lower, that weight] has
 * miss probability ≤ targetMiss (capped by maxIterations); exactly maxIterations when targetMiss is null.
 * Null when there is nothing to search for. Depends only on its arguments.
 */
export function planFixedIsd(code: IsdCode, U: number, lowerBound: number, targetMiss: number | null, maxIterations: number | undefined): FixedIsdPlan | null {
  const low = Math.max(1, lowerBound);
  const planWeight = reachableWeight(code, U);
  if (planWeight < low) return null;
  let plan;
  try {
    plan = planSearch({
      n: code.effectiveLength, k: code.dim, maxWeight: planWeight, method: 'isd', targetMiss: targetMiss ?? 1e-6,
      density: code.density.mean, sparseRows: code.density.sparseRows,
    });
  } catch (e) {
    if (e instanceof InputError) return null;
    throw e;
  }
  if (plan.method !== 'isd') throw new Error('distance: the planner was asked for information-set search');
  const per = plan.chunkIterations;
  let total: number;
  let rule: FixedIsdPlan['rule'] = 'iterations';
  if (targetMiss === null) {
    total = maxIterations ?? 0;
  } else {
    let chunks = 0;
    for (let w = low; w <= planWeight; w++) {
      const m = settingsMiss(code.effectiveLength, code.dim, w, plan.settings, per);
      if (m <= targetMiss) { chunks = Math.max(chunks, 1); continue; }
      if (!(m < 1)) { chunks = Infinity; break; }
      let c = Math.ceil(Math.log(targetMiss) / Math.log(m));
      while (c > 1 && Math.pow(m, c - 1) <= targetMiss) c--;
      while (Math.pow(m, c) > targetMiss) c++;
      chunks = Math.max(chunks, c);
    }
    const need = chunks * per;
    if (maxIterations !== undefined && maxIterations <= need) total = maxIterations;
    else if (need > FIXED_MAX_ITERATIONS) {
      throw new InputError(`a fixed plan (--shard) would need more than ${FIXED_MAX_ITERATIONS.toExponential(0)} information sets to bring the miss probability below ${targetMiss}; give --iterations`);
    } else {
      total = need;
      rule = 'target-miss';
    }
  }
  if (total <= 0) return null;
  return { settings: plan.settings, maxWeight: U, iterations: total, chunkIterations: per, chunks: Math.ceil(total / per), rule, targetMiss };
}

export interface IsdPhaseOptions {
  readonly seed: string | number;
  /** Stream of the first chunk; chunk c of the side uses streamRng(seed, streamBase + c). */
  readonly streamBase: number;
  readonly maxIterations: number;
  /** Stop once the miss probability for weights in [lowerBound, U − 1] is ≤ this (0: never). */
  readonly targetMiss: number;
  readonly lowerBound: number;
}

export type IsdStop = 'target-miss' | 'iterations' | 'stopped' | 'unreachable';

export interface IsdPhaseResult {
  readonly stoppedBy: IsdStop;
}

/**
 * Search in stages. Each stage is planned (settings by the search stage's planner, for weight U − 1, the
 * heaviest weight that would improve the bound, or the heaviest weight a run can hit if lower) from the state after the previous stage, and its chunks are
 * dispatched with W = U at the stage's start: everything a chunk does is fixed by the merged state at a
 * stage boundary and its stream number, so the result is the same for any worker count. Chunks are merged in
 * order and the stop rules are evaluated after each; chunks running past the stopping point are ignored.
 * `stages` (in/out) accumulates what was run, for the miss probability; `nextChunk` continues numbering.
 */
export async function runInformationSetPhase(
  pool: TaskPool,
  code: IsdCode,
  collection: WordCollection,
  stages: IsdStage[],
  state: { nextChunk: number; iterations: number },
  o: IsdPhaseOptions,
  shouldStop: () => boolean,
  onChunk?: (iterations: number, miss: number) => void,
): Promise<IsdPhaseResult> {
  const missNow = () => rangeMiss(code, stages, o.lowerBound, collection.limit - 1);
  let stageIndex = 0;
  let done = 0;
  for (;;) {
    if (o.targetMiss > 0 && missNow() <= o.targetMiss) return { stoppedBy: 'target-miss' };
    if (done >= o.maxIterations) return { stoppedBy: 'iterations' };
    if (shouldStop()) return { stoppedBy: 'stopped' };
    const U = collection.limit;
    if (U - 1 < Math.max(1, o.lowerBound)) return { stoppedBy: 'target-miss' };
    // plan for the heaviest weight below U that a run can hit at all (Lee–Brickell p = 2 success ≥ 1e-12 per
    // information set); heavier words are beyond any number of iterations, whatever the settings
    const planWeight = reachableWeight(code, U);
    if (planWeight < Math.max(1, o.lowerBound)) return { stoppedBy: 'unreachable' };
    let plan;
    try {
      plan = planSearch({
        n: code.effectiveLength,
        k: code.dim,
        maxWeight: planWeight,
        method: 'isd',
        targetMiss: o.targetMiss > 0 ? o.targetMiss : 1e-6,
        density: code.density.mean,
        sparseRows: code.density.sparseRows,
      });
    } catch (e) {
      // the planner finds no variant that can reach weight U − 1 (too few columns outside the information set)
      if (e instanceof InputError) return { stoppedBy: 'unreachable' };
      throw e;
    }
    if (plan.method !== 'isd') throw new Error('distance: the planner was asked for information-set search');
    const settings = plan.settings;
    const per = plan.chunkIterations;
    const stage: IsdStage = { settings, iterations: 0, chunks: new Map() };
    stages.push(stage);
    const chunks = STAGE_CHUNKS[Math.min(stageIndex, STAGE_CHUNKS.length - 1)]!;
    stageIndex++;
    const budget = o.maxIterations - done;
    const count = Math.min(chunks, Math.ceil(budget / per));
    const first = state.nextChunk;
    let stop: IsdStop | null = null;
    let merged = 0;
    await runOrdered<IsdChunkResult>(
      pool,
      count,
      (c) => {
        const task: IsdChunkTask = {
          rows: code.dim,
          cols: code.n,
          generator: code.generator,
          ...(code.filter ? { filter: code.filter } : {}),
          maxWeight: U,
          settings,
          seed: o.seed,
          stream: o.streamBase + first + c,
          iterations: Math.min(per, budget - c * per),
          maxWords: CHUNK_MAX_WORDS,
        };
        return { kind: 'search.isd', payload: task };
      },
      (_c, r) => {
        if (stop) return;
        merged++;
        const S = (code.n + 31) >>> 5;
        for (let i = 0; i < r.count; i++) collection.add(r.words.subarray(i * S, (i + 1) * S));
        (stage as { iterations: number }).iterations += r.iterations;
        if (r.iterations > 0) stage.chunks.set(r.iterations, (stage.chunks.get(r.iterations) ?? 0) + 1);
        done += r.iterations;
        state.iterations += r.iterations;
        const miss = missNow();
        onChunk?.(state.iterations, miss);
        if (o.targetMiss > 0 && miss <= o.targetMiss) stop = 'target-miss';
        else if (done >= o.maxIterations) stop = 'iterations';
      },
      () => stop !== null || shouldStop(),
    );
    state.nextChunk = first + merged;
    if (stop) return { stoppedBy: stop };
    if (merged < count) return { stoppedBy: 'stopped' };
  }
}

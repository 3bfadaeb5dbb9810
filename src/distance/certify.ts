/**
 * Parallel drivers for the exact methods: the Brouwer–Zimmermann enumeration (lower bounds and
 * certification) and the exhaustive Gray-code enumeration. Both split their work into numbered chunks run
 * on a TaskPool and merged in chunk order, so the result is the same for any worker count.
 */
import { type TaskPool, runOrdered } from '../parallel/pool.js';
import {
  type CombinationMatrix,
  collectHits,
  type EnumerationGoal,
  type EnumerationPlan,
  EnumerationSchedule,
  goalMet,
  scanLevel,
} from './brouwer-zimmermann.js';
import { type GrayChunkResult, type GrayChunkTask, grayChunkCount, grayLowBits } from '../search/gray.js';
import type { WordCollection } from './words.js';

/** Combinations per numbered chunk of a level. */
export const COMBINATION_CHUNK = 1 << 21;

export interface CombinationChunkPayload {
  readonly matrix: CombinationMatrix;
  readonly level: number;
  readonly start: number;
  readonly count: number;
  readonly maxWeight: number;
}

/** Worker task body: one chunk of one level; returns the hits (level row indices per hit). */
export function combinationChunkTask(p: CombinationChunkPayload): Int32Array {
  const hits: number[] = [];
  scanLevel(p.matrix, p.level, p.start, p.count, p.maxWeight, hits);
  return Int32Array.from(hits);
}

export type EnumerationStop = 'goal' | 'budget' | 'stopped' | 'exhausted';

export interface EnumerationPhaseResult {
  readonly combinations: number;
  readonly stoppedBy: EnumerationStop;
}

export interface EnumerationProgress {
  readonly set: number;
  readonly level: number;
  readonly bound: number;
  readonly combinations: number;
}

/**
 * Enumerate levels as the schedule orders them until the goal is met for the collection's current limit W,
 * the budget (combinations) would be exceeded by the next level, or `shouldStop` says so. Levels are
 * completed as a whole (only completed levels count towards the bound); words of interrupted levels are
 * still kept, since they are genuine codewords.
 */
export async function runEnumerationPhase(
  pool: TaskPool,
  plan: EnumerationPlan,
  schedule: EnumerationSchedule,
  collection: WordCollection,
  goal: EnumerationGoal,
  budget: number,
  shouldStop: () => boolean,
  onProgress?: (p: EnumerationProgress) => void,
): Promise<EnumerationPhaseResult> {
  let combinations = 0;
  for (;;) {
    if (goalMet(schedule.bound(), collection.limit, goal, plan.n)) return { combinations, stoppedBy: 'goal' };
    const unit = schedule.next();
    if (!unit) return { combinations, stoppedBy: 'exhausted' };
    if (combinations + unit.size > budget) return { combinations, stoppedBy: 'budget' };
    if (shouldStop()) return { combinations, stoppedBy: 'stopped' };
    const matrix = plan.matrices[unit.set]!;
    const chunks = Math.ceil(unit.size / COMBINATION_CHUNK);
    let merged = 0;
    await runOrdered<Int32Array>(
      pool,
      chunks,
      (c) => {
        const start = c * COMBINATION_CHUNK;
        const payload: CombinationChunkPayload = {
          matrix,
          level: unit.level,
          start,
          count: Math.min(COMBINATION_CHUNK, unit.size - start),
          maxWeight: collection.limit,
        };
        return { kind: 'distance.combinations', payload };
      },
      (c, hits) => {
        collectHits(matrix, unit.level, hits, collection);
        merged++;
        combinations += Math.min(COMBINATION_CHUNK, unit.size - c * COMBINATION_CHUNK);
        onProgress?.({ set: unit.set, level: unit.level, bound: schedule.bound(), combinations });
      },
      shouldStop,
    );
    if (merged < chunks) return { combinations, stoppedBy: 'stopped' };
    schedule.complete(unit);
    onProgress?.({ set: unit.set, level: unit.level, bound: schedule.bound(), combinations });
  }
}

export interface ExhaustivePhaseResult {
  readonly visited: number;
  /** Every chunk ran to its end (no stop, no chunk over its word limit). */
  readonly complete: boolean;
  readonly overflow: boolean;
}

/** Distinct words one Gray-code chunk may return. */
export const GRAY_MAX_WORDS = 1 << 18;

/**
 * Visit all 2^dim codewords with the search stage's Gray-code kernel (chunks merged in order), keeping the
 * filtered ones within the collection's limit, which is fixed for the whole phase at its start.
 */
export async function runExhaustivePhase(
  pool: TaskPool,
  code: { readonly n: number; readonly dim: number; readonly generator: Uint32Array; readonly filter?: { readonly rows: number; readonly data: Uint32Array } },
  collection: WordCollection,
  shouldStop: () => boolean,
  onProgress?: (visited: number) => void,
): Promise<ExhaustivePhaseResult> {
  const chunks = grayChunkCount(code.dim);
  const lowBits = grayLowBits(code.dim);
  const W = collection.limit;
  const S = (code.n + 31) >>> 5;
  let merged = 0;
  let visited = 0;
  let overflow = false;
  await runOrdered<GrayChunkResult>(
    pool,
    chunks,
    (c) => {
      const task: GrayChunkTask = {
        rows: code.dim, cols: code.n, basis: code.generator, maxWeight: W, lowBits, chunk: c, maxWords: GRAY_MAX_WORDS,
        ...(code.filter ? { filter: code.filter } : {}),
      };
      return { kind: 'search.gray', payload: task };
    },
    (_c, r) => {
      for (let i = 0; i < r.count; i++) collection.add(r.words.subarray(i * S, (i + 1) * S));
      if (r.overflow) overflow = true;
      merged++;
      visited += r.visited;
      onProgress?.(visited);
    },
    () => overflow || shouldStop(),
  );
  return { visited, complete: merged === chunks && !overflow, overflow };
}

/**
 * Parallel drivers for the exact methods: the Brouwer–Zimmermann enumeration (lower bounds and
 * certification) and the exhaustive Gray-code enumeration. Both split their work into numbered chunks run
 * on a TaskPool and merged in chunk order, so the result is the same for any worker count.
 */
import { type TaskPool, runOrdered } from '../parallel/pool.js';
import type { AugmentedBasis } from './augmented.js';
import {
  type CombinationMatrix,
  collectHits,
  type EnumerationGoal,
  type EnumerationPlan,
  EnumerationSchedule,
  goalMet,
  scanLevel,
} from './brouwer-zimmermann.js';
import { collectGrayHits, type GrayChunkPayload, grayChunks } from './exhaustive.js';
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
  readonly complete: boolean;
}

/** Visit all 2^dim codewords (chunk by chunk, merged in order), keeping those within the collection's limit. */
export async function runExhaustivePhase(
  pool: TaskPool,
  basis: AugmentedBasis,
  collection: WordCollection,
  shouldStop: () => boolean,
  onProgress?: (visited: number) => void,
): Promise<ExhaustivePhaseResult> {
  const chunks = grayChunks(basis.dim);
  const per = 2 ** basis.dim / chunks;
  let merged = 0;
  await runOrdered<Int32Array>(
    pool,
    chunks,
    (c) => ({ kind: 'distance.gray', payload: { basis, chunk: c, maxWeight: collection.limit } satisfies GrayChunkPayload }),
    (c, hits) => {
      collectGrayHits(basis, c, hits, collection);
      merged++;
      onProgress?.(merged * per);
    },
    shouldStop,
  );
  return { visited: merged * per, complete: merged === chunks };
}

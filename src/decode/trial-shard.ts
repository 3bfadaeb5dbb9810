/**
 * Sharded trial runs and their exact merge.
 *
 * Shots come in numbered batches, batch i of every point drawing streamRng(seed, i) (or, for exhaustive
 * points, errors i·batch … of the enumeration). Shard I of N decodes the batches i ≡ I (mod N) of each point,
 * in increasing order, so N shards together decode exactly the batches of one run with the same options, and
 * summing their counts per (matrix, p) gives that run's counts. Rates, Wilson intervals and the paired
 * differences are then recomputed from the sums with the same functions as a single run.
 *
 * The --failures rule cannot be split: a single run stops at the first batch after which every matrix has F
 * failures, which no shard can see. A shard applies the rule to its own batches with threshold ⌈F/N⌉ (so the
 * merged counts have about F failures, as the user asked), and the merged result says `exact: false`: its
 * counts are an honest sample (every decoded shot counted once), but not those of one unsharded run.
 * The merge itself is in trial-merge.ts.
 */
import type { PointResult, StopReason } from './runner.js';

/** Which batches of each point the shards of a (possibly merged) result decoded. */
export interface TrialShardRecord {
  /** N of --shard I/N. */
  count: number;
  /** Shard indices whose work this result holds (one for a shard's own output; all of them after a full merge). */
  parts: number[];
  /** The failure threshold each shard applied to its own batches (⌈F/N⌉), null without --failures. */
  failuresPerShard: number | null;
  /** Per point: batches of the whole run, and per shard index how many of its batches it decoded and why it stopped. */
  points: { p: number; batches: number; done: Record<string, number>; stoppedBy: Record<string, StopReason> }[];
  /** Whether the counts are those one unsharded run with the same options would give. */
  exact: boolean;
  /** Why not, when exact is false. */
  why?: string;
}

/** How many of the batches 0..batches−1 are ≡ index (mod count). */
export function shardBatchCount(batches: number, index: number, count: number): number {
  return index < batches ? Math.floor((batches - 1 - index) / count) + 1 : 0;
}

/**
 * Whether merged counts equal one unsharded run: with N = 1 always (it is one); otherwise when every shard
 * decoded all its batches of every point and the failure rule could not have stopped a single run early
 * (no --failures, or some matrix has fewer than F failures over all the batches).
 */
export function shardExactness(
  record: TrialShardRecord['points'],
  parts: readonly number[],
  count: number,
  failures: number | null,
  points: readonly Pick<PointResult, 'p' | 'failures'>[],
): { exact: boolean; why?: string } {
  if (count === 1) return { exact: true };
  const missing = [...Array(count).keys()].filter((i) => !parts.includes(i));
  if (missing.length > 0) return { exact: false, why: `shard${missing.length > 1 ? 's' : ''} ${missing.join(', ')} of ${count} missing` };
  for (const pt of record) {
    for (let i = 0; i < count; i++) {
      if ((pt.done[String(i)] ?? 0) < shardBatchCount(pt.batches, i, count)) {
        const why = pt.stoppedBy[String(i)] === 'failures'
          ? `--failures was applied per shard (⌈${failures}/${count}⌉ each), so the counts are not those of one run`
          : `shard ${i} stopped (${pt.stoppedBy[String(i)] ?? 'unknown'}) before all its batches at p = ${pt.p}`;
        return { exact: false, why };
      }
    }
    if (failures !== null && points.filter((x) => x.p === pt.p).every((x) => x.failures >= failures)) {
      return { exact: false, why: `every matrix reached --failures ${failures} at p = ${pt.p}: one run could have stopped earlier` };
    }
  }
  return { exact: true };
}

/**
 * `overcheck merge` for trial results: shard results of one run combined exactly (see trial-shard.ts).
 */
import { InputError } from '../errors.js';
import { type Comparison, type PointResult, pointComparisons, pointResults, type StopReason, type TrialResult } from './runner.js';
import { emptyCounts, type MatrixCounts } from './trial-engine.js';
import { shardBatchCount, shardExactness, type TrialShardRecord } from './trial-shard.js';

/** A trial result as saved by `trial --shard I/N --json`: the run's result plus what identifies the run. */
export type SavedTrial = TrialResult & {
  codeHash: { hx: string; hz: string };
  code?: { label: string; n: number; k: number };
  matrices: { label: string; xRows: number; zRows: number; spansX: boolean; spansZ: boolean; xHash: string; zHash: string }[];
  workers?: number;
};

function same(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

/** What differs between two saved trials (null: they are shards of one run). */
function difference(r: SavedTrial, a: SavedTrial): string | null {
  if (!same(r.codeHash, a.codeHash)) return 'a different code';
  if (!same(r.matrices.map((m) => [m.label, m.xHash, m.zHash]), a.matrices.map((m) => [m.label, m.xHash, m.zHash]))) return 'other decoder matrices';
  if (String(r.seed) !== String(a.seed)) return `seed ${r.seed}, not ${a.seed}`;
  if (!same(r.ps, a.ps)) return `--p ${r.ps.join(',')}, not ${a.ps.join(',')}`;
  if (r.shots !== a.shots) return `--shots ${r.shots}, not ${a.shots}`;
  if (r.batch !== a.batch) return `--batch ${r.batch}, not ${a.batch}`;
  if (r.failures !== a.failures) return `--failures ${r.failures ?? 'none'}, not ${a.failures ?? 'none'}`;
  if (r.noise !== a.noise || !same(r.samples, a.samples)) return 'another noise model or error sampling';
  if (!same(r.decoder, a.decoder)) return 'other decoder options';
  if (r.shard!.count !== a.shard!.count) return `${r.shard!.count} shards, not ${a.shard!.count}`;
  return null;
}

/**
 * Combine shard results of one trial exactly: shots, failures and every other count summed per (matrix, p),
 * rates, intervals and paired differences recomputed. Refuses results of other codes, matrices or options,
 * and shards given twice, naming the file.
 */
export function mergeTrialResults(parts: { file: string; result: SavedTrial }[]): SavedTrial {
  const first = parts[0];
  if (!first) throw new InputError('merge: no results given');
  const a = first.result;
  const seen = new Set<number>();
  for (const { file, result: r } of parts) {
    if (!r.shard) throw new InputError(`merge: ${file} is a trial run without --shard; only sharded results can be merged`);
    const why = difference(r, a);
    if (why) throw new InputError(`merge: ${file} is from ${why} (compared with ${first.file}); only shards of one trial can be merged`);
    for (const i of r.shard.parts) {
      if (seen.has(i)) throw new InputError(`merge: ${file} repeats shard ${i}/${r.shard.count}`);
      seen.add(i);
    }
  }
  const labels = a.matrices.map((m) => m.label);
  const count = a.shard!.count;
  const points: PointResult[] = [];
  const comparisons: Comparison[] = [];
  const record: TrialShardRecord['points'] = [];
  for (const p of a.ps) {
    const counts: MatrixCounts[] = labels.map(emptyCounts);
    const rec: TrialShardRecord['points'][number] = { p, batches: 0, done: {}, stoppedBy: {} };
    for (const { file, result: r } of parts) {
      const pr = r.shard!.points.find((x) => x.p === p);
      if (!pr) throw new InputError(`merge: ${file} has no record of p = ${p}`);
      rec.batches = pr.batches;
      Object.assign(rec.done, pr.done);
      Object.assign(rec.stoppedBy, pr.stoppedBy);
      labels.forEach((label, k) => {
        const pt = r.points.find((x) => x.p === p && x.label === label);
        if (!pt) throw new InputError(`merge: ${file} has no point for matrix ${label} at p = ${p}`);
        const c = counts[k]!;
        c.shots += pt.shots;
        c.failures += pt.failures;
        c.syndromeFailures += pt.syndromeFailures;
        c.logicalFailures += pt.logicalFailures;
        c.iterationSum += pt.iterationSum;
        c.iterationMax = Math.max(c.iterationMax, pt.maxIterations);
        c.osdRuns += pt.osdRuns;
        // timing only (decodes/s of the merged point): the seconds each shard spent on this matrix
        c.seconds += pt.decodesPerSecond > 0 ? pt.shots / pt.decodesPerSecond : 0;
        if (k > 0) {
          const cmp = r.comparisons.find((x) => x.p === p && x.label === label);
          if (!cmp) throw new InputError(`merge: ${file} has no paired comparison for matrix ${label} at p = ${p}`);
          c.onlyThisFailed += cmp.onlyThisFailed;
          c.onlyBaselineFailed += cmp.onlyBaselineFailed;
        }
      });
    }
    const reasons = Object.values(rec.stoppedBy);
    const complete = [...Array(count).keys()].every((i) => (rec.done[String(i)] ?? 0) >= shardBatchCount(rec.batches, i, count));
    const stoppedBy: StopReason = complete ? 'shots' : reasons.includes('failures') ? 'failures' : reasons.includes('time') ? 'time' : reasons.includes('interrupted') ? 'interrupted' : 'partial';
    const matrices = labels.map((label) => ({ label }));
    points.push(...pointResults({ matrices }, p, counts, stoppedBy));
    comparisons.push(...pointComparisons({ matrices }, p, counts));
    record.push(rec);
  }
  const partList = [...seen].sort((x, y) => x - y);
  const exact = shardExactness(record, partList, count, a.failures, points);
  return {
    ...a,
    points,
    comparisons,
    // the work of all the shards, added up (they ran in separate processes)
    elapsedSeconds: parts.reduce((t, p) => t + p.result.elapsedSeconds, 0),
    shard: { count, parts: partList, failuresPerShard: a.shard!.failuresPerShard, points: record, exact: exact.exact, ...(exact.why ? { why: exact.why } : {}) },
  };
}

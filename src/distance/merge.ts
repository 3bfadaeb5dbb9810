/**
 * `overcheck merge` for distance results: shards of one fixed-plan run (`distance --shard I/N --json`)
 * combined exactly. Per side: the upper bound is the lightest word of any shard (witness: the smallest support
 * among the minimum-weight words of all shards, count: their union), the lower bound what the union of the
 * finished enumeration chunks proves, iterations summed and the miss probability recomputed from all the
 * information-set chunks (see shard-record.ts). Refuses results of other codes, sides, seeds, options or
 * plans, and repeated shards, naming the file.
 */
import { InputError } from '../errors.js';
import { combineSides, type DistanceReport, type SideReport } from './result.js';
import { mergeSideRecords, sideFromRecord } from './shard-record.js';

/** A distance result as saved by `distance --json`, with the hash of the code's matrices. */
export type SavedDistance = DistanceReport & { codeHash: Record<string, string> };

function same(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

const SIDE_KEYS = ['dx', 'dz', 'd'] as const;

function sidesOf(r: SavedDistance): [string, SideReport][] {
  if (r.kind === 'classical') return [['d', r.d]];
  return SIDE_KEYS.slice(0, 2).flatMap((k) => (r[k as 'dx' | 'dz'] ? [[k, r[k as 'dx' | 'dz']!] as [string, SideReport]] : []));
}

function difference(r: SavedDistance, a: SavedDistance): string | null {
  if (r.kind !== a.kind) return `a ${r.kind} code, not a ${a.kind} one`;
  if (!same(r.codeHash, a.codeHash)) return 'a different code';
  if (r.kind === 'css' && a.kind === 'css' && r.side !== a.side) return `--side ${r.side}, not ${a.side}`;
  if (String(r.seed) !== String(a.seed)) return `seed ${r.seed}, not ${a.seed}`;
  if (r.method !== a.method) return `--method ${r.method}, not ${a.method}`;
  const rs = r.settings;
  const as = a.settings;
  if (rs.iterations !== as.iterations) return `--iterations ${rs.iterations ?? 'unset'}, not ${as.iterations ?? 'unset'}`;
  if (rs.targetMiss !== as.targetMiss) return `--target-miss ${rs.targetMiss ?? 'unset'}, not ${as.targetMiss ?? 'unset'}`;
  if (rs.enumerationLimit !== as.enumerationLimit) return `--enumeration-limit ${rs.enumerationLimit}, not ${as.enumerationLimit}`;
  if (rs.maxWords !== as.maxWords) return `--max-words ${rs.maxWords}, not ${as.maxWords}`;
  if (r.shard!.count !== a.shard!.count) return `${r.shard!.count} shards, not ${a.shard!.count}`;
  const ra = sidesOf(r);
  const aa = sidesOf(a);
  for (let i = 0; i < aa.length; i++) {
    if (!same(ra[i]![1].shard?.plan, aa[i]![1].shard?.plan)) return `another plan for ${aa[i]![0]}`;
  }
  return null;
}

export function mergeDistanceResults(parts: { file: string; result: SavedDistance }[]): SavedDistance {
  const first = parts[0];
  if (!first) throw new InputError('merge: no results given');
  const a = first.result;
  const seen = new Set<number>();
  for (const { file, result: r } of parts) {
    if (!r.shard || sidesOf(r).some(([, s]) => !s.shard)) {
      throw new InputError(`merge: ${file} is a distance run without --shard; only sharded results (--shard I/N) can be merged`);
    }
    const why = difference(r, a);
    if (why) throw new InputError(`merge: ${file} is from ${why} (compared with ${first.file}); only shards of one distance run can be merged`);
    for (const i of r.shard.parts) {
      if (seen.has(i)) throw new InputError(`merge: ${file} repeats shard ${i}/${r.shard.count}`);
      seen.add(i);
    }
  }
  const merged: Record<string, SideReport> = {};
  sidesOf(a).forEach(([key], j) => {
    const reports = parts.map((p) => sidesOf(p.result)[j]![1]);
    const record = mergeSideRecords(reports.map((s) => s.shard!), a.settings.maxWords);
    // the witness is the smallest minimum-weight support of some shard: take the partner row it reported
    const witness = record.words[0]!.join(',');
    const partner = reports.find((s) => s.witness.join(',') === witness)?.anticommutesWith ?? null;
    merged[key] = { ...sideFromRecord(record, partner), shard: record };
  });
  const shard = { count: a.shard!.count, parts: [...seen].sort((x, y) => x - y) };
  if (a.kind === 'classical') return { ...a, shard, d: merged['d']! };
  const dx = merged['dx'];
  const dz = merged['dz'];
  return { ...a, shard, ...(dx ? { dx } : {}), ...(dz ? { dz } : {}), d: combineSides(dx, dz) };
}

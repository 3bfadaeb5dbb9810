import { InputError } from '../errors.js';
import { packSupport, packedSupport } from '../gf2/bitmatrix.js';
import type { ShiftSymmetry } from '../codes/families/types.js';
import { groupElements, permuteWord } from './orbits.js';
import { missProbability } from './plan.js';
import type { SearchResult } from './run.js';

/** A search result as saved by `search --json`, with the hash of the matrix searched. */
export type SavedSearch = SearchResult & { codeHash: string };

function same(a: unknown, b: unknown): boolean {
  return JSON.stringify(a) === JSON.stringify(b);
}

/**
 * Combine shard results of one search exactly: the union of the words, the sum of the iterations, and the
 * miss probabilities and completeness recomputed for the merged run. Refuses results of different codes,
 * sides or parameters, and shards given twice, naming the file.
 */
export function mergeSearchResults(parts: { file: string; result: SavedSearch }[], symmetry?: ShiftSymmetry): SavedSearch {
  const first = parts[0];
  if (!first) throw new InputError('merge: no results given');
  const a = first.result;
  const seen = new Set<number>();
  for (const { file, result: r } of parts) {
    const why =
      r.codeHash !== a.codeHash ? 'a different matrix' :
      r.side !== a.side ? `side ${r.side}, not ${a.side}` :
      r.maxWeight !== a.maxWeight ? `--max-weight ${r.maxWeight}, not ${a.maxWeight}` :
      String(r.seed) !== String(a.seed) ? `seed ${r.seed}, not ${a.seed}` :
      r.method !== a.method || !same(r.plan, a.plan) ? 'another method or plan' :
      r.chunks.total !== a.chunks.total || r.chunks.shard.count !== a.chunks.shard.count ? 'another total amount of work or shard count' :
      null;
    if (why) throw new InputError(`merge: ${file} is from ${why} (compared with ${first.file}); only shards of one search can be merged`);
    if (seen.has(r.chunks.shard.index)) throw new InputError(`merge: ${file} repeats shard ${r.chunks.shard.index}/${r.chunks.shard.count}`);
    seen.add(r.chunks.shard.index);
  }
  const words = new Map<string, number[]>();
  const original = new Set<string>();
  let iterations = 0;
  let done = 0;
  for (const { result: r } of parts) {
    iterations += r.iterations;
    done += r.chunks.done;
    const orig = new Set(r.original);
    r.words.forEach((w, i) => {
      const key = w.join(',');
      words.set(key, w);
      if (orig.has(i)) original.add(key);
    });
  }
  const sorted = [...words.values()].sort((x, y) => x.length - y.length || lex(x, y));
  const counts: Record<string, number> = {};
  for (let w = 1; w <= a.maxWeight; w++) counts[String(w)] = 0;
  for (const w of sorted) counts[String(w.length)] = (counts[String(w.length)] ?? 0) + 1;
  const allShards = seen.size === a.chunks.shard.count;
  const complete = a.method === 'exhaustive' && allShards && done === a.chunks.total && parts.every((p) => !p.result.truncated);
  const miss: Record<string, number> = {};
  for (let w = 1; w <= a.maxWeight; w++) {
    miss[String(w)] = complete ? 0 : a.plan.method === 'isd' ? missProbability(a.distinctColumns, a.rank, w, a.plan.settings, iterations) : 1;
  }
  const orbits: Record<string, number> = {};
  if (symmetry) Object.assign(orbits, countOrbits(sorted, a.n, a.maxWeight, symmetry));
  const interrupted = parts.some((p) => p.result.stopReason === 'interrupted');
  return {
    ...a,
    iterations,
    counts,
    orbits,
    missProbability: miss,
    complete,
    stopReason: interrupted ? 'interrupted' : allShards && done === a.chunks.total ? a.stopReason : 'partial',
    wordCount: sorted.length,
    words: sorted,
    original: sorted.flatMap((w, i) => (original.has(w.join(',')) ? [i] : [])),
    truncated: parts.some((p) => p.result.truncated),
    chunks: { total: a.chunks.total, done, shard: { index: 0, count: allShards ? 1 : a.chunks.shard.count } },
    streams: { first: Math.min(...parts.map((p) => p.result.streams.first)), next: Math.max(...parts.map((p) => p.result.streams.next)) },
  };
}

function lex(x: readonly number[], y: readonly number[]): number {
  for (let i = 0; i < x.length; i++) if (x[i] !== y[i]) return x[i]! - y[i]!;
  return 0;
}

/** Orbits per weight among a set of words (words whose orbit is only partly present count once per part). */
export function countOrbits(words: readonly number[][], n: number, maxWeight: number, symmetry: ShiftSymmetry): Record<string, number> {
  const elements = groupElements(symmetry, n);
  const present = new Set(words.map((w) => w.join(',')));
  const seen = new Set<string>();
  const out: Record<string, number> = {};
  for (let w = 1; w <= maxWeight; w++) out[String(w)] = 0;
  const stride = (n + 31) >>> 5;
  const img = new Uint32Array(stride);
  for (const w of words) {
    const key = w.join(',');
    if (seen.has(key)) continue;
    out[String(w.length)] = (out[String(w.length)] ?? 0) + 1;
    const v = packSupport(n, w);
    for (const e of elements) {
      permuteWord(e, v, img, stride);
      const k = packedSupport(img, 0, stride).join(',');
      if (present.has(k)) seen.add(k);
    }
  }
  return out;
}

import { type BitMatrix, packedSupport } from '../gf2/bitmatrix.js';
import { rowBasis } from '../gf2/elimination.js';
import { packedWeight } from '../gf2/popcount.js';
import type { ShiftSymmetry } from '../codes/families/types.js';
import type { TaskPool } from '../parallel/pool.js';
import { runOrdered } from '../parallel/pool.js';
import { InputError } from '../errors.js';
import type { GrayChunkResult, GrayChunkTask } from './gray.js';
import type { IsdChunkResult, IsdChunkTask, IsdSettings } from './isd.js';
import { groupElements, permuteWord } from './orbits.js';
import { EXHAUSTIVE_BUDGET, missProbability, planSearch, type SearchPlan } from './plan.js';
import { pairProbe, sternProbe, systematicDensity } from './isd.js';
import { ORIGINAL_ROW, WordStore } from './store.js';

/** The row space to search: rowspace(h), with h's own rows marked as original. */
export interface SearchTarget {
  readonly side: string;
  readonly h: BitMatrix;
  readonly symmetry?: ShiftSymmetry;
}

export interface SearchOptions {
  readonly maxWeight: number;
  readonly method: 'auto' | 'exhaustive' | 'isd';
  readonly seed: string | number;
  /** Information sets to visit (ISD); rounded up to whole chunks. */
  readonly iterations?: number;
  readonly targetMiss?: number;
  readonly maxWords: number;
  /** Approximate bytes the word store may use; the search stops (resumable) before exceeding it. */
  readonly maxMemory?: number;
  /** Start numbering seed streams here (resume uses fresh streams). */
  readonly firstStream?: number;
  /** Run only the chunks with id ≡ index (mod count); merging all shards gives the unsharded result. */
  readonly shard?: { index: number; count: number };
  /** Words found earlier (resume), packed, and the iterations they took. */
  readonly previous?: { words: Uint32Array[]; iterations: number };
}

/** Hooks into the outside world, given by the caller (CLI): the pool, the clock, progress and output. */
export interface SearchHooks {
  readonly pool: TaskPool;
  readonly shouldStop?: () => boolean;
  /** Names the cause once shouldStop said yes (default 'interrupted'). */
  readonly stopCause?: () => string | null;
  /** Called after every merged chunk with the words it added (packed), in deterministic order. */
  readonly onNewWords?: (words: Uint32Array[], state: SearchProgress) => void;
}

export interface SearchProgress {
  readonly iterations: number;
  readonly nextStream: number;
  readonly counts: Record<string, number>;
  readonly missProbability: Record<string, number>;
  readonly complete: boolean;
  /** Iterations this process is to run in all (its chunks), when known: for rate-based estimates. */
  readonly planned: number | null;
}

export interface SearchResult {
  side: string;
  maxWeight: number;
  method: 'exhaustive' | 'isd';
  plan: SearchPlan;
  seed: string | number;
  iterations: number;
  counts: Record<string, number>;
  orbits: Record<string, number>;
  missProbability: Record<string, number>;
  complete: boolean;
  /** Why the search stopped: finished, target, iterations, time, interrupted, max-words. */
  stopReason: string;
  n: number;
  rank: number;
  /** Distinct nonzero columns of the row space: the length the miss probabilities are computed for. */
  distinctColumns: number;
  streams: { first: number; next: number };
  /** Chunk bookkeeping: how many the whole run has, how many this process did, and its shard. */
  chunks: { total: number; done: number; shard: { index: number; count: number } };
  wordCount: number;
  /** Supports, sorted by weight then lexicographically. */
  words: number[][];
  /** Indices into `words` of rows of the original matrix. */
  original: number[];
  truncated: boolean;
}

/** Default when no stop rule is given: miss probability 1e-6 at every weight ≤ W. */
export const DEFAULT_TARGET_MISS = 1e-6;

export async function runSearch(target: SearchTarget, opts: SearchOptions, hooks: SearchHooks): Promise<SearchResult> {
  const h = target.h;
  const n = h.cols;
  const s = h.stride;
  const basis = rowBasis(h);
  const k = basis.rank;
  const W = opts.maxWeight;
  const store = new WordStore(n, 1024);
  const orbitOf = new Map<number, number>(); // weight → orbit count
  const elements = target.symmetry ? groupElements(target.symmetry, n) : null;
  const image = new Uint32Array(s);
  let truncated = false;
  const byWeight: number[] = []; // words stored per weight, kept as they are added

  /** Insert a word and (with symmetry) its orbit; returns the words that were new. */
  const insert = (v: Uint32Array, flag: number, fresh: Uint32Array[]): void => {
    if (store.has(v)) return;
    if (store.size >= opts.maxWords || (opts.maxMemory !== undefined && store.bytes > opts.maxMemory)) {
      truncated = true;
      return;
    }
    const w = packedWeight(v, 0, s);
    orbitOf.set(w, (orbitOf.get(w) ?? 0) + 1);
    if (!elements) {
      store.add(v, 0, flag);
      byWeight[w] = (byWeight[w] ?? 0) + 1;
      fresh.push(v.slice());
      return;
    }
    for (const e of elements) {
      permuteWord(e, v, image, s);
      if (store.add(image, 0, flag) >= 0) {
        byWeight[w] = (byWeight[w] ?? 0) + 1;
        fresh.push(image.slice());
      }
    }
  };

  const seedWords: Uint32Array[] = [];
  for (let r = 0; r < h.rows; r++) {
    const row = h.data.subarray(r * s, (r + 1) * s);
    const w = packedWeight(row, 0, s);
    if (w > 0 && w <= W) insert(row.slice(), 0, seedWords);
  }
  // mark the rows themselves (not the other members of their orbits)
  for (let r = 0; r < h.rows; r++) {
    const row = h.data.subarray(r * s, (r + 1) * s);
    if (store.has(row)) store.add(row, 0, ORIGINAL_ROW);
  }
  let iterations = opts.previous?.iterations ?? 0;
  for (const v of opts.previous?.words ?? []) {
    const w = packedWeight(v, 0, s);
    if (w > 0 && w <= W) insert(v, 0, seedWords);
  }

  const exhaustiveOnly = opts.method === 'exhaustive' || (opts.method === 'auto' && 2 ** k * s <= EXHAUSTIVE_BUDGET);
  const probe = exhaustiveOnly ? { mean: 0.5, sparseRows: 0 } : systematicDensity(k, n, basis.reduced.data);
  // zero and repeated columns narrow the information sets: the analysis uses the distinct columns
  const nEff = supportSize(basis.reduced);
  const plan = planSearch({
    n: nEff, k, maxWeight: W, method: opts.method, targetMiss: opts.targetMiss ?? DEFAULT_TARGET_MISS, density: probe.mean, sparseRows: probe.sparseRows,
    measured: exhaustiveOnly ? undefined : { pairs: pairProbe(k, n, basis.reduced.data, W), stern: memo((p, l) => sternProbe(k, n, basis.reduced.data, W, p, l)) },
  });
  const firstStream = opts.firstStream ?? 0;
  let nextStream = firstStream;
  const counts = (): Record<string, number> => {
    const c: Record<string, number> = {};
    for (let w = 1; w <= W; w++) c[String(w)] = byWeight[w] ?? 0;
    return c;
  };
  let complete = false;
  const misses = (): Record<string, number> => {
    const m: Record<string, number> = {};
    for (let w = 1; w <= W; w++) {
      m[String(w)] = complete ? 0 : plan.method === 'isd' ? missProbability(nEff, k, w, plan.settings, iterations) : 1;
    }
    return m;
  };
  let planned: number | null = null;
  const progress = (): SearchProgress => ({ iterations, nextStream, counts: counts(), missProbability: misses(), complete, planned });
  hooks.onNewWords?.(seedWords, progress());

  let stopReason = 'finished';
  const stop = () => {
    if (truncated) return true;
    return hooks.shouldStop?.() ?? false;
  };

  // chunk ids this run covers: firstStream.. (a resumed run goes on where the saved one stopped), and with a
  // shard I/N only the ids ≡ I (mod N), so N shards together do exactly the chunks of one unsharded run
  const shard = opts.shard ?? { index: 0, count: 1 };
  const chunkIds = (total: number): number[] => {
    const ids: number[] = [];
    for (let c = firstStream; c < total; c++) if (c % shard.count === shard.index) ids.push(c);
    return ids;
  };
  let totalChunks: number;
  let ids: number[];
  let delivered = 0;
  if (plan.method === 'exhaustive') {
    const data = basis.reduced.data;
    totalChunks = plan.chunks;
    ids = chunkIds(totalChunks);
    planned = iterations + ids.length * 2 ** plan.lowBits;
    await runOrdered<GrayChunkResult>(
      hooks.pool,
      ids.length,
      (t) => {
        const task: GrayChunkTask = { rows: k, cols: n, basis: data, maxWeight: W, lowBits: plan.lowBits, chunk: ids[t]!, maxWords: opts.maxWords };
        return { kind: 'search.gray', payload: task };
      },
      (t, r) => {
        const fresh: Uint32Array[] = [];
        for (let j = 0; j < r.count; j++) insert(r.words.subarray(j * s, (j + 1) * s), 0, fresh);
        if (r.overflow) truncated = true;
        delivered++;
        iterations += r.visited;
        nextStream = ids[t]! + 1;
        complete = shard.count === 1 && nextStream === totalChunks && !truncated;
        hooks.onNewWords?.(fresh, progress());
      },
      stop,
    );
    if (ids.length === 0) nextStream = totalChunks;
    complete = shard.count === 1 && delivered === ids.length && !truncated;
    stopReason = truncated ? 'max-words' : delivered < ids.length ? (hooks.stopCause?.() ?? 'interrupted') : 'finished';
  } else {
    const per = plan.chunkIterations;
    // the whole run's length: fixed by --iterations or by the target (counting what a resumed file already did)
    const need = opts.iterations ?? iterationsToTarget(nEff, k, W, plan.settings, iterations, opts.targetMiss ?? DEFAULT_TARGET_MISS, per);
    const lastLen = need - per * (Math.ceil(need / per) - 1);
    totalChunks = firstStream + Math.ceil(need / per);
    ids = chunkIds(totalChunks);
    planned = iterations + ids.reduce((t, c) => t + (c === totalChunks - 1 ? lastLen : per), 0);
    await runOrdered<IsdChunkResult>(
      hooks.pool,
      ids.length,
      (t) => {
        const c = ids[t]!;
        const its = c === totalChunks - 1 ? lastLen : per;
        const task: IsdChunkTask = {
          rows: k, cols: n, generator: basis.reduced.data, maxWeight: W, settings: plan.settings,
          seed: opts.seed, stream: c, iterations: its, maxWords: opts.maxWords,
        };
        return { kind: 'search.isd', payload: task };
      },
      (t, r) => {
        const fresh: Uint32Array[] = [];
        for (let j = 0; j < r.count; j++) insert(r.words.subarray(j * s, (j + 1) * s), 0, fresh);
        if (r.overflow) truncated = true;
        iterations += r.iterations;
        nextStream = ids[t]! + 1;
        delivered++;
        hooks.onNewWords?.(fresh, progress());
      },
      stop,
    );
    if (ids.length === 0) nextStream = totalChunks;
    if (truncated) stopReason = 'max-words';
    else if (delivered < ids.length) stopReason = hooks.stopCause?.() ?? 'interrupted';
    else stopReason = opts.iterations !== undefined ? 'iterations' : 'target';
  }

  // sorted output
  const order = Array.from({ length: store.size }, (_, i) => i);
  const supportsOf = order.map((i) => packedSupport(store.word(i), 0, s));
  order.sort((a, b) => {
    const wa = store.weight(a);
    const wb = store.weight(b);
    if (wa !== wb) return wa - wb;
    const sa = supportsOf[a]!;
    const sb = supportsOf[b]!;
    for (let t = 0; t < sa.length; t++) if (sa[t] !== sb[t]) return sa[t]! - sb[t]!;
    return 0;
  });
  const words = order.map((i) => supportsOf[i]!);
  const original: number[] = [];
  order.forEach((i, pos) => {
    if (store.flag(i) & ORIGINAL_ROW) original.push(pos);
  });
  const orbits: Record<string, number> = {};
  for (let w = 1; w <= W; w++) orbits[String(w)] = orbitOf.get(w) ?? 0;
  return {
    side: target.side,
    maxWeight: W,
    method: plan.method,
    plan,
    seed: opts.seed,
    iterations,
    counts: counts(),
    orbits,
    missProbability: misses(),
    complete,
    stopReason,
    n,
    rank: k,
    distinctColumns: nEff,
    streams: { first: firstStream, next: nextStream },
    chunks: { total: totalChunks, done: delivered, shard },
    wordCount: store.size,
    words,
    original,
    truncated,
  };
}

/**
 * Further information sets (a whole number of chunks) after which every weight 1..W has miss probability
 * below target, given `done` already visited. Depends only on the code's size and the settings.
 */
export function iterationsToTarget(n: number, k: number, W: number, settings: IsdSettings, done: number, target: number, per: number): number {
  const ok = (extra: number) => {
    for (let w = 1; w <= W; w++) if (missProbability(n, k, w, settings, done + extra) >= target) return false;
    return true;
  };
  if (ok(0)) return 0;
  let hi = per;
  while (!ok(hi)) {
    hi *= 2;
    if (hi > 1e12) throw new InputError(`no number of information sets brings the miss probability below ${target} at every weight ≤ ${W}`);
  }
  let lo = hi / 2;
  while (hi - lo > per) {
    const mid = Math.ceil((lo + hi) / 2 / per) * per;
    if (mid >= hi || mid <= lo) break;
    if (ok(mid)) hi = mid;
    else lo = mid;
  }
  return Math.ceil(hi / per) * per;
}

/**
 * Number of distinct nonzero columns of m. Zero columns never join an information set, and of a group of
 * identical columns at most one does, so the uniform-information-set analysis is run on this length.
 */
export function supportSize(m: BitMatrix): number {
  const seen = new Set<string>();
  const col: number[] = [];
  for (let c = 0; c < m.cols; c++) {
    col.length = 0;
    for (let r = 0; r < m.rows; r++) if ((m.data[r * m.stride + (c >>> 5)]! >>> (c & 31)) & 1) col.push(r);
    if (col.length > 0) seen.add(col.join(','));
  }
  return seen.size;
}

function memo<T>(f: (p: number, l: number) => T): (p: number, l: number) => T {
  const cache = new Map<string, T>();
  return (p, l) => {
    const key = `${p}:${l}`;
    let v = cache.get(key);
    if (v === undefined) {
      v = f(p, l);
      cache.set(key, v);
    }
    return v;
  };
}

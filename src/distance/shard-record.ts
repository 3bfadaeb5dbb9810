/**
 * What a sharded distance run (fixed-plan.ts) records for one side, and the side report that follows from
 * such a record. A record holds the fixed plan (identical in every shard), which chunks of it each shard
 * finished, the chunk lengths of the information-set search and the minimum-weight words kept. A shard's
 * own output and the merge of several shards both go through `sideFromRecord`, so N merged shards give
 * exactly the report of one process running the whole plan (`--shard 0/1`).
 */
import { boundForLevels, type EnumerationGoal, type EnumerationPlan, remainingCost } from './brouwer-zimmermann.js';
import type { SideReport, SideStop } from './result.js';
import { type FixedIsdPlan, rangeMiss, type IsdStage } from './upper.js';
import { compareSupports } from './words.js';

/** One (set, level) of the Brouwer–Zimmermann enumeration, cut into `chunks` numbered chunks. */
export interface FixedPlanUnit {
  readonly set: number;
  readonly level: number;
  readonly size: number;
  readonly chunks: number;
}

/**
 * The work of a sharded side, fixed before the split from what every shard computes alike. Chunk ids of
 * each phase run from 0; chunk g belongs to shard g mod N.
 */
export interface FixedPlan {
  /** After the first enumeration pass, which every shard runs in full: levels per set, bound, upper bound. */
  readonly start: { readonly levels: readonly number[]; readonly bound: number; readonly combinations: number; readonly upper: number };
  readonly n: number;
  readonly dim: number;
  /** Distinct nonzero columns (the length of the information-set analysis). */
  readonly effectiveLength: number;
  readonly sets: readonly { readonly size: number; readonly rank: number }[];
  /** 'exhaustive': all 2^dim codewords (method exhaustive, or auto for small dimension); else 'search'. */
  readonly branch: 'exhaustive' | 'search';
  readonly exhaustive: { readonly chunks: number; readonly total: number; readonly maxWeight: number } | null;
  readonly isd: FixedIsdPlan | null;
  /** Units in schedule order from the start levels until the goal is met for the start's upper bound. */
  readonly enumeration: { readonly goal: EnumerationGoal; readonly maxWeight: number; readonly units: readonly FixedPlanUnit[]; readonly chunks: number } | null;
}

/** What one shard did: how many chunks of its list per phase (always a prefix of the list), and totals. */
export interface ShardPart {
  readonly index: number;
  readonly exhaustiveChunks: number;
  readonly isdChunks: number;
  readonly enumerationChunks: number;
  readonly iterations: number;
  readonly combinations: number;
  readonly visited: number;
  /** A Gray-code chunk met more words than it may return. */
  readonly overflow: boolean;
  readonly stoppedBy: 'time-limit' | 'interrupted' | null;
}

export interface ShardSideRecord {
  /** N of --shard I/N. */
  readonly count: number;
  readonly plan: FixedPlan;
  readonly parts: readonly ShardPart[];
  /** Information-set chunks run, by length (information sets) → number of chunks. */
  readonly isdChunkLengths: Readonly<Record<string, number>>;
  /** Every word of weight `upper` kept, sorted (the first is the witness); all have the same weight. */
  readonly words: readonly (readonly number[])[];
  /** Words of that weight were dropped for --max-words. */
  readonly truncated: boolean;
}

/** Chunks g < end with g ≡ index (mod count). */
export function chunksBelow(end: number, index: number, count: number): number {
  return index < end ? Math.floor((end - 1 - index) / count) + 1 : 0;
}

/** The shards' chunk lists cover ids [from, to) (every chunk there is finished by a shard present). */
function covered(parts: ReadonlyMap<number, ShardPart>, count: number, from: number, to: number, phase: 'exhaustiveChunks' | 'isdChunks' | 'enumerationChunks'): boolean {
  for (let i = 0; i < count; i++) {
    const need = chunksBelow(to, i, count);
    if (need - chunksBelow(from, i, count) === 0) continue;
    const p = parts.get(i);
    if (!p || p[phase] < need) return false;
  }
  return true;
}

/** The plan's sets as the bound and schedule functions read them (they need ranks only). */
export function boundPlan(plan: Pick<FixedPlan, 'n' | 'dim' | 'sets'>): EnumerationPlan {
  return {
    n: plan.n,
    dim: plan.dim,
    filterRows: 0,
    sets: plan.sets.map((x) => ({ columns: [], rank: x.rank, deficit: plan.dim - x.rank })),
    matrices: [],
  };
}

/** Levels per set proven by the units whose chunks are all finished (a set advances only through its own units in order). */
export function provenLevels(rec: Pick<ShardSideRecord, 'plan' | 'parts' | 'count'>): number[] {
  const levels = [...rec.plan.start.levels];
  const e = rec.plan.enumeration;
  if (!e) return levels;
  const parts = new Map(rec.parts.map((p) => [p.index, p]));
  let offset = 0;
  for (const u of e.units) {
    if (levels[u.set] === u.level - 1 && covered(parts, rec.count, offset, offset + u.chunks, 'enumerationChunks')) levels[u.set] = u.level;
    offset += u.chunks;
  }
  return levels;
}

/**
 * The side report a record proves. `partner`: the partner-basis row the witness anticommutes with.
 * Bounds: upper = weight of the words kept; lower = what the finished chunks prove (the start's bound raised by
 * every unit whose chunks are all present; all 2^K codewords when every Gray-code chunk is present);
 * missProbability from the information-set chunks actually run.
 */
export function sideFromRecord(rec: ShardSideRecord, partner: number | null): SideReport {
  const plan = rec.plan;
  const first = rec.words[0];
  if (!first) throw new Error('distance: a shard record without a word');
  const U = first.length;
  const parts = new Map(rec.parts.map((p) => [p.index, p]));
  const missing = rec.count - parts.size;
  const stopped = rec.parts.map((p) => p.stoppedBy).find((x) => x !== null) ?? null;
  const overflow = rec.parts.some((p) => p.overflow);
  const levels = provenLevels(rec);
  const bp = boundPlan(plan);
  const bound = boundForLevels(bp, levels);
  const combinations = plan.start.combinations + rec.parts.reduce((t, p) => t + p.combinations, 0);
  const iterations = rec.parts.reduce((t, p) => t + p.iterations, 0);
  const toCertify = bound >= U ? 0 : remainingCost(bp, levels, U, 'reach');
  const enumeration = {
    sets: plan.sets.map((x, j) => ({ size: x.size, rank: x.rank, level: levels[j]! })),
    bound,
    combinations,
    toCertify: Number.isFinite(toCertify) ? toCertify : null,
  };
  const stage: IsdStage | null = plan.isd && iterations > 0
    ? {
        settings: plan.isd.settings,
        iterations,
        chunks: new Map(Object.entries(rec.isdChunkLengths).map(([k, v]) => [Number(k), v] as [number, number]).sort((a, b) => a[0] - b[0])),
      }
    : null;
  const common = {
    upper: U,
    count: rec.words.length,
    truncated: rec.truncated,
    witness: [...first],
    anticommutesWith: partner,
    dimension: plan.dim,
    enumeration,
  };
  if (plan.branch === 'exhaustive') {
    const all = plan.exhaustive === null || (!overflow && covered(parts, rec.count, 0, plan.exhaustive.chunks, 'exhaustiveChunks'));
    const lower = all ? U : Math.min(bound, U);
    const visited = rec.parts.reduce((t, p) => t + p.visited, 0);
    return {
      ...common,
      lower,
      certified: lower >= U,
      countExact: all && !rec.truncated,
      missProbability: lower >= U ? 0 : 1,
      method: plan.exhaustive ? 'exhaustive' : 'brouwer-zimmermann',
      stoppedBy: all ? 'certified' : overflow ? 'word-limit' : (stopped ?? (missing > 0 ? 'partial' : 'iterations')),
      isd: { iterations: 0, stages: [] },
      exhaustive: plan.exhaustive ? { visited, total: plan.exhaustive.total } : null,
    };
  }
  const lower = Math.min(bound, U);
  const certified = bound >= U;
  const countExact = bound > U && !rec.truncated;
  let stoppedBy: SideStop | null = stopped ?? (missing > 0 ? 'partial' : null);
  if (countExact || (bound > U && rec.truncated)) stoppedBy = 'certified';
  else if (certified && !stoppedBy) stoppedBy = 'certified-count-open';
  else if (!stoppedBy) stoppedBy = plan.isd?.rule ?? 'iterations';
  const chunkCount = Object.values(rec.isdChunkLengths).reduce((t, c) => t + c, 0);
  return {
    ...common,
    lower,
    certified,
    countExact,
    missProbability: certified ? 0 : stage ? rangeMiss(plan, [stage], lower, U - 1) : 1,
    method: certified ? 'brouwer-zimmermann' : 'isd',
    stoppedBy,
    isd: {
      iterations,
      stages: stage ? [{ ...stage.settings, iterations, chunks: chunkCount }] : [],
    },
    exhaustive: null,
  };
}

/**
 * Combine records of shards of one side (the caller has checked that plans and counts agree and that no
 * shard repeats): parts joined, chunk lengths summed, the minimum-weight words of the lightest records
 * united, sorted and capped at maxWords.
 */
export function mergeSideRecords(recs: readonly ShardSideRecord[], maxWords: number): ShardSideRecord {
  const a = recs[0];
  if (!a) throw new Error('distance: no records to merge');
  const U = Math.min(...recs.map((r) => r.words[0]?.length ?? Infinity));
  const lightest = recs.filter((r) => (r.words[0]?.length ?? Infinity) === U);
  const byKey = new Map<string, readonly number[]>();
  for (const r of lightest) for (const w of r.words) byKey.set(w.join(','), w);
  const words = [...byKey.values()].sort(compareSupports);
  const lengths: Record<string, number> = {};
  for (const r of recs) for (const [k, v] of Object.entries(r.isdChunkLengths)) lengths[k] = (lengths[k] ?? 0) + v;
  return {
    count: a.count,
    plan: a.plan,
    parts: recs.flatMap((r) => r.parts).sort((x, y) => x.index - y.index),
    isdChunkLengths: lengths,
    words: words.slice(0, maxWords),
    truncated: lightest.some((r) => r.truncated) || words.length > maxWords,
  };
}

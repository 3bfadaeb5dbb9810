/**
 * The distance audit of one side as a fixed plan, split over shards (`distance --shard I/N`).
 *
 * The adaptive audit (audit.ts) re-plans as it goes: each information-set stage is planned for the upper
 * bound found so far, the search stops once the miss target is met for the current bounds, and the
 * enumeration runs until its goal is met for the current upper bound. Shards cannot see each other's words,
 * so a sharded run fixes all of that once, from what every shard computes alike:
 *
 *  1. the first Brouwer–Zimmermann pass (≤ FREE_ENUMERATION combinations), run in full by every shard (it is
 *     cheap and not interrupted), gives levels L0, bound B0 and upper bound U0;
 *  2. exhaustive branch (method exhaustive, or auto with K ≤ AUTO_EXHAUSTIVE_DIM): the Gray-code chunks over
 *     all 2^K codewords with weight limit U0 (unless auto is already settled);
 *  3. otherwise one information-set stage planned as the adaptive run's first stage would be (settings for
 *     the heaviest reachable weight below U0, limit U0 in every chunk), with a total fixed in advance: the
 *     fewest whole chunks bringing the miss probability of every weight in [B0, that weight] below the target
 *     (target and warm-up defaults as in the adaptive run), or --iterations; chunk c draws
 *     streamRng(seed, streamBase + c);
 *  4. then (certify, and auto when it fits --enumeration-limit) the enumeration units (set, level) in the
 *     schedule's order from L0 until the goal is met for U0, each level cut into chunks of COMBINATION_CHUNK
 *     combinations numbered across the units.
 * Chunk g of a phase belongs to shard g mod N; a shard runs its chunks in increasing order and records how
 * many it finished. `--shard 0/1` runs the same plan in one process, which is what N merged shards equal.
 * The price of fixing the plan: the enumeration aims at U0, not at the (possibly lower) upper bound the
 * search finds, and the search does not stop early once the bounds meet.
 */
import { InputError } from '../errors.js';
import { packedSupport } from '../gf2/bitmatrix.js';
import { type TaskPool, runOrdered } from '../parallel/pool.js';
import { type GrayChunkResult, type GrayChunkTask, grayChunkCount, grayLowBits } from '../search/gray.js';
import type { IsdChunkResult, IsdChunkTask, IsdSettings } from '../search/isd.js';
import type { AuditControl, AuditSettings } from './audit.js';
import { collectHits, EnumerationSchedule, type EnumerationGoal, type EnumerationPlan, goalMet, planEnumeration, remainingCost } from './brouwer-zimmermann.js';
import { type CombinationChunkPayload, COMBINATION_CHUNK, GRAY_MAX_WORDS, runEnumerationPhase } from './certify.js';
import {
  AUTO_EXHAUSTIVE_DIM, DEFAULT_ENUMERATION_LIMIT, DEFAULT_MAX_WORDS, DEFAULT_TARGET_MISS, EXHAUSTIVE_MAX_DIM, FREE_ENUMERATION,
  WARMUP_TARGET_MISS,
} from './defaults.js';
import { type DistanceProblem, verifiedMinimum } from './problem.js';
import type { SideReport } from './result.js';
import { chunksBelow, type FixedPlan, type FixedPlanUnit, type ShardPart, type ShardSideRecord, sideFromRecord } from './shard-record.js';
import { CHUNK_MAX_WORDS, isdCode, type IsdCode, planFixedIsd, rangeMiss } from './upper.js';
import { WordCollection } from './words.js';

/** The enumeration units from `levels` until the goal is met for W (the last finite units when it never is). */
export function planUnits(plan: EnumerationPlan, levels: readonly number[], W: number, goal: EnumerationGoal): FixedPlanUnit[] {
  const s = new EnumerationSchedule(plan);
  levels.forEach((t, j) => (s.levels[j] = t));
  const units: FixedPlanUnit[] = [];
  while (!goalMet(s.bound(), W, goal, plan.n)) {
    const u = s.next();
    if (!u || !Number.isFinite(u.size)) break;
    units.push({ set: u.set, level: u.level, size: u.size, chunks: Math.ceil(u.size / COMBINATION_CHUNK) });
    s.complete(u);
  }
  return units;
}

/** Fix the plan of a side from the state after the first pass (pure: the same in every shard). */
export function fixPlan(
  s: AuditSettings,
  code: IsdCode,
  plan: EnumerationPlan,
  start: FixedPlan['start'],
  limit: number,
): FixedPlan {
  const K = plan.dim;
  const exhaustive = s.method === 'exhaustive' || (s.method === 'auto' && K <= AUTO_EXHAUSTIVE_DIM);
  const settled = goalMet(start.bound, limit, 'exceed', plan.n);
  const base = {
    start,
    n: plan.n,
    dim: K,
    effectiveLength: code.effectiveLength,
    sets: plan.sets.map((x) => ({ size: x.columns.length, rank: x.rank })),
  };
  if (exhaustive) {
    const skip = s.method === 'auto' && settled;
    return { ...base, branch: 'exhaustive', exhaustive: skip ? null : { chunks: grayChunkCount(K), total: 2 ** K, maxWeight: limit }, isd: null, enumeration: null };
  }
  if (settled) return { ...base, branch: 'search', exhaustive: null, isd: null, enumeration: null };
  let goal: EnumerationGoal | null = null;
  if (s.method === 'certify') goal = 'exceed';
  else if (s.method === 'auto') {
    const max = s.enumerationLimit ?? DEFAULT_ENUMERATION_LIMIT;
    if (remainingCost(plan, start.levels, limit, 'exceed') <= max) goal = 'exceed';
    else if (remainingCost(plan, start.levels, limit, 'reach') <= max) goal = 'reach';
  }
  const onlyIterations = s.iterations !== undefined && s.targetMiss === undefined;
  const target = onlyIterations ? null : (s.targetMiss ?? (s.method !== 'isd' && goal !== null ? WARMUP_TARGET_MISS : DEFAULT_TARGET_MISS));
  const isd = s.iterations === 0 ? null : planFixedIsd(code, limit, start.bound, target, s.iterations);
  const units = goal ? planUnits(plan, start.levels, limit, goal) : [];
  return {
    ...base,
    branch: 'search',
    exhaustive: null,
    isd,
    enumeration: goal ? { goal, maxWeight: limit, units, chunks: units.reduce((t, u) => t + u.chunks, 0) } : null,
  };
}

/** Audit one side by the fixed plan, running shard s.shard's chunks; the report carries the shard record. */
export async function auditSideFixed(pool: TaskPool, problem: DistanceProblem, streamBase: number, s: AuditSettings, control: AuditControl): Promise<SideReport> {
  const shard = s.shard ?? { index: 0, count: 1 };
  const { index: I, count: N } = shard;
  const b = problem.basis;
  const K = b.dim;
  if (K === 0) throw new InputError(`${problem.key}: the code has dimension 0, so there is no nonzero word and no distance`);
  const maxWords = s.maxWords ?? DEFAULT_MAX_WORDS;
  const collection = new WordCollection(b.codeWords, b.n, true, maxWords);
  for (const w of problem.known) collection.add(w);
  if (collection.size === 0) throw new InputError(`${problem.key}: no nonzero word to start from`);
  if ((s.method === 'exhaustive' || (s.method === 'auto' && K <= AUTO_EXHAUSTIVE_DIM)) && K > EXHAUSTIVE_MAX_DIM) {
    throw new InputError(`${problem.key}: exhaustive enumeration of 2^${K} codewords is out of reach (limit 2^${EXHAUSTIVE_MAX_DIM}); use --method certify or isd`);
  }
  const code = isdCode(b, problem.filter);
  const enumPlan = planEnumeration(b);
  const schedule = new EnumerationSchedule(enumPlan);
  const S = b.codeWords;
  let iterations = 0;
  let combinations = 0;
  const lengths: Record<string, number> = {};
  let isdSettings: IsdSettings | null = null;
  const missNow = () => {
    if (!isdSettings || iterations === 0) return 1;
    const chunks = new Map(Object.entries(lengths).map(([k, v]) => [Number(k), v] as [number, number]));
    return rangeMiss(code, [{ settings: isdSettings, iterations, chunks }], schedule.bound(), collection.limit - 1);
  };
  const report = (phase: 'isd' | 'enumeration' | 'exhaustive', combos: number, level: number) =>
    control.progress?.({ key: problem.key, phase, upper: collection.limit, lower: schedule.bound(), iterations, missProbability: phase === 'isd' ? missNow() : 1, combinations: combos, level });

  // 1. the first pass, in full (never interrupted: every shard must plan from the same state)
  const free = await runEnumerationPhase(pool, enumPlan, schedule, collection, 'exceed', FREE_ENUMERATION, () => false, (p) => report('enumeration', p.combinations, p.level));
  const start = { levels: [...schedule.levels], bound: schedule.bound(), combinations: free.combinations, upper: collection.lightest() };
  const plan = fixPlan(s, code, enumPlan, start, collection.limit);
  isdSettings = plan.isd?.settings ?? null;

  let stoppedBy: ShardPart['stoppedBy'] = null;
  const stop = () => stoppedBy !== null || control.shouldStop();
  const halt = () => {
    if (stoppedBy === null) stoppedBy = control.stopReason();
  };
  let exhaustiveChunks = 0;
  let visited = 0;
  let overflow = false;
  let isdChunks = 0;
  let enumerationChunks = 0;

  // 2. exhaustive branch: Gray-code chunks c ≡ I (mod N)
  if (plan.exhaustive) {
    const ex = plan.exhaustive;
    const mine = chunksBelow(ex.chunks, I, N);
    const lowBits = grayLowBits(K);
    exhaustiveChunks = await runOrdered<GrayChunkResult>(
      pool,
      mine,
      (t) => {
        const task: GrayChunkTask = {
          rows: K, cols: b.n, basis: code.generator, maxWeight: ex.maxWeight, lowBits, chunk: I + t * N, maxWords: GRAY_MAX_WORDS,
          ...(code.filter ? { filter: code.filter } : {}),
        };
        return { kind: 'search.gray', payload: task };
      },
      (_t, r) => {
        for (let i = 0; i < r.count; i++) collection.add(r.words.subarray(i * S, (i + 1) * S));
        if (r.overflow) overflow = true;
        visited += r.visited;
        report('exhaustive', visited, K);
      },
      () => overflow || stop(),
    );
    if (exhaustiveChunks < mine && !overflow) halt();
  }

  // 3. information-set chunks c ≡ I (mod N) of the fixed total
  if (plan.isd && !stoppedBy) {
    const f = plan.isd;
    const mine = chunksBelow(f.chunks, I, N);
    isdChunks = await runOrdered<IsdChunkResult>(
      pool,
      mine,
      (t) => {
        const c = I + t * N;
        const task: IsdChunkTask = {
          rows: code.dim, cols: code.n, generator: code.generator, ...(code.filter ? { filter: code.filter } : {}),
          maxWeight: f.maxWeight, settings: f.settings, seed: s.seed, stream: streamBase + c,
          iterations: Math.min(f.chunkIterations, f.iterations - c * f.chunkIterations), maxWords: CHUNK_MAX_WORDS,
        };
        return { kind: 'search.isd', payload: task };
      },
      (_t, r) => {
        for (let i = 0; i < r.count; i++) collection.add(r.words.subarray(i * S, (i + 1) * S));
        iterations += r.iterations;
        if (r.iterations > 0) lengths[String(r.iterations)] = (lengths[String(r.iterations)] ?? 0) + 1;
        report('isd', combinations, 0);
      },
      stop,
    );
    if (isdChunks < mine) halt();
  }

  // 4. enumeration chunks g ≡ I (mod N), numbered across the units in order
  if (plan.enumeration && !stoppedBy) {
    let offset = 0;
    for (const u of plan.enumeration.units) {
      const matrix = enumPlan.matrices[u.set]!;
      const mine = chunksBelow(offset + u.chunks, I, N) - chunksBelow(offset, I, N);
      const firstLocal = (((I - offset) % N) + N) % N; // first chunk of this unit that is ours
      const done = await runOrdered<Int32Array>(
        pool,
        mine,
        (t) => {
          const start = (firstLocal + t * N) * COMBINATION_CHUNK;
          const payload: CombinationChunkPayload = { matrix, level: u.level, start, count: Math.min(COMBINATION_CHUNK, u.size - start), maxWeight: collection.limit };
          return { kind: 'distance.combinations', payload };
        },
        (t, hits) => {
          collectHits(matrix, u.level, hits, collection);
          const start = (firstLocal + t * N) * COMBINATION_CHUNK;
          combinations += Math.min(COMBINATION_CHUNK, u.size - start);
          report('enumeration', combinations, u.level);
        },
        stop,
      );
      enumerationChunks += done;
      offset += u.chunks;
      if (done < mine) {
        halt();
        break;
      }
    }
  }

  // the record: verify every minimum-weight word kept, as the adaptive run does before printing
  const { upper: U, minimum, partner } = verifiedMinimum(problem, collection);
  const part: ShardPart = { index: I, exhaustiveChunks, isdChunks, enumerationChunks, iterations, combinations, visited, overflow, stoppedBy };
  const record: ShardSideRecord = {
    count: N,
    plan,
    parts: [part],
    isdChunkLengths: lengths,
    words: minimum.map((w) => packedSupport(w.word, 0, S)),
    truncated: collection.truncated,
  };
  return { ...sideFromRecord(record, partner), shard: record };
}

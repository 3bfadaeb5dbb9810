/**
 * The distance audit: for each side, an upper bound with a verified witness, a proven lower bound, the
 * number of minimum-weight words, and a miss probability when the two bounds differ.
 *
 * Phases of one side (methods other than exhaustive):
 *  1. a cheap Brouwer–Zimmermann pass (at most FREE_ENUMERATION combinations): a first proven lower bound,
 *     and often the answer outright for small codes;
 *  2. information-set search for the upper bound (to the miss target, or a warm-up target before an
 *     enumeration);
 *  3. for certify (always) and auto (when the planned cost fits --enumeration-limit): the enumeration
 *     continued until lower = upper and every minimum-weight word is listed.
 * Exhaustive (and auto on codes of dimension ≤ AUTO_EXHAUSTIVE_DIM) visits all 2^K codewords after phase 1
 * instead (phase 1 only lowers the weight limit there).
 * No clock is read here: the caller's `shouldStop` carries time limits and interrupts.
 */
import { InputError } from '../errors.js';
import type { TaskPool } from '../parallel/pool.js';
import type { CssCode } from '../codes/css.js';
import { logicalBasis } from '../codes/logicals.js';
import { packedSupport } from '../gf2/bitmatrix.js';
import { EnumerationSchedule, type EnumerationGoal, goalMet, planEnumeration, remainingCost } from './brouwer-zimmermann.js';
import { runEnumerationPhase, runExhaustivePhase } from './certify.js';
import { cssSideProblem, type DistanceProblem, type Side, verifiedMinimum } from './problem.js';
import { type AuditReportSettings, combineSides, type DistanceReport, type SideReport, type SideStop } from './result.js';
import { type IsdStage, isdCode, rangeMiss, runInformationSetPhase } from './upper.js';
import { WordCollection } from './words.js';
import {
  AUTO_EXHAUSTIVE_DIM, DEFAULT_ENUMERATION_LIMIT, DEFAULT_MAX_WORDS, DEFAULT_TARGET_MISS, EXHAUSTIVE_MAX_DIM, FREE_ENUMERATION,
  WARMUP_TARGET_MISS, Z_STREAM_BASE,
} from './defaults.js';
import { auditSideFixed } from './fixed-plan.js';

export type DistanceMethod = 'auto' | 'exhaustive' | 'isd' | 'certify';
export const DISTANCE_METHODS: readonly DistanceMethod[] = ['auto', 'exhaustive', 'isd', 'certify'];

export {
  FREE_ENUMERATION, AUTO_EXHAUSTIVE_DIM, EXHAUSTIVE_MAX_DIM, DEFAULT_TARGET_MISS, WARMUP_TARGET_MISS,
  DEFAULT_ENUMERATION_LIMIT, DEFAULT_MAX_WORDS, Z_STREAM_BASE,
} from './defaults.js';

export interface AuditSettings {
  readonly method: DistanceMethod;
  readonly seed: string | number;
  /** Cap on information-set iterations (given alone: run exactly this many). */
  readonly iterations?: number;
  /** Information-set stop target for the miss probability. */
  readonly targetMiss?: number;
  /** Largest enumeration auto plans for (combinations). */
  readonly enumerationLimit?: number;
  /** Most minimum-weight words kept per side (default DEFAULT_MAX_WORDS); beyond it the count is "at least". */
  readonly maxWords?: number;
  /** Run the fixed plan (fixed-plan.ts), only the chunks ≡ index (mod count) of each phase. */
  readonly shard?: { readonly index: number; readonly count: number };
}

export interface AuditProgress {
  readonly key: string;
  readonly phase: 'isd' | 'enumeration' | 'exhaustive';
  readonly upper: number;
  readonly lower: number;
  readonly iterations: number;
  readonly missProbability: number;
  readonly combinations: number;
  readonly level: number;
}

export interface AuditControl {
  shouldStop(): boolean;
  /** Why shouldStop() turned true. */
  stopReason(): 'time-limit' | 'interrupted';
  progress?(p: AuditProgress): void;
}

/** Audit one side (or a classical code). */
export async function auditSide(pool: TaskPool, problem: DistanceProblem, streamBase: number, s: AuditSettings, control: AuditControl): Promise<SideReport> {
  if (s.shard) return auditSideFixed(pool, problem, streamBase, s, control);
  const b = problem.basis;
  const K = b.dim;
  if (K === 0) throw new InputError(`${problem.key}: the code has dimension 0, so there is no nonzero word and no distance`);
  const collection = new WordCollection(b.codeWords, b.n, true, s.maxWords ?? DEFAULT_MAX_WORDS);
  for (const w of problem.known) collection.add(w);
  if (collection.size === 0) throw new InputError(`${problem.key}: no nonzero word to start from`);
  const stop = () => control.shouldStop();
  const report = (phase: AuditProgress['phase'], lower: number, iterations: number, miss: number, combinations: number, level: number) =>
    control.progress?.({ key: problem.key, phase, upper: collection.limit, lower, iterations, missProbability: miss, combinations, level });

  const exhaustive = s.method === 'exhaustive' || (s.method === 'auto' && K <= AUTO_EXHAUSTIVE_DIM);
  if (exhaustive && K > EXHAUSTIVE_MAX_DIM) {
    throw new InputError(`${problem.key}: exhaustive enumeration of 2^${K} codewords is out of reach (limit 2^${EXHAUSTIVE_MAX_DIM}); use --method certify or isd`);
  }
  const isd = isdCode(b, problem.filter);
  const plan = planEnumeration(b);
  const schedule = new EnumerationSchedule(plan);
  let combinations = 0;
  const stages: IsdStage[] = [];
  const isdState = { nextChunk: 0, iterations: 0 };
  let stoppedBy: SideStop | null = null;
  const enumerate = async (goal: EnumerationGoal, budget: number) => {
    const r = await runEnumerationPhase(pool, plan, schedule, collection, goal, budget, stop, (p) =>
      report('enumeration', Math.min(p.bound, collection.limit), isdState.iterations, 1, combinations + p.combinations, p.level),
    );
    combinations += r.combinations;
    return r;
  };
  const enumerationSummary = () => {
    const U = collection.lightest();
    const toCertify = schedule.bound() >= U ? 0 : remainingCost(plan, schedule.levels, U, 'reach');
    return {
      sets: plan.sets.map((x, j) => ({ size: x.columns.length, rank: x.rank, level: schedule.levels[j]! })),
      bound: schedule.bound(),
      combinations,
      toCertify: Number.isFinite(toCertify) ? toCertify : null,
    };
  };

  // 1. cheap first lower bound (and often the minimum itself, which keeps the limit W small from here on)
  const free = await enumerate('exceed', FREE_ENUMERATION);
  if (free.stoppedBy === 'stopped') stoppedBy = control.stopReason();
  const settled = () => goalMet(schedule.bound(), collection.limit, 'exceed', b.n);

  if (exhaustive) {
    // asked for: always visit every codeword; under auto, only when the first pass did not settle it
    const first = s.method === 'auto' && settled();
    const r = first || stoppedBy ? null : await runExhaustivePhase(pool, isd, collection, stop, (v) => report('exhaustive', 1, 0, 1, v, K));
    const all = first || (r?.complete ?? false);
    const U = collection.lightest();
    return finish(problem, collection, {
      lower: all ? U : Math.min(schedule.bound(), U),
      countExact: all && !collection.truncated,
      method: r ? 'exhaustive' : 'brouwer-zimmermann',
      stoppedBy: all ? 'certified' : r?.overflow ? 'word-limit' : (stoppedBy ?? control.stopReason()),
      isd: { stages: [], miss: () => 1 },
      enumeration: enumerationSummary(),
      exhaustive: r ? { visited: r.visited, total: 2 ** K } : null,
    });
  }

  // 2. information-set search
  const userTarget = s.targetMiss;
  const onlyIterations = s.iterations !== undefined && userTarget === undefined;
  const isdPhase = async (target: number) =>
    runInformationSetPhase(
      pool,
      isd,
      collection,
      stages,
      isdState,
      { seed: s.seed, streamBase, maxIterations: (s.iterations ?? Infinity) - isdState.iterations, targetMiss: target, lowerBound: schedule.bound() },
      stop,
      (it, miss) => report('isd', Math.min(schedule.bound(), collection.limit), it, miss, combinations, 0),
    );
  const finalTarget = onlyIterations ? 0 : (userTarget ?? DEFAULT_TARGET_MISS);
  let isdStop: SideStop | null = null;
  const warm = s.method !== 'isd' && !onlyIterations && userTarget === undefined ? WARMUP_TARGET_MISS : finalTarget;
  if (!stoppedBy && !settled() && (s.iterations ?? 1) > 0) {
    const r = await isdPhase(warm);
    if (r.stoppedBy === 'stopped') stoppedBy = control.stopReason();
    else isdStop = r.stoppedBy === 'unreachable' ? 'iterations' : r.stoppedBy;
  }

  // 3. enumeration to certify
  if (!stoppedBy && !settled() && s.method !== 'isd') {
    let goal: EnumerationGoal | null = 'exceed';
    let budget = Infinity;
    if (s.method === 'auto') {
      const limit = s.enumerationLimit ?? DEFAULT_ENUMERATION_LIMIT;
      budget = limit;
      if (remainingCost(plan, schedule.levels, collection.limit, 'exceed') <= limit) goal = 'exceed';
      else if (remainingCost(plan, schedule.levels, collection.limit, 'reach') <= limit) goal = 'reach';
      else goal = null;
    }
    if (goal) {
      const r = await enumerate(goal, budget);
      if (r.stoppedBy === 'stopped') stoppedBy = control.stopReason();
      else if (r.stoppedBy === 'budget') stoppedBy = 'enumeration-limit';
    } else {
      // too costly to certify: go on with the search to the final target
      if (finalTarget < warm && isdStop === 'target-miss') {
        const r = await isdPhase(finalTarget);
        if (r.stoppedBy === 'stopped') stoppedBy = control.stopReason();
        else isdStop = r.stoppedBy === 'unreachable' ? 'iterations' : r.stoppedBy;
      }
    }
  }

  const U = collection.lightest();
  const bound = schedule.bound();
  const countExact = bound > U && !collection.truncated;
  const certified = bound >= U;
  if (countExact || (bound > U && collection.truncated)) stoppedBy = 'certified';
  else if (certified && !stoppedBy) stoppedBy = 'certified-count-open';
  else if (!stoppedBy) stoppedBy = isdStop ?? 'iterations';
  return finish(problem, collection, {
    lower: Math.min(bound, U),
    countExact,
    method: certified ? 'brouwer-zimmermann' : 'isd',
    stoppedBy,
    isd: { stages, miss: (from: number, to: number) => rangeMiss(isd, stages, from, to) },
    enumeration: enumerationSummary(),
    exhaustive: null,
  });
}

interface Finish {
  lower: number;
  countExact: boolean;
  method: SideReport['method'];
  stoppedBy: SideStop;
  isd: { stages: readonly IsdStage[]; miss: (from: number, to: number) => number };
  enumeration: SideReport['enumeration'];
  exhaustive: SideReport['exhaustive'];
}

/** Verify every minimum-weight word found (independently of the filter) and assemble the side report. */
function finish(problem: DistanceProblem, collection: WordCollection, f: Finish): SideReport {
  const { upper: U, minimum, partner } = verifiedMinimum(problem, collection);
  const certified = f.lower >= U;
  const iterations = f.isd.stages.reduce((a, st) => a + st.iterations, 0);
  const miss = certified ? 0 : iterations > 0 ? f.isd.miss(f.lower, U - 1) : 1;
  return {
    upper: U,
    lower: f.lower,
    certified,
    count: minimum.length,
    countExact: f.countExact,
    truncated: collection.truncated,
    witness: packedSupport(minimum[0]!.word, 0, problem.basis.codeWords),
    anticommutesWith: partner,
    missProbability: miss,
    dimension: problem.basis.dim,
    method: f.method,
    stoppedBy: f.stoppedBy,
    isd: {
      iterations,
      stages: f.isd.stages.filter((st) => st.iterations > 0).map((st) => ({ ...st.settings, iterations: st.iterations, chunks: [...st.chunks.values()].reduce((a, b) => a + b, 0) })),
    },
    enumeration: f.enumeration,
    exhaustive: f.exhaustive,
  };
}

export type DistanceInput =
  | { readonly kind: 'css'; readonly code: CssCode; readonly label: string; readonly side: Side | 'both' }
  | { readonly kind: 'classical'; readonly problem: DistanceProblem; readonly label: string };

/** Audit a CSS code (one or both sides) or a classical code. */
export async function auditDistance(pool: TaskPool, input: DistanceInput, s: AuditSettings, control: AuditControl): Promise<DistanceReport> {
  if (input.kind === 'classical') {
    const d = await auditSide(pool, input.problem, 0, s, control);
    return { kind: 'classical', code: input.label, n: input.problem.n, k: input.problem.basis.dim, seed: s.seed, method: s.method, settings: reportedSettings(s), ...shardOf(s), d };
  }
  const logicals = logicalBasis(input.code);
  if (logicals.k === 0) throw new InputError(`${input.label}: the code encodes no logical qubits (k = 0), so it has no logical operators and no distance`);
  const sides: Side[] = input.side === 'both' ? ['x', 'z'] : [input.side];
  const out: { dx?: SideReport; dz?: SideReport } = {};
  for (const side of sides) {
    const problem = cssSideProblem(input.code, logicals, side);
    out[problem.key as 'dx' | 'dz'] = await auditSide(pool, problem, side === 'x' ? 0 : Z_STREAM_BASE, s, control);
  }
  return {
    kind: 'css',
    code: input.label,
    n: input.code.n,
    k: logicals.k,
    seed: s.seed,
    method: s.method,
    settings: reportedSettings(s),
    ...shardOf(s),
    side: input.side,
    ...out,
    d: combineSides(out.dx, out.dz),
  };
}

/** The options that fix what a run computes (with the seed and method), as results report them. */
function reportedSettings(s: AuditSettings): AuditReportSettings {
  return {
    iterations: s.iterations ?? null,
    targetMiss: s.targetMiss ?? null,
    enumerationLimit: s.enumerationLimit ?? DEFAULT_ENUMERATION_LIMIT,
    maxWords: s.maxWords ?? DEFAULT_MAX_WORDS,
  };
}

function shardOf(s: AuditSettings): { shard?: { count: number; parts: number[] } } {
  return s.shard ? { shard: { count: s.shard.count, parts: [s.shard.index] } } : {};
}

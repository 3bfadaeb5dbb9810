import { exactQuotient } from './overlapcycles.js';
import { homomorphismCount, planHomomorphism, tableAvailability, type HomPlan, type HomTarget, type TableAvailability } from './homomorphisms.js';
import { cycleQuotients } from './quotients.js';

/**
 * Exact number of 2k-cycles at any girth (used for lengths 10 and 12):
 *     N_2k = (1/2k) · Σ over the quotients F of C_2k of coefficient(F) · hom(F, G),
 * see quotients.ts for the identity and homomorphisms.ts for the evaluation. The work is the sum of the
 * plans' work (known before anything runs, `quotientWork`), times 1 + the number of primes when the
 * counts pass 2^53. For lengths ≤ 12 each step costs at most about s³, s²·t or t³ operations, so the
 * method suits graphs with a side of at most a few hundred nodes (bounded by the table and factor limits).
 */
export interface QuotientPlan {
  readonly coefficient: number;
  readonly plan: HomPlan;
}

export function quotientPlans(k: number, s: number, t: number, tables: TableAvailability, sDeg = s, tDeg = t): QuotientPlan[] {
  return cycleQuotients(k).map((w) => ({ coefficient: w.coefficient, plan: planHomomorphism(w.pattern, s, t, tables, sDeg, tDeg) }));
}

const planCache = new Map<string, QuotientPlan[]>();

/** Graphs with both sides at most this large share one plan (any order is cheap for them). */
const SMALL_SIDE = 16;

/**
 * Plans for this target. A plan is valid for any graph whose tables it uses exist (only its efficiency
 * depends on sizes and degrees), so plans are cached by sizes, tables and degrees rounded to a quarter
 * of a binary order of magnitude; small graphs (both sides ≤ SMALL_SIDE, every table present, every
 * factor far below FACTOR_LIMIT) share the plan made for sides of SMALL_SIDE.
 */
export function targetPlans(target: HomTarget, k: number): QuotientPlan[] {
  const e = target.graph.edges;
  const small = target.s <= SMALL_SIDE && target.t <= SMALL_SIDE;
  const s = small ? SMALL_SIDE : target.s;
  const t = small ? SMALL_SIDE : target.t;
  const sDeg = small ? 4 : target.s ? Math.max(1, e / target.s) : 1;
  const tDeg = small ? 4 : target.t ? Math.max(1, e / target.t) : 1;
  const tables = tableAvailability(target);
  const key = [k, s, t, tables.S.join(), tables.T.join(), Math.round(4 * Math.log2(sDeg)), Math.round(4 * Math.log2(tDeg))].join('|');
  let plans = planCache.get(key);
  if (!plans) {
    plans = quotientPlans(k, s, t, tables, sDeg, tDeg);
    if (planCache.size > 64) planCache.clear();
    planCache.set(key, plans);
  }
  return plans;
}

/** Total work of the plans (Infinity when one of them cannot be run within the factor size limit). */
export function quotientWork(plans: readonly QuotientPlan[]): number {
  let w = 0;
  for (const p of plans) w += p.plan.work;
  return w;
}

export function quotientCycleCount(target: HomTarget, k: number, plans = targetPlans(target, k)): bigint {
  let sum = 0n;
  for (const { coefficient, plan } of plans) sum += BigInt(coefficient) * homomorphismCount(target, plan);
  return exactQuotient(sum, BigInt(2 * k), 2 * k);
}

import type { BitMatrix } from '../gf2/bitmatrix.js';
import { InputError } from '../errors.js';
import { girthByBfs, girthParticipation } from './girth.js';
import { homTarget } from './homomorphisms.js';
import { overlapCycleCounts } from './overlapcycles.js';
import { quotientCycleCount, quotientWork, targetPlans } from './quotientcycles.js';
import { smallerSide, tannerGraph, type SidedGraph } from './tanner.js';

/** How a count was obtained (printed with the census). */
export type CountMethod = 'overlap-sum' | 'overlap-inclusion-exclusion' | 'quotient-homomorphism' | 'breadth-first-search';

export const METHOD_TEXT: Readonly<Record<CountMethod, string>> = {
  'overlap-sum': 'sum of C(overlap, 2) over pairs',
  'overlap-inclusion-exclusion': 'overlap sums with inclusion–exclusion',
  'quotient-homomorphism': 'homomorphism counts of cycle quotients (Möbius inversion)',
  'breadth-first-search': 'breadth-first search at the girth',
};

export interface CycleCensus {
  readonly rows: number;
  readonly cols: number;
  readonly edges: number;
  readonly maxLength: number;
  /** Length of the shortest cycle, null when the graph has none (a forest). */
  readonly girth: number | null;
  /** Exact counts for every even length 4..maxLength, plus the girth when it is longer. */
  readonly cycles: ReadonlyMap<number, bigint>;
  readonly methods: ReadonlyMap<number, CountMethod>;
  /** rowCycles.get(L)[r]: number of L-cycles through row r, for L = 4 and L = girth. Likewise columns. */
  readonly rowCycles: ReadonlyMap<number, Float64Array>;
  readonly colCycles: ReadonlyMap<number, Float64Array>;
  /** The side the formulas iterate over (the smaller one). */
  readonly iterated: 'rows' | 'cols';
  /** Planned work of the quotient method (lengths ≥ 10), 0 when unused. */
  readonly quotientWork: number;
}

export interface CensusOptions {
  /** Refuse the quotient method when its planned work exceeds this many steps (DEFAULT_WORK_LIMIT). */
  readonly workLimit?: number;
  /** Count every length with the quotient method (cross-checks). */
  readonly quotientOnly?: boolean;
}

export const MAX_CYCLE_LENGTH = 12;
/** About two minutes at the ≈ 1.8e8 planned steps/s measured (DEVELOPERS.md, cycle census). */
export const DEFAULT_WORK_LIMIT = 2e10;

/** Precondition check for maxLength; InputError names the problem. */
export function checkMaxLength(maxLength: number): void {
  if (!Number.isInteger(maxLength) || maxLength < 4 || maxLength > MAX_CYCLE_LENGTH || maxLength % 2 !== 0) {
    throw new InputError(`maximum cycle length must be an even number from 4 to ${MAX_CYCLE_LENGTH}, found ${maxLength}`);
  }
}

/**
 * Exact cycle census of the Tanner graph of `m` (rows = check nodes, columns = variable nodes):
 * counts of cycles of every even length 4..maxLength (maxLength ≤ 12), the girth, and for every row and
 * column the number of 4-cycles and of shortest cycles through it.
 * Lengths 4, 6, 8 use overlap formulas (overlapcycles.ts) in O(Σ_x e_x² + Σ_a nnzA(a)² + Σ_a d_a²);
 * 10 and 12 the quotient method (quotientcycles.ts), whose work is planned first and refused above
 * `workLimit` with an InputError. A girth beyond maxLength is found by breadth-first search.
 */
export function cycleCensus(m: BitMatrix, maxLength = 8, options: CensusOptions = {}): CycleCensus {
  checkMaxLength(maxLength);
  const tg = tannerGraph(m);
  const g = smallerSide(tg);
  const limit = options.workLimit ?? DEFAULT_WORK_LIMIT;
  const cycles = new Map<number, bigint>();
  const methods = new Map<number, CountMethod>();
  const overlap = overlapCycleCounts(g, options.quotientOnly ? 4 : Math.min(maxLength, 8));
  if (!options.quotientOnly) {
    for (const [L, n] of overlap.cycles) {
      cycles.set(L, n);
      methods.set(L, L === 4 ? 'overlap-sum' : 'overlap-inclusion-exclusion');
    }
  }
  let work = 0;
  const quotientLengths: number[] = [];
  for (let L = options.quotientOnly ? 4 : 10; L <= maxLength; L += 2) quotientLengths.push(L);
  if (quotientLengths.length > 0) {
    // plan every length first, so that a refusal comes before any long computation
    const target = homTarget(g);
    const planned = quotientLengths.map((L) => ({ L, plans: targetPlans(target, L / 2) }));
    for (const { plans } of planned) work += quotientWork(plans);
    if (work > limit) throw new InputError(tooMuchWork(quotientLengths, work, limit, g));
    for (const { L, plans } of planned) {
      cycles.set(L, quotientCycleCount(target, L / 2, plans));
      methods.set(L, 'quotient-homomorphism');
    }
  }
  let girth: number | null = null;
  for (let L = 4; L <= maxLength && girth === null; L += 2) if (cycles.get(L)! > 0n) girth = L;
  if (girth === null) {
    const found = girthByBfs(g);
    girth = Number.isFinite(found) ? found : null;
  }
  const sCycles = new Map<number, Float64Array>([[4, overlap.fourPerS]]);
  const tCycles = new Map<number, Float64Array>([[4, overlap.fourPerT]]);
  if (girth !== null && girth > 4) {
    const { perS, perT } = girthParticipation(g, girth);
    sCycles.set(girth, perS);
    tCycles.set(girth, perT);
    if (girth > maxLength) {
      let sum = 0;
      for (const x of perS) sum += x;
      cycles.set(girth, BigInt(sum) / BigInt(girth / 2));
      methods.set(girth, 'breadth-first-search');
    }
  }
  return {
    rows: m.rows,
    cols: m.cols,
    edges: tg.edges,
    maxLength,
    girth,
    cycles,
    methods,
    rowCycles: g.sIsRows ? sCycles : tCycles,
    colCycles: g.sIsRows ? tCycles : sCycles,
    iterated: g.sIsRows ? 'rows' : 'cols',
    quotientWork: work,
  };
}

function tooMuchWork(lengths: number[], work: number, limit: number, g: SidedGraph): string {
  const what = `exact ${lengths.join(', ')}-cycle counting`;
  if (!Number.isFinite(work)) {
    return `${what} needs intermediate tables too large for this graph (sides of ${g.s} and ${g.t} nodes); use a maximum length of 8`;
  }
  return `${what} would take about ${work.toExponential(1)} steps on this graph (sides of ${g.s} and ${g.t} nodes), above the limit of ${limit.toExponential(1)} (--work-limit); use a smaller maximum length`;
}

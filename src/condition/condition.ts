import { type BitMatrix, fromRowVectors } from '../gf2/bitmatrix.js';
import { GrowingBasis } from '../gf2/basis.js';
import { RowSpaceSolver } from '../gf2/solve.js';
import type { ShiftSymmetry } from '../codes/families/types.js';
import { InputError } from '../errors.js';
import type { Budget } from './budget.js';
import type { Candidates } from './candidates.js';
import { ShortCycleDelta } from './cycle-delta.js';
import type { LatencyModel } from './latency.js';
import { selectBalanced, selectFewestCycles, selectLightest, selectOrbits, type Pool, type Strategy } from './select.js';
import { MatrixState } from './state.js';

/** Size and structure figures reported before and after conditioning. */
export interface MatrixFigures {
  rows: number;
  edges: number;
  maxRowWeight: number;
  maxColDegree: number;
  latency: number;
  cycles: { '4': number; '6': number };
}

/** Selection by measured decoding performance, supplied by the caller (it needs the trial engine). */
export type TrialSelector = (base: readonly Uint32Array[], pool: Pool, fits: (chosen: readonly number[]) => boolean) => number[];

export interface ConditionRequest {
  readonly side: string;
  readonly h: BitMatrix;
  readonly candidates: Candidates;
  readonly basis: 'all' | 'minimal';
  readonly budget: Budget;
  readonly latencyModel: LatencyModel;
  readonly iterations: number;
  readonly strategy: Strategy;
  readonly seed: string | number;
  readonly symmetry?: ShiftSymmetry;
  readonly trial?: TrialSelector;
  /** Rows of h that must be kept as the base (default: all, or a full-rank subset with basis 'minimal'). */
  readonly baseRows?: readonly number[];
}

export interface ConditionedSide {
  side: string;
  /** Base rows first (in h's order), then the added rows in the order chosen. */
  matrix: BitMatrix;
  baseRows: number[];
  /** Indices into the candidates of the rows added, in order. */
  added: number[];
  /** map · h = matrix (rows × h.rows). */
  map: BitMatrix;
  before: MatrixFigures;
  after: MatrixFigures;
  /** Weight → number of added rows of that weight. */
  addedByWeight: Record<string, number>;
  rank: number;
}

/** A full-rank subset of the rows of h: the first rows, in order, that are independent of earlier ones. */
export function minimalBasisRows(h: BitMatrix): number[] {
  const b = new GrowingBasis(h.cols);
  const keep: number[] = [];
  for (let r = 0; r < h.rows; r++) if (b.insert(h.data.subarray(r * h.stride, (r + 1) * h.stride))) keep.push(r);
  return keep;
}

/** Figures of a list of rows, 4- and 6-cycles summed from the incremental counter (exact). */
export function matrixFigures(cols: number, rows: readonly Uint32Array[], model: LatencyModel, iterations: number): MatrixFigures {
  const st = new MatrixState(cols, model, iterations);
  const cyc = new ShortCycleDelta(cols);
  let c4 = 0;
  let c6 = 0;
  for (const v of rows) {
    const d = cyc.delta(v);
    c4 += d.d4;
    c6 += d.d6;
    cyc.add(v);
    st.add(v);
  }
  return { rows: rows.length, edges: st.edges, maxRowWeight: st.maxRowWeight, maxColDegree: st.maxColDegree, latency: st.latency(), cycles: { '4': c4, '6': c6 } };
}

/** Assemble one side: the base rows plus the redundant rows the strategy picks within the budget. */
export function conditionSide(req: ConditionRequest): ConditionedSide {
  const { h, candidates, budget } = req;
  const baseRows = req.baseRows ? [...req.baseRows] : req.basis === 'minimal' ? minimalBasisRows(h) : Array.from({ length: h.rows }, (_, i) => i);
  const base = baseRows.map((r) => h.data.slice(r * h.stride, (r + 1) * h.stride));
  const state = MatrixState.of(h, baseRows, req.latencyModel, req.iterations);
  const broken = state.violation(budget, 0);
  if (broken) throw new InputError(`side ${req.side}: budget ${broken}`);
  const pool: Pool = { words: candidates.words, weights: candidates.weights };
  let added: number[];
  switch (req.strategy) {
    case 'lightest':
      added = selectLightest(pool, state, budget, req.seed);
      break;
    case 'balanced':
      added = selectBalanced(pool, state, budget, req.seed);
      break;
    case 'fewest-cycles': {
      const cyc = new ShortCycleDelta(h.cols);
      for (const v of base) cyc.add(v);
      added = selectFewestCycles(pool, state, budget, req.seed, cyc);
      break;
    }
    case 'orbits':
      if (!req.symmetry) throw new InputError(`side ${req.side}: the orbits strategy needs a symmetry (a gb/bb family, or --symmetry)`);
      added = selectOrbits(pool, state, budget, req.seed, req.symmetry);
      break;
    case 'trial': {
      if (!req.trial) throw new InputError('the trial strategy needs the decoding engine (internal wiring missing)');
      const fits = (chosen: readonly number[]) => {
        const st = MatrixState.of(h, baseRows, req.latencyModel, req.iterations);
        return st.fits(chosen.map((i) => pool.words[i]!), chosen.map((i) => pool.weights[i]!), 0, budget);
      };
      added = req.trial(base, pool, fits);
      if (!fits(added)) throw new Error('trial selection broke the budget');
      break;
    }
  }
  const rows = [...base, ...added.map((i) => candidates.words[i]!)];
  const matrix = fromRowVectors(h.cols, rows);
  const solver = new RowSpaceSolver(h);
  const comb = solver.combinations(matrix);
  if ('missingRow' in comb) throw new Error(`internal: conditioned row ${comb.missingRow} left the row space`);
  const addedByWeight: Record<string, number> = {};
  for (const i of added) addedByWeight[String(candidates.weights[i])] = (addedByWeight[String(candidates.weights[i])] ?? 0) + 1;
  const originalRows = Array.from({ length: h.rows }, (_, r) => h.data.slice(r * h.stride, (r + 1) * h.stride));
  return {
    side: req.side,
    matrix,
    baseRows,
    added,
    map: comb.map,
    before: matrixFigures(h.cols, originalRows, req.latencyModel, req.iterations),
    after: matrixFigures(h.cols, rows, req.latencyModel, req.iterations),
    addedByWeight,
    rank: solver.rank,
  };
}

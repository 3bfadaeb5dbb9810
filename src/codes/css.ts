import { type BitMatrix, rowSupport } from '../gf2/bitmatrix.js';
import { rank } from '../gf2/elimination.js';
import { packedOverlap } from '../gf2/popcount.js';
import { colWeights, rowWeights } from '../gf2/rowops.js';
import { InputError } from '../errors.js';

/** A CSS code: X-type checks HX and Z-type checks HZ on the same n qubits, with HX·HZᵀ = 0. */
export interface CssCode {
  readonly hx: BitMatrix;
  readonly hz: BitMatrix;
  readonly n: number;
}

/** Where a pair fails to commute: HX row i and HZ row j overlap on an odd number of qubits. */
export interface CommuteFailure {
  readonly xRow: number;
  readonly zRow: number;
  readonly overlap: number[];
}

/** The first (HX row, HZ row) pair with odd overlap, or null when HX·HZᵀ = 0. Precondition: equal column counts. */
export function findAnticommutingPair(hx: BitMatrix, hz: BitMatrix): CommuteFailure | null {
  for (let i = 0; i < hx.rows; i++) {
    for (let j = 0; j < hz.rows; j++) {
      if (packedOverlap(hx.data, i * hx.stride, hz.data, j * hz.stride, hx.stride) & 1) {
        const zs = new Set(rowSupport(hz, j));
        return { xRow: i, zRow: j, overlap: rowSupport(hx, i).filter((c) => zs.has(c)) };
      }
    }
  }
  return null;
}

/** Validate and build a CSS code; throws InputError naming the problem. `label` names the source in messages. */
export function cssCode(hx: BitMatrix, hz: BitMatrix, label = 'code'): CssCode {
  if (hx.cols !== hz.cols) {
    throw new InputError(`${label}: HX has ${hx.cols} columns but HZ has ${hz.cols}; both must act on the same qubits`);
  }
  const bad = findAnticommutingPair(hx, hz);
  if (bad) {
    throw new InputError(
      `${label}: HX row ${bad.xRow} and HZ row ${bad.zRow} overlap on ${bad.overlap.length} qubit(s) [${bad.overlap.join(',')}], an odd number, so HX·HZᵀ ≠ 0`,
    );
  }
  return { hx, hz, n: hx.cols };
}

export interface WeightRange {
  min: number;
  max: number;
}

export interface MatrixSummary {
  rows: number;
  cols: number;
  rank: number;
  rowWeight: WeightRange;
  colWeight: WeightRange;
  edges: number;
}

function range(xs: number[]): WeightRange {
  if (xs.length === 0) return { min: 0, max: 0 };
  let min = Infinity;
  let max = -Infinity;
  for (const x of xs) {
    if (x < min) min = x;
    if (x > max) max = x;
  }
  return { min, max };
}

export function summarizeMatrix(m: BitMatrix): MatrixSummary {
  const rw = rowWeights(m);
  return {
    rows: m.rows,
    cols: m.cols,
    rank: rank(m),
    rowWeight: range(rw),
    colWeight: range(colWeights(m)),
    edges: rw.reduce((a, b) => a + b, 0),
  };
}

export interface CodeSummary {
  n: number;
  k: number;
  commute: boolean;
  hx: MatrixSummary;
  hz: MatrixSummary;
}

/** n, k = n − rank HX − rank HZ, and the matrices' statistics. */
export function summarizeCode(code: CssCode): CodeSummary {
  const hx = summarizeMatrix(code.hx);
  const hz = summarizeMatrix(code.hz);
  return { n: code.n, k: code.n - hx.rank - hz.rank, commute: findAnticommutingPair(code.hx, code.hz) === null, hx, hz };
}

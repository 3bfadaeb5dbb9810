import { type BitMatrix, clone, identity, zeros } from './bitmatrix.js';
import { swapRows, xorInto } from './rowops.js';

/** Result of reducing a matrix to reduced row echelon form. */
export interface Echelon {
  /** The reduced matrix: its first `rank` rows are the nonzero RREF rows, the rest are zero. */
  readonly reduced: BitMatrix;
  /** pivots[i] = the pivot column of reduced row i, increasing. */
  readonly pivots: number[];
  readonly rank: number;
}

/** An echelon form that also records the row operations: reduced = transform · original. */
export interface TrackedEchelon extends Echelon {
  /** rows×rows invertible matrix T with T·H = reduced. */
  readonly transform: BitMatrix;
}

/**
 * Reduced row echelon form by Gauss–Jordan elimination, in place on `m`.
 * When `track` is given (rows×rows), the same row operations are applied to it.
 * Returns the pivot columns. Cost O(rank · rows · stride) word operations.
 */
export function reduceInPlace(m: BitMatrix, track?: BitMatrix): number[] {
  const { rows, cols, stride, data } = m;
  const pivots: number[] = [];
  let r = 0;
  for (let c = 0; c < cols && r < rows; c++) {
    const w = c >>> 5;
    const bit = 1 << (c & 31);
    let p = -1;
    for (let i = r; i < rows; i++) {
      if (data[i * stride + w]! & bit) {
        p = i;
        break;
      }
    }
    if (p < 0) continue;
    swapRows(m, r, p);
    if (track) swapRows(track, r, p);
    const rOff = r * stride;
    for (let i = 0; i < rows; i++) {
      if (i !== r && data[i * stride + w]! & bit) {
        // columns before w are already zero in the pivot row beyond earlier pivots: start the XOR at w
        xorInto(data, i * stride + w, data, rOff + w, stride - w);
        if (track) xorInto(track.data, i * track.stride, track.data, r * track.stride, track.stride);
      }
    }
    pivots.push(c);
    r++;
  }
  return pivots;
}

/** RREF of a copy of m. */
export function echelon(m: BitMatrix): Echelon {
  const reduced = clone(m);
  const pivots = reduceInPlace(reduced);
  return { reduced, pivots, rank: pivots.length };
}

/** RREF of a copy of m with the transform T (T·m = reduced). */
export function trackedEchelon(m: BitMatrix): TrackedEchelon {
  const reduced = clone(m);
  const transform = identity(m.rows);
  const pivots = reduceInPlace(reduced, transform);
  return { reduced, pivots, rank: pivots.length, transform };
}

/** Rank over GF(2) by forward elimination only (no back substitution): about half the work of RREF. */
export function rank(m: BitMatrix): number {
  const a = clone(m);
  const { rows, cols, stride, data } = a;
  let r = 0;
  for (let c = 0; c < cols && r < rows; c++) {
    const w = c >>> 5;
    const bit = 1 << (c & 31);
    let p = -1;
    for (let i = r; i < rows; i++) {
      if (data[i * stride + w]! & bit) {
        p = i;
        break;
      }
    }
    if (p < 0) continue;
    swapRows(a, r, p);
    const rOff = r * stride;
    for (let i = r + 1; i < rows; i++) {
      if (data[i * stride + w]! & bit) xorInto(data, i * stride + w, data, rOff + w, stride - w);
    }
    r++;
  }
  return r;
}

/** The first `rank` rows of the RREF: a basis of the row space in systematic form. */
export function rowBasis(m: BitMatrix): Echelon {
  const e = echelon(m);
  const basis = zeros(e.rank, m.cols);
  basis.data.set(e.reduced.data.subarray(0, e.rank * m.stride));
  return { reduced: basis, pivots: e.pivots, rank: e.rank };
}

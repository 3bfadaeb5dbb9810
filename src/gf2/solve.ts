import { type BitMatrix, zeros } from './bitmatrix.js';
import { trackedEchelon } from './elimination.js';
import { xorInto } from './rowops.js';

/**
 * Writes vectors of rowspace(H) as combinations of the rows of H (x with x·H = v).
 * Preprocessing is one tracked Gauss–Jordan elimination; each query costs O(rank · stride) word operations
 * plus O(popcount(c) · rows/32) to map the combination back to original rows.
 */
export class RowSpaceSolver {
  readonly h: BitMatrix;
  readonly rank: number;
  readonly pivots: readonly number[];
  private readonly reduced: BitMatrix;
  private readonly transform: BitMatrix;

  constructor(h: BitMatrix) {
    this.h = h;
    const e = trackedEchelon(h);
    this.rank = e.rank;
    this.pivots = e.pivots;
    this.reduced = e.reduced;
    this.transform = e.transform;
  }

  /**
   * x (packed over h.rows bits) with x·H = v, or null when v is not in the row space.
   * Precondition: v has wordsFor(h.cols) words. Among all solutions, the one supported on the rows the
   * elimination kept as pivots' sources is returned (any solution differs from it by a left-kernel vector).
   */
  solve(v: Uint32Array): Uint32Array | null {
    const { reduced, transform, pivots } = this;
    const s = reduced.stride;
    const rest = v.slice(0, s);
    const x = new Uint32Array(transform.stride);
    for (let i = 0; i < pivots.length; i++) {
      const p = pivots[i]!;
      if ((rest[p >>> 5]! >>> (p & 31)) & 1) {
        xorInto(rest, 0, reduced.data, i * s, s);
        xorInto(x, 0, transform.data, i * transform.stride, transform.stride);
      }
    }
    for (let i = 0; i < s; i++) if (rest[i] !== 0) return null;
    return x;
  }

  /** Whether v lies in rowspace(H). */
  contains(v: Uint32Array): boolean {
    const { reduced, pivots } = this;
    const s = reduced.stride;
    const rest = v.slice(0, s);
    for (let i = 0; i < pivots.length; i++) {
      const p = pivots[i]!;
      if ((rest[p >>> 5]! >>> (p & 31)) & 1) xorInto(rest, 0, reduced.data, i * s, s);
    }
    for (let i = 0; i < s; i++) if (rest[i] !== 0) return false;
    return true;
  }

  /**
   * For a matrix W whose rows all lie in rowspace(H): the map M (W.rows × H.rows) with M·H = W.
   * Returns the index of the first row not in the row space instead when there is one.
   */
  combinations(w: BitMatrix): { map: BitMatrix } | { missingRow: number } {
    const map = zeros(w.rows, this.h.rows);
    for (let r = 0; r < w.rows; r++) {
      const x = this.solve(w.data.subarray(r * w.stride, (r + 1) * w.stride));
      if (!x) return { missingRow: r };
      map.data.set(x, r * map.stride);
    }
    return { map };
  }
}

/** One-shot: x with x·H = v, or null. */
export function solveLeft(h: BitMatrix, v: Uint32Array): Uint32Array | null {
  return new RowSpaceSolver(h).solve(v);
}

/** One-shot row-space membership. */
export function inRowSpace(h: BitMatrix, v: Uint32Array): boolean {
  return new RowSpaceSolver(h).contains(v);
}

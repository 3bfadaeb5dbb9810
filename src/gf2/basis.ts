import { wordsFor } from './bitmatrix.js';
import { xorInto } from './rowops.js';

/**
 * A basis grown one vector at a time, kept in echelon form: each stored vector has a pivot bit that every
 * later-stored vector has cleared. `reduce` clears all pivots from a copy of v; v is independent of the basis
 * exactly when the result is nonzero.
 */
export class GrowingBasis {
  readonly cols: number;
  readonly stride: number;
  private readonly vectors: Uint32Array[] = [];
  private readonly pivots: number[] = [];

  constructor(cols: number) {
    this.cols = cols;
    this.stride = wordsFor(cols);
  }

  get size(): number {
    return this.vectors.length;
  }

  /** v reduced by the basis (a fresh vector). */
  reduce(v: Uint32Array): Uint32Array {
    const r = v.slice(0, this.stride);
    for (let i = 0; i < this.vectors.length; i++) {
      const p = this.pivots[i]!;
      if ((r[p >>> 5]! >>> (p & 31)) & 1) xorInto(r, 0, this.vectors[i]!, 0, this.stride);
    }
    return r;
  }

  /** Add v if independent; returns whether it was added. */
  insert(v: Uint32Array): boolean {
    const r = this.reduce(v);
    for (let w = 0; w < this.stride; w++) {
      const x = r[w]!;
      if (x !== 0) {
        this.vectors.push(r);
        this.pivots.push((w << 5) + (31 - Math.clz32(x & -x)));
        return true;
      }
    }
    return false;
  }

  contains(v: Uint32Array): boolean {
    const r = this.reduce(v);
    for (let w = 0; w < this.stride; w++) if (r[w] !== 0) return false;
    return true;
  }
}

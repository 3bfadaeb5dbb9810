import { type BitMatrix, zeros } from '../../gf2/bitmatrix.js';
import type { Monomial } from '../polynomial.js';

/**
 * The l·m × l·m matrix of a polynomial in x = S_l ⊗ I_m and y = I_l ⊗ S_m, where S[i][(i+1) mod l] = 1.
 * Index (i, j) ↦ i·m + j; x^a y^b maps row (i, j) to column ((i+a) mod l, (j+b) mod m).
 * With m = 1 this is circ(p): row i has ones at (i + e) mod l for each exponent e.
 */
export function groupAlgebraMatrix(terms: readonly Monomial[], l: number, m: number): BitMatrix {
  const size = l * m;
  const out = zeros(size, size);
  for (let i = 0; i < l; i++) {
    for (let j = 0; j < m; j++) {
      const r = i * m + j;
      for (const t of terms) {
        const c = ((i + t.x) % l) * m + ((j + t.y) % m);
        const idx = r * out.stride + (c >>> 5);
        out.data[idx] = out.data[idx]! ^ (1 << (c & 31));
      }
    }
  }
  return out;
}

/** Shift permutation on a two-block layout [block 0 | block 1], each block indexed (i, j) ↦ i·m + j. */
export function blockShift(l: number, m: number, dx: number, dy: number, blocks: number): Int32Array {
  const size = l * m;
  const perm = new Int32Array(size * blocks);
  for (let b = 0; b < blocks; b++) {
    for (let i = 0; i < l; i++) {
      for (let j = 0; j < m; j++) {
        perm[b * size + i * m + j] = b * size + ((i + dx) % l) * m + ((j + dy) % m);
      }
    }
  }
  return perm;
}

import { type BitMatrix, getBit, zeros } from './bitmatrix.js';
import { echelon } from './elimination.js';

/**
 * A basis of the right kernel {x : H·xᵀ = 0}, one basis vector per row: (cols − rank) × cols.
 * Built from the RREF: for each free column f, x_f = 1 and x_{pivot i} = R[i][f].
 */
export function kernel(h: BitMatrix): BitMatrix {
  const { reduced, pivots, rank } = echelon(h);
  const isPivot = new Uint8Array(h.cols);
  for (const p of pivots) isPivot[p] = 1;
  const free: number[] = [];
  for (let c = 0; c < h.cols; c++) if (!isPivot[c]) free.push(c);
  const k = zeros(free.length, h.cols);
  free.forEach((f, j) => {
    const off = j * k.stride;
    k.data[off + (f >>> 5)] = k.data[off + (f >>> 5)]! | (1 << (f & 31));
    for (let i = 0; i < rank; i++) {
      if (getBit(reduced, i, f)) {
        const p = pivots[i]!;
        k.data[off + (p >>> 5)] = k.data[off + (p >>> 5)]! | (1 << (p & 31));
      }
    }
  });
  return k;
}

import { fromSupports } from '../../gf2/bitmatrix.js';
import { cssCode, type CssCode } from '../css.js';
import { groupAlgebraMatrix, blockShift } from './circulant.js';
import { hypergraphProduct } from './product.js';
import type { ShiftSymmetry } from './types.js';

/**
 * Toric code on an L×L torus, [[2L², 2, L]]: the hypergraph product of the cyclic repetition code's
 * L×L check matrix (rows x^i(1 + x)) with itself.
 */
export function toricCode(L: number): { code: CssCode; symmetry: ShiftSymmetry } {
  const rep = groupAlgebraMatrix([{ x: 0, y: 0 }, { x: 1, y: 0 }], L, 1);
  const code = hypergraphProduct(rep, rep, `toric:L=${L}`);
  // Both qubit blocks are L×L grids (i, j) ↦ i·L + j; shifting i or j maps every check to a check.
  return { code, symmetry: { generators: [blockShift(L, L, 1, 0, 2), blockShift(L, L, 0, 1, 2)], orders: [L, L] } };
}

/**
 * Rotated planar surface code [[d², 1, d]] on a d×d grid of qubits (r, c) ↦ r·d + c.
 * Faces sit at corners (i, j), 0 ≤ i, j ≤ d, touching the in-grid qubits among (i−1..i, j−1..j).
 * Interior faces alternate type by the parity of i + j (even: X). On the top and bottom edges only X-type
 * two-qubit faces are kept, on the left and right edges only Z-type ones; corners carry no face.
 */
export function rotatedSurfaceCode(d: number): CssCode {
  const x: number[][] = [];
  const z: number[][] = [];
  for (let i = 0; i <= d; i++) {
    for (let j = 0; j <= d; j++) {
      const qubits: number[] = [];
      for (const r of [i - 1, i]) for (const c of [j - 1, j]) if (r >= 0 && r < d && c >= 0 && c < d) qubits.push(r * d + c);
      const isX = (i + j) % 2 === 0;
      const interior = i > 0 && i < d && j > 0 && j < d;
      const topBottom = (i === 0 || i === d) && j > 0 && j < d;
      const leftRight = (j === 0 || j === d) && i > 0 && i < d;
      if (interior || (topBottom && isX) || (leftRight && !isX)) (isX ? x : z).push(qubits.sort((a, b) => a - b));
    }
  }
  return cssCode(fromSupports(x.length, d * d, x), fromSupports(z.length, d * d, z), `surface:d=${d}`);
}

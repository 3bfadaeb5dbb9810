import { type BitMatrix, getBit, hstack, identity, zeros } from '../../gf2/bitmatrix.js';
import { transpose } from '../../gf2/transpose.js';
import { cssCode, type CssCode } from '../css.js';

/** Kronecker product over GF(2). */
export function kron(a: BitMatrix, b: BitMatrix): BitMatrix {
  const out = zeros(a.rows * b.rows, a.cols * b.cols);
  for (let i = 0; i < a.rows; i++) {
    for (let j = 0; j < a.cols; j++) {
      if (!getBit(a, i, j)) continue;
      for (let p = 0; p < b.rows; p++) {
        const r = i * b.rows + p;
        for (let q = 0; q < b.cols; q++) {
          if (getBit(b, p, q)) {
            const c = j * b.cols + q;
            out.data[r * out.stride + (c >>> 5)]! |= 1 << (c & 31);
          }
        }
      }
    }
  }
  return out;
}

/**
 * Hypergraph product of classical check matrices H1 (m1×n1) and H2 (m2×n2):
 * HX = [H1 ⊗ I_n2 | I_m1 ⊗ H2ᵀ], HZ = [I_n1 ⊗ H2 | H1ᵀ ⊗ I_m2], on n1·n2 + m1·m2 qubits.
 */
export function hypergraphProduct(h1: BitMatrix, h2: BitMatrix, label = 'hypergraph product'): CssCode {
  const hx = hstack(kron(h1, identity(h2.cols)), kron(identity(h1.rows), transpose(h2)));
  const hz = hstack(kron(identity(h1.cols), h2), kron(transpose(h1), identity(h2.rows)));
  return cssCode(hx, hz, label);
}

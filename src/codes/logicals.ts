import { type BitMatrix, fromRowVectors, zeros } from '../gf2/bitmatrix.js';
import { GrowingBasis } from '../gf2/basis.js';
import { rowBasis, trackedEchelon } from '../gf2/elimination.js';
import { kernel } from '../gf2/kernel.js';
import { multiply, multiplyTransposed } from '../gf2/product.js';
import { transpose } from '../gf2/transpose.js';
import type { CssCode } from './css.js';

/** Logical operator bases: LX (X-type, in ker HZ \ rowspace HX) and LZ, k×n each, with LX·LZᵀ = I. */
export interface LogicalBasis {
  readonly lx: BitMatrix;
  readonly lz: BitMatrix;
  readonly k: number;
}

/** Vectors of ker(a) that extend a basis of rowspace(b) to a basis of ker(a) (a complement of rowspace b in ker a). */
export function kernelComplement(a: BitMatrix, b: BitMatrix): BitMatrix {
  const basis = new GrowingBasis(a.cols);
  const rb = rowBasis(b).reduced;
  for (let r = 0; r < rb.rows; r++) basis.insert(rb.data.subarray(r * rb.stride, (r + 1) * rb.stride));
  const ker = kernel(a);
  const picked: Uint32Array[] = [];
  for (let r = 0; r < ker.rows; r++) {
    const v = ker.data.subarray(r * ker.stride, (r + 1) * ker.stride);
    if (basis.insert(v)) picked.push(v.slice());
  }
  return fromRowVectors(a.cols, picked);
}

/**
 * LX from ker(HZ) modulo rowspace(HX), LZ from ker(HX) modulo rowspace(HZ), then LZ ← (M⁻¹)ᵀ·LZ with
 * M = LX·LZᵀ so that LX·LZᵀ = I. Precondition: code validated (HX·HZᵀ = 0).
 */
export function logicalBasis(code: CssCode): LogicalBasis {
  const lx = kernelComplement(code.hz, code.hx);
  const lz0 = kernelComplement(code.hx, code.hz);
  const k = lx.rows;
  if (lz0.rows !== k) throw new Error(`logical bases disagree: ${k} X-type vs ${lz0.rows} Z-type`);
  if (k === 0) return { lx, lz: zeros(0, code.n), k };
  const m = multiplyTransposed(lx, lz0);
  const inv = trackedEchelon(m);
  if (inv.rank !== k) throw new Error('logical pairing matrix is singular');
  // inv.transform · M = I, so inv.transform = M⁻¹
  const lz = multiply(transpose(inv.transform), lz0);
  return { lx, lz, k };
}

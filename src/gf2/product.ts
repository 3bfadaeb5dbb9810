import { type BitMatrix, zeros } from './bitmatrix.js';
import { packedDot } from './popcount.js';
import { xorInto } from './rowops.js';
import { transpose } from './transpose.js';

/** A·B over GF(2). Precondition: a.cols === b.rows. Row r of the result is the XOR of rows of B picked by row r of A. */
export function multiply(a: BitMatrix, b: BitMatrix): BitMatrix {
  if (a.cols !== b.rows) throw new RangeError(`multiply: ${a.rows}x${a.cols} by ${b.rows}x${b.cols}`);
  const out = zeros(a.rows, b.cols);
  for (let r = 0; r < a.rows; r++) {
    const aOff = r * a.stride;
    for (let w = 0; w < a.stride; w++) {
      let x = a.data[aOff + w]!;
      while (x !== 0) {
        const low = x & -x;
        const k = (w << 5) + (31 - Math.clz32(low));
        xorInto(out.data, r * out.stride, b.data, k * b.stride, b.stride);
        x ^= low;
      }
    }
  }
  return out;
}

/** A·Bᵀ over GF(2) by row inner products. Precondition: a.cols === b.cols. */
export function multiplyTransposed(a: BitMatrix, b: BitMatrix): BitMatrix {
  if (a.cols !== b.cols) throw new RangeError(`multiplyTransposed: ${a.cols} vs ${b.cols} columns`);
  const out = zeros(a.rows, b.rows);
  for (let i = 0; i < a.rows; i++) {
    for (let j = 0; j < b.rows; j++) {
      if (packedDot(a.data, i * a.stride, b.data, j * b.stride, a.stride)) {
        out.data[i * out.stride + (j >>> 5)] = out.data[i * out.stride + (j >>> 5)]! | (1 << (j & 31));
      }
    }
  }
  return out;
}

/** H·vᵀ for a packed vector v (length wordsFor(h.cols)): the syndrome, packed over h.rows bits. */
export function multiplyVector(h: BitMatrix, v: Uint32Array): Uint32Array {
  const out = new Uint32Array((h.rows + 31) >>> 5);
  for (let r = 0; r < h.rows; r++) {
    if (packedDot(h.data, r * h.stride, v, 0, h.stride)) out[r >>> 5] = out[r >>> 5]! | (1 << (r & 31));
  }
  return out;
}

export { transpose };

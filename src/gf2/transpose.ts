import { type BitMatrix, zeros } from './bitmatrix.js';

/** Transpose, visiting only the set bits (fast for sparse matrices, fine for dense ones up to a few thousand). */
export function transpose(m: BitMatrix): BitMatrix {
  const t = zeros(m.cols, m.rows);
  const s = m.stride;
  const ts = t.stride;
  const rWord = (r: number) => r >>> 5;
  for (let r = 0; r < m.rows; r++) {
    const off = r * s;
    const bit = 1 << (r & 31);
    const rw = rWord(r);
    for (let w = 0; w < s; w++) {
      let x = m.data[off + w]!;
      while (x !== 0) {
        const low = x & -x;
        const c = (w << 5) + (31 - Math.clz32(low));
        t.data[c * ts + rw] = t.data[c * ts + rw]! | bit;
        x ^= low;
      }
    }
  }
  return t;
}

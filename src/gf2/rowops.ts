import type { BitMatrix } from './bitmatrix.js';
import { packedWeight } from './popcount.js';

/** dst[dOff..] ^= src[sOff..] over `stride` words. */
export function xorInto(dst: Uint32Array, dOff: number, src: Uint32Array, sOff: number, stride: number): void {
  for (let i = 0; i < stride; i++) dst[dOff + i] = dst[dOff + i]! ^ src[sOff + i]!;
}

/** Row `target` ^= row `source` of the same matrix. */
export function xorRow(m: BitMatrix, target: number, source: number): void {
  xorInto(m.data, target * m.stride, m.data, source * m.stride, m.stride);
}

export function swapRows(m: BitMatrix, a: number, b: number): void {
  if (a === b) return;
  const s = m.stride;
  const d = m.data;
  for (let i = 0; i < s; i++) {
    const t = d[a * s + i]!;
    d[a * s + i] = d[b * s + i]!;
    d[b * s + i] = t;
  }
}

export function rowWeight(m: BitMatrix, r: number): number {
  return packedWeight(m.data, r * m.stride, m.stride);
}

export function rowWeights(m: BitMatrix): number[] {
  const out: number[] = [];
  for (let r = 0; r < m.rows; r++) out.push(rowWeight(m, r));
  return out;
}

export function colWeights(m: BitMatrix): number[] {
  const out = new Array<number>(m.cols).fill(0);
  for (let r = 0; r < m.rows; r++) {
    const off = r * m.stride;
    for (let w = 0; w < m.stride; w++) {
      let x = m.data[off + w]!;
      while (x !== 0) {
        const t = x & -x;
        out[(w << 5) + (31 - Math.clz32(t))]! += 1;
        x ^= t;
      }
    }
  }
  return out;
}

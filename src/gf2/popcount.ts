/** Number of set bits of a 32-bit word (SWAR; no table, no allocation). */
export function popcount32(x: number): number {
  x = x - ((x >>> 1) & 0x55555555);
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  x = (x + (x >>> 4)) & 0x0f0f0f0f;
  return Math.imul(x, 0x01010101) >>> 24;
}

/** Weight of the packed vector data[off .. off+stride-1]. */
export function packedWeight(data: Uint32Array, off: number, stride: number): number {
  let w = 0;
  for (let i = 0; i < stride; i++) w += popcount32(data[off + i]!);
  return w;
}

/** Parity of the AND of two packed vectors (their GF(2) inner product). */
export function packedDot(a: Uint32Array, aOff: number, b: Uint32Array, bOff: number, stride: number): number {
  let x = 0;
  for (let i = 0; i < stride; i++) x ^= a[aOff + i]! & b[bOff + i]!;
  return popcount32(x >>> 0) & 1;
}

/** Weight of the AND of two packed vectors (size of the overlap of their supports). */
export function packedOverlap(a: Uint32Array, aOff: number, b: Uint32Array, bOff: number, stride: number): number {
  let w = 0;
  for (let i = 0; i < stride; i++) w += popcount32(a[aOff + i]! & b[bOff + i]!);
  return w;
}

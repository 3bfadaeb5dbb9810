/**
 * Exhaustive enumeration of a small code by Gray code: all 2^K combinations of the basis rows, each step
 * XORing one row into the running word; up to K = 32 (2^32 words, tens of seconds).
 * The index space is split into numbered chunks of 2^B consecutive Gray-code positions.
 */
import type { AugmentedBasis } from './augmented.js';
import type { WordCollection } from './words.js';

export const EXHAUSTIVE_MAX_DIM = 32;

/** log2 of the positions per chunk for a code of dimension dim. */
export function grayChunkBits(dim: number): number {
  return Math.min(dim, 20);
}

/**
 * Visit the 2^B Gray-code positions of chunk c (global positions c·2^B .. c·2^B + 2^B − 1, B = grayChunkBits)
 * and append to `hits` the local position of every nonzero word of weight ≤ maxWeight that passes the
 * filter. Precondition: dim ≤ EXHAUSTIVE_MAX_DIM, c < 2^(dim − B).
 */
export function scanGrayChunk(b: AugmentedBasis, c: number, maxWeight: number, hits: number[]): void {
  const { dim, rowWords: S, codeWords: C, rows } = b;
  const B = grayChunkBits(dim);
  const acc = new Uint32Array(S);
  grayStart(b, c, acc);
  const filtered = S > C;
  const span = 2 ** B;
  for (let i = 0; i < span; i++) {
    if (i > 0) {
      const r = 31 - Math.clz32(i & -i);
      const o = r * S;
      for (let k = 0; k < S; k++) acc[k] = acc[k]! ^ rows[o + k]!;
    }
    let w = 0;
    for (let k = 0; k < C; k++) {
      let x = acc[k]!;
      x = x - ((x >>> 1) & 0x55555555);
      x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
      w += Math.imul((x + (x >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24;
    }
    if (w === 0 || w > maxWeight) continue;
    if (filtered) {
      let nz = 0;
      for (let k = C; k < S; k++) nz |= acc[k]!;
      if (nz === 0) continue;
    }
    hits.push(i);
  }
}

/** The word at global Gray position c·2^B (+ local position `local`), written to acc (rowWords words). */
export function grayStart(b: AugmentedBasis, c: number, acc: Uint32Array, local = 0): void {
  const { dim, rowWords: S, rows } = b;
  const B = grayChunkBits(dim);
  acc.fill(0);
  // low B bits of gray(c·2^B + local) = gray(local) with bit B−1 flipped when c is odd
  let low = (local ^ (local >>> 1)) >>> 0;
  if (c & 1 && B > 0) low ^= 1 << (B - 1);
  const high = (c ^ (c >>> 1)) >>> 0; // c < 2^20
  for (let r = 0; r < dim; r++) {
    const bit = r < B ? (low >>> r) & 1 : (high >>> (r - B)) & 1;
    if (bit) {
      const o = r * S;
      for (let k = 0; k < S; k++) acc[k] = acc[k]! ^ rows[o + k]!;
    }
  }
}

/** Number of chunks covering all 2^dim positions. */
export function grayChunks(dim: number): number {
  return 2 ** (dim - grayChunkBits(dim));
}

/** Merge a chunk's hits into the collection. */
export function collectGrayHits(b: AugmentedBasis, c: number, hits: ArrayLike<number>, into: WordCollection): void {
  const acc = new Uint32Array(b.rowWords);
  for (let i = 0; i < hits.length; i++) {
    grayStart(b, c, acc, hits[i]!);
    into.add(acc.subarray(0, b.codeWords));
  }
}

export interface GrayChunkPayload {
  readonly basis: AugmentedBasis;
  readonly chunk: number;
  readonly maxWeight: number;
}

/** Worker task body. */
export function grayChunkTask(p: GrayChunkPayload): Int32Array {
  const hits: number[] = [];
  scanGrayChunk(p.basis, p.chunk, p.maxWeight, hits);
  return Int32Array.from(hits);
}

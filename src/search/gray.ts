import { popcount32 } from '../gf2/popcount.js';
import { WordStore } from './store.js';

/**
 * Exhaustive enumeration of a row space in Gray-code order: consecutive combinations of the k basis rows
 * differ in one row, so each step is one row XOR and one popcount. The 2^k combinations are cut into
 * 2^(k − lowBits) chunks by fixing the top k − lowBits coefficients (chunk index in binary); chunk c
 * enumerates all 2^lowBits settings of the low coefficients. Every nonzero word of weight ≤ maxWeight is
 * returned exactly once over all chunks.
 */
export interface GrayChunkTask {
  readonly rows: number;
  readonly cols: number;
  readonly basis: Uint32Array;
  readonly maxWeight: number;
  readonly lowBits: number;
  readonly chunk: number;
  readonly maxWords: number;
  readonly filter?: { readonly rows: number; readonly data: Uint32Array };
}

export interface GrayChunkResult {
  readonly words: Uint32Array;
  readonly count: number;
  /** Combinations visited. */
  readonly visited: number;
  readonly overflow: boolean;
}

/** Choose lowBits so that a chunk is a few million steps and the chunk count does not depend on workers. */
export function grayLowBits(rank: number): number {
  return Math.min(rank, 22);
}

export function grayChunkCount(rank: number): number {
  return 2 ** (rank - grayLowBits(rank));
}

export function grayChunk(t: GrayChunkTask): GrayChunkResult {
  const { rows: k, basis, maxWeight: W, lowBits } = t;
  const s = (t.cols + 31) >>> 5;
  const v = new Uint32Array(s);
  for (let b = lowBits; b < k; b++) {
    if ((Math.floor(t.chunk / 2 ** (b - lowBits)) & 1) === 1) for (let x = 0; x < s; x++) v[x] = v[x]! ^ basis[b * s + x]!;
  }
  const found = new WordStore(t.cols, 256);
  let overflow = false;
  const filter = t.filter;
  const consider = () => {
    if (filter) {
      let odd = false;
      for (let r = 0; r < filter.rows && !odd; r++) {
        let x = 0;
        for (let i = 0; i < s; i++) x ^= filter.data[r * s + i]! & v[i]!;
        odd = (popcount32(x >>> 0) & 1) === 1;
      }
      if (!odd) return;
    }
    if (found.size >= t.maxWords) {
      overflow = true;
      return;
    }
    found.add(v);
  };
  const total = 2 ** lowBits;
  let wt = 0;
  for (let x = 0; x < s; x++) wt += popcount32(v[x]!);
  if (wt > 0 && wt <= W) consider();
  let i = 1;
  for (; i < total && !overflow; i++) {
    // index of the lowest set bit of i: the coefficient that flips
    const bit = 31 - Math.clz32(i & -i);
    const o = bit * s;
    wt = 0;
    for (let x = 0; x < s; x++) {
      const y = v[x]! ^ basis[o + x]!;
      v[x] = y;
      wt += popcount32(y);
    }
    if (wt <= W && wt > 0) consider();
  }
  return { words: found.packed(), count: found.size, visited: overflow ? i : total, overflow };
}

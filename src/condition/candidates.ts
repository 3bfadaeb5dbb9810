import type { BitMatrix } from '../gf2/bitmatrix.js';
import { packSupport } from '../gf2/bitmatrix.js';
import { packedWeight } from '../gf2/popcount.js';
import { RowSpaceSolver } from '../gf2/solve.js';
import { InputError } from '../errors.js';
import { WordStore } from '../search/store.js';

/** Candidate redundant rows after verification: distinct, nonzero, in the row space, not rows of H. */
export interface Candidates {
  readonly words: Uint32Array[];
  readonly weights: number[];
  /** How many given words were dropped, and why. */
  readonly dropped: { duplicate: number; originalRow: number; zero: number };
}

/**
 * Verify candidate supports against rowspace(h): every word must lie in it (InputError naming the first
 * that does not); duplicates and copies of original rows are dropped and counted.
 */
export function verifyCandidates(h: BitMatrix, supports: readonly (readonly number[])[], source: string): Candidates {
  const solver = new RowSpaceSolver(h);
  const seen = new WordStore(h.cols, Math.max(16, supports.length + h.rows));
  for (let r = 0; r < h.rows; r++) seen.add(h.data.subarray(r * h.stride, (r + 1) * h.stride));
  const words: Uint32Array[] = [];
  const weights: number[] = [];
  const dropped = { duplicate: 0, originalRow: 0, zero: 0 };
  supports.forEach((sup, i) => {
    for (const c of sup) {
      if (!Number.isInteger(c) || c < 0 || c >= h.cols) throw new InputError(`${source}: word ${i + 1} has column ${c} outside 0..${h.cols - 1}`);
    }
    const v = packSupport(h.cols, sup);
    const w = packedWeight(v, 0, h.stride);
    if (w === 0) {
      dropped.zero++;
      return;
    }
    if (!solver.contains(v)) throw new InputError(`${source}: word ${i + 1} (support ${sup.slice(0, 12).join(',')}${sup.length > 12 ? ',…' : ''}) is not in the row space of the matrix`);
    const idx = seen.indexOf(v);
    if (idx >= 0) {
      if (idx < h.rows) dropped.originalRow++;
      else dropped.duplicate++;
      return;
    }
    seen.add(v);
    words.push(v);
    weights.push(w);
  });
  return { words, weights, dropped };
}

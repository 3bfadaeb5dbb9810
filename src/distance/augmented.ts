import { type BitMatrix, wordsFor } from '../gf2/bitmatrix.js';
import { rowBasis } from '../gf2/elimination.js';
import { packedDot } from '../gf2/popcount.js';

/**
 * A basis of a binary code carried together with its filter syndromes, the form both the information-set
 * search and the Brouwer–Zimmermann enumeration work on.
 *
 * Row i occupies rows[i*rowWords .. (i+1)*rowWords−1]: first `codeWords` words hold the codeword (n bits,
 * original column order, tail bits zero), then wordsFor(filterRows) words hold the bits (row · filter_jᵀ)
 * for j < filterRows. Both parts are linear in the row, so row operations keep them consistent: the
 * syndrome part of any combination of rows is the syndrome of the combined word. With a filter, a word
 * "passes" when its syndrome part is nonzero (for a CSS code with filter LZ: the word is a nontrivial
 * X-type logical operator). Plain, structured-clonable data: it travels to worker threads as is.
 */
export interface AugmentedBasis {
  readonly n: number;
  readonly dim: number;
  readonly filterRows: number;
  readonly codeWords: number;
  readonly rowWords: number;
  readonly rows: Uint32Array;
}

/**
 * Basis of rowspace(generator) (dependent rows dropped) with syndromes against `filter` (rows of length n).
 * Precondition: filter.cols === generator.cols when given.
 */
export function augmentedBasis(generator: BitMatrix, filter?: BitMatrix): AugmentedBasis {
  const n = generator.cols;
  if (filter && filter.cols !== n) throw new RangeError(`filter has ${filter.cols} columns, code has ${n}`);
  const basis = rowBasis(generator).reduced;
  const f = filter ? filter.rows : 0;
  const codeWords = wordsFor(n);
  const rowWords = codeWords + wordsFor(f);
  const dim = basis.rows;
  const rows = new Uint32Array(dim * rowWords);
  for (let i = 0; i < dim; i++) {
    rows.set(basis.data.subarray(i * basis.stride, (i + 1) * basis.stride), i * rowWords);
    for (let j = 0; j < f; j++) {
      if (packedDot(basis.data, i * basis.stride, filter!.data, j * filter!.stride, codeWords)) {
        const o = i * rowWords + codeWords + (j >>> 5);
        rows[o] = rows[o]! | (1 << (j & 31));
      }
    }
  }
  return { n, dim, filterRows: f, codeWords, rowWords, rows };
}

/** Whether the syndrome part of the packed augmented row at data[off..] is nonzero (always true without a filter). */
export function passesFilter(b: AugmentedBasis, data: Uint32Array, off: number): boolean {
  if (b.filterRows === 0) return true;
  for (let k = b.codeWords; k < b.rowWords; k++) if (data[off + k] !== 0) return true;
  return false;
}

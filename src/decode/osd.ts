import { type BitMatrix, wordsFor } from '../gf2/bitmatrix.js';
import { GrowingBasis } from '../gf2/basis.js';

/**
 * Ordered statistics decoding of a syndrome, as post-processing of BP soft output (Fossorier & Lin, "Soft-
 * decision decoding of linear block codes based on ordered statistics", IEEE Trans. Inf. Theory 41(5),
 * 1995; for quantum LDPC codes, Panteleev & Kalachev, "Degenerate quantum LDPC codes with good finite length
 * performance", Quantum 5, 585, 2021).
 *
 * Columns are sorted by the posterior LLR, most likely flipped first. Gauss–Jordan elimination in that order
 * picks the first independent columns as the information set S. Order 0: the unique e with H·e = s
 * supported on S. Combination sweep of order λ: also every e whose part outside S is one column of the rest
 * T, or two columns among the first λ of T, the part on S then fixed by the syndrome; the candidate of least
 * soft weight Σ_{e_j=1} LLR_j wins (that is, the most likely under the posteriors taken as independent).
 *
 * The elimination runs on a row basis of H picked once (rows of H with the same row space give the same
 * solutions, columns dependencies and reduced form), so redundant rows cost nothing here.
 */
export class OsdDecoder {
  readonly n: number;
  readonly rank: number;
  /** Combination-sweep order λ; 0 means order-0 only; −1 means order 0 without the single-column sweep. */
  readonly order: number;
  private readonly basisRows: Int32Array;
  private readonly rowStart: Int32Array;
  private readonly rowVar: Int32Array;
  private readonly stride: number;
  private readonly mat: Uint32Array;
  private readonly syn: Uint8Array;
  private readonly sorted: Int32Array;
  private readonly tmp: Int32Array;
  private readonly position: Int32Array;
  private readonly pivotCol: Int32Array;
  private readonly isPivot: Uint8Array;
  private readonly rest: Int32Array;
  private readonly gain: Float64Array;

  /**
   * `sweep`: false for order 0 (the plain OSD-0 solution), true for the combination sweep with `order` = λ
   * (λ = 0 keeps the single-column candidates only).
   */
  constructor(h: BitMatrix, sweep: boolean, order = 0) {
    const n = h.cols;
    this.n = n;
    this.order = sweep ? order : -1;
    const basis = new GrowingBasis(n);
    const rows: number[] = [];
    for (let r = 0; r < h.rows; r++) if (basis.insert(h.data.subarray(r * h.stride, (r + 1) * h.stride))) rows.push(r);
    this.rank = rows.length;
    this.basisRows = Int32Array.from(rows);
    const start: number[] = [0];
    const vars: number[] = [];
    for (const r of rows) {
      for (let c = 0; c < n; c++) if ((h.data[r * h.stride + (c >>> 5)]! >>> (c & 31)) & 1) vars.push(c);
      start.push(vars.length);
    }
    this.rowStart = Int32Array.from(start);
    this.rowVar = Int32Array.from(vars);
    this.stride = wordsFor(n);
    this.mat = new Uint32Array(this.rank * this.stride);
    this.syn = new Uint8Array(this.rank);
    this.sorted = new Int32Array(n);
    this.tmp = new Int32Array(n);
    this.position = new Int32Array(n);
    this.pivotCol = new Int32Array(this.rank);
    this.isPivot = new Uint8Array(n);
    this.rest = new Int32Array(n);
    this.gain = new Float64Array(this.rank);
  }

  /**
   * Solve H·out = syndrome (syndrome: one byte per row of H; out: one byte per column) guided by the
   * posterior LLRs `llr` (low = likely flipped). Allocation-free.
   */
  decode(syndrome: Uint8Array, llr: Float64Array, out: Uint8Array): void {
    const { n, rank, stride, mat, syn, sorted, position, pivotCol, isPivot, rest, gain } = this;
    for (let j = 0; j < n; j++) sorted[j] = j;
    sortByKey(sorted, this.tmp, llr, n);
    for (let k = 0; k < n; k++) position[sorted[k]!] = k;
    mat.fill(0);
    for (let r = 0; r < rank; r++) {
      const off = r * stride;
      for (let e = this.rowStart[r]!; e < this.rowStart[r + 1]!; e++) {
        const k = position[this.rowVar[e]!]!;
        mat[off + (k >>> 5)] = mat[off + (k >>> 5)]! | (1 << (k & 31));
      }
      syn[r] = syndrome[this.basisRows[r]!]!;
    }
    // Gauss–Jordan in column order; every basis row becomes a pivot row
    isPivot.fill(0);
    let r = 0;
    for (let k = 0; k < n && r < rank; k++) {
      const w = k >>> 5;
      const bit = 1 << (k & 31);
      let p = -1;
      for (let i = r; i < rank; i++) {
        if (mat[i * stride + w]! & bit) {
          p = i;
          break;
        }
      }
      if (p < 0) continue;
      if (p !== r) {
        for (let q = w; q < stride; q++) {
          const t = mat[p * stride + q]!;
          mat[p * stride + q] = mat[r * stride + q]!;
          mat[r * stride + q] = t;
        }
        const t = syn[p]!;
        syn[p] = syn[r]!;
        syn[r] = t;
      }
      const rOff = r * stride;
      for (let i = 0; i < rank; i++) {
        if (i !== r && mat[i * stride + w]! & bit) {
          for (let q = w; q < stride; q++) mat[i * stride + q] = mat[i * stride + q]! ^ mat[rOff + q]!;
          syn[i] = syn[i]! ^ syn[r]!;
        }
      }
      pivotCol[r] = k;
      isPivot[k] = 1;
      r++;
    }
    out.fill(0);
    let best1 = -1;
    let best2 = -1;
    if (this.order >= 0) {
      // gain[r]: change of soft weight when pivot bit r flips
      for (let i = 0; i < rank; i++) {
        const l = llr[sorted[pivotCol[i]!]!]!;
        gain[i] = syn[i] ? -l : l;
      }
      let m = 0;
      for (let k = 0; k < n; k++) if (!isPivot[k]) rest[m++] = k;
      let bestDelta = 0;
      for (let a = 0; a < m; a++) {
        const t = rest[a]!;
        const tw = t >>> 5;
        const ts = t & 31;
        let delta = llr[sorted[t]!]!;
        for (let i = 0; i < rank; i++) if ((mat[i * stride + tw]! >>> ts) & 1) delta += gain[i]!;
        if (delta < bestDelta) {
          bestDelta = delta;
          best1 = t;
          best2 = -1;
        }
      }
      const lim = Math.min(this.order, m);
      for (let a = 0; a < lim; a++) {
        const t = rest[a]!;
        const tw = t >>> 5;
        const ts = t & 31;
        for (let b = a + 1; b < lim; b++) {
          const u = rest[b]!;
          const uw = u >>> 5;
          const us = u & 31;
          let delta = llr[sorted[t]!]! + llr[sorted[u]!]!;
          for (let i = 0; i < rank; i++) {
            if ((((mat[i * stride + tw]! >>> ts) ^ (mat[i * stride + uw]! >>> us)) & 1) !== 0) delta += gain[i]!;
          }
          if (delta < bestDelta) {
            bestDelta = delta;
            best1 = t;
            best2 = u;
          }
        }
      }
    }
    for (let i = 0; i < rank; i++) {
      let bit = syn[i]!;
      if (best1 >= 0) bit ^= (mat[i * stride + (best1 >>> 5)]! >>> (best1 & 31)) & 1;
      if (best2 >= 0) bit ^= (mat[i * stride + (best2 >>> 5)]! >>> (best2 & 31)) & 1;
      if (bit) out[sorted[pivotCol[i]!]!] = 1;
    }
    if (best1 >= 0) out[sorted[best1]!] = 1;
    if (best2 >= 0) out[sorted[best2]!] = 1;
  }
}

/**
 * Stable bottom-up merge sort of idx[0..len-1] by key[idx[i]] ascending; tmp is scratch of the same length.
 * NaN keys sort last. Allocation-free.
 */
export function sortByKey(idx: Int32Array, tmp: Int32Array, key: Float64Array, len: number): void {
  let src = idx;
  let dst = tmp;
  for (let width = 1; width < len; width *= 2) {
    for (let lo = 0; lo < len; lo += 2 * width) {
      const mid = Math.min(lo + width, len);
      const hi = Math.min(lo + 2 * width, len);
      let i = lo;
      let j = mid;
      let k = lo;
      while (i < mid && j < hi) {
        const a = src[i]!;
        const b = src[j]!;
        // take from the right only when strictly smaller (stability); NaN compares false
        if (key[b]! < key[a]! || (key[a] !== key[a] && key[b] === key[b])) {
          dst[k++] = b;
          j++;
        } else {
          dst[k++] = a;
          i++;
        }
      }
      while (i < mid) dst[k++] = src[i++]!;
      while (j < hi) dst[k++] = src[j++]!;
    }
    const t = src;
    src = dst;
    dst = t;
  }
  if (src !== idx) idx.set(src.subarray(0, len));
}

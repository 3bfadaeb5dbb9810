/**
 * The packed binary matrix used everywhere in the engine.
 *
 * Row r occupies words data[r*stride .. r*stride+stride-1]; column c of a row is bit (c & 31) of word
 * (c >>> 5). Bits at columns >= cols (the tail of the last word) are always zero: every function that
 * writes a row keeps that invariant, and `tailMask` is the mask of the valid bits of the last word.
 */
export interface BitMatrix {
  readonly rows: number;
  readonly cols: number;
  /** 32-bit words per row: ceil(cols / 32). */
  readonly stride: number;
  /** Mask of the valid bits in the last word of a row (all ones when cols is a multiple of 32). */
  readonly tailMask: number;
  readonly data: Uint32Array;
}

export function wordsFor(cols: number): number {
  return (cols + 31) >>> 5;
}

export function tailMaskFor(cols: number): number {
  const r = cols & 31;
  return r === 0 ? 0xffffffff >>> 0 : ((1 << r) - 1) >>> 0;
}

/** A rows×cols zero matrix. Precondition: rows, cols are non-negative integers. */
export function zeros(rows: number, cols: number): BitMatrix {
  const stride = wordsFor(cols);
  return { rows, cols, stride, tailMask: tailMaskFor(cols), data: new Uint32Array(rows * stride) };
}

/** Wrap existing packed data (length rows*stride, tail bits zero). */
export function fromPacked(rows: number, cols: number, data: Uint32Array): BitMatrix {
  const stride = wordsFor(cols);
  if (data.length !== rows * stride) throw new RangeError(`packed data has ${data.length} words, expected ${rows * stride}`);
  return { rows, cols, stride, tailMask: tailMaskFor(cols), data };
}

export function identity(n: number): BitMatrix {
  const m = zeros(n, n);
  for (let i = 0; i < n; i++) setBit(m, i, i, 1);
  return m;
}

export function getBit(m: BitMatrix, r: number, c: number): number {
  return (m.data[r * m.stride + (c >>> 5)]! >>> (c & 31)) & 1;
}

export function setBit(m: BitMatrix, r: number, c: number, v: number): void {
  const i = r * m.stride + (c >>> 5);
  const bit = 1 << (c & 31);
  if (v & 1) m.data[i] = m.data[i]! | bit;
  else m.data[i] = m.data[i]! & ~bit;
}

export function flipBit(m: BitMatrix, r: number, c: number): void {
  const i = r * m.stride + (c >>> 5);
  m.data[i] = m.data[i]! ^ (1 << (c & 31));
}

export function clone(m: BitMatrix): BitMatrix {
  return { ...m, data: m.data.slice() };
}

/** Build from a dense 0/1 array (rows of equal length `cols`; when rows is empty, cols must be given). */
export function fromDense(dense: readonly (readonly number[])[], cols?: number): BitMatrix {
  const c = cols ?? dense[0]?.length ?? 0;
  const m = zeros(dense.length, c);
  dense.forEach((row, r) => {
    if (row.length !== c) throw new RangeError(`row ${r} has ${row.length} entries, expected ${c}`);
    row.forEach((v, j) => {
      if (v & 1) setBit(m, r, j, 1);
    });
  });
  return m;
}

export function toDense(m: BitMatrix): number[][] {
  const out: number[][] = [];
  for (let r = 0; r < m.rows; r++) {
    const row = new Array<number>(m.cols);
    for (let c = 0; c < m.cols; c++) row[c] = getBit(m, r, c);
    out.push(row);
  }
  return out;
}

/** Build from sorted or unsorted supports (0-based column lists); repeated indices cancel (GF(2)). */
export function fromSupports(rows: number, cols: number, supports: readonly (readonly number[])[]): BitMatrix {
  const m = zeros(rows, cols);
  supports.forEach((s, r) => {
    for (const c of s) flipBit(m, r, c);
  });
  return m;
}

/** Support (sorted column indices) of row r. */
export function rowSupport(m: BitMatrix, r: number): number[] {
  return packedSupport(m.data, r * m.stride, m.stride);
}

/** Support of the packed word at data[off .. off+stride-1]. */
export function packedSupport(data: Uint32Array, off: number, stride: number): number[] {
  const out: number[] = [];
  for (let w = 0; w < stride; w++) {
    let x = data[off + w]!;
    while (x !== 0) {
      const t = x & -x;
      out.push((w << 5) + (31 - Math.clz32(t)));
      x ^= t;
    }
  }
  return out;
}

export function supports(m: BitMatrix): number[][] {
  const out: number[][] = [];
  for (let r = 0; r < m.rows; r++) out.push(rowSupport(m, r));
  return out;
}

/** A copy of row r as its own packed vector. */
export function rowVector(m: BitMatrix, r: number): Uint32Array {
  return m.data.slice(r * m.stride, (r + 1) * m.stride);
}

/** Pack a support into a fresh vector of `wordsFor(cols)` words. */
export function packSupport(cols: number, support: readonly number[]): Uint32Array {
  const v = new Uint32Array(wordsFor(cols));
  for (const c of support) v[c >>> 5] = v[c >>> 5]! ^ (1 << (c & 31));
  return v;
}

/** Matrix whose rows are the given packed vectors (each of wordsFor(cols) words). */
export function fromRowVectors(cols: number, vectors: readonly Uint32Array[]): BitMatrix {
  const m = zeros(vectors.length, cols);
  vectors.forEach((v, r) => m.data.set(v.subarray(0, m.stride), r * m.stride));
  return m;
}

export function selectRows(m: BitMatrix, rows: readonly number[]): BitMatrix {
  const out = zeros(rows.length, m.cols);
  rows.forEach((r, i) => out.data.set(m.data.subarray(r * m.stride, (r + 1) * m.stride), i * m.stride));
  return out;
}

/** Rows of `a` followed by rows of `b`. Precondition: equal column counts. */
export function vstack(a: BitMatrix, b: BitMatrix): BitMatrix {
  if (a.cols !== b.cols) throw new RangeError(`vstack: ${a.cols} vs ${b.cols} columns`);
  const out = zeros(a.rows + b.rows, a.cols);
  out.data.set(a.data, 0);
  out.data.set(b.data, a.data.length);
  return out;
}

/** [a | b]. Precondition: equal row counts. */
export function hstack(a: BitMatrix, b: BitMatrix): BitMatrix {
  if (a.rows !== b.rows) throw new RangeError(`hstack: ${a.rows} vs ${b.rows} rows`);
  const out = zeros(a.rows, a.cols + b.cols);
  for (let r = 0; r < a.rows; r++) {
    for (let c = 0; c < a.cols; c++) if (getBit(a, r, c)) setBit(out, r, c, 1);
    for (let c = 0; c < b.cols; c++) if (getBit(b, r, c)) setBit(out, r, a.cols + c, 1);
  }
  return out;
}

export function equals(a: BitMatrix, b: BitMatrix): boolean {
  if (a.rows !== b.rows || a.cols !== b.cols) return false;
  for (let i = 0; i < a.data.length; i++) if (a.data[i] !== b.data[i]) return false;
  return true;
}

export function isZero(m: BitMatrix): boolean {
  for (let i = 0; i < m.data.length; i++) if (m.data[i] !== 0) return false;
  return true;
}

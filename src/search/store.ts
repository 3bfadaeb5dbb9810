import { popcount32 } from '../gf2/popcount.js';

/**
 * A deduplicating set of packed words of one length: words live back to back in a growing Uint32Array
 * arena, an open-addressing table of word indices finds them by content. Memory is proportional to the
 * words kept (stride words each, plus about 8 bytes of table per word).
 */
export class WordStore {
  readonly stride: number;
  private arena: Uint32Array;
  private table: Int32Array;
  private mask: number;
  private n = 0;
  private readonly weights: number[] = [];
  private readonly flags: number[] = [];

  constructor(cols: number, capacity = 1024) {
    this.stride = (cols + 31) >>> 5;
    this.arena = new Uint32Array(Math.max(1, capacity * this.stride));
    let size = 16;
    while (size < capacity * 2) size <<= 1;
    this.table = new Int32Array(size).fill(-1);
    this.mask = size - 1;
  }

  get size(): number {
    return this.n;
  }

  /** Approximate bytes held. */
  get bytes(): number {
    return this.arena.byteLength + this.table.byteLength + this.n * 16;
  }

  private hash(data: Uint32Array, off: number): number {
    let h = 0x811c9dc5 | 0;
    for (let i = 0; i < this.stride; i++) {
      h = Math.imul(h ^ data[off + i]!, 0x01000193);
      h ^= h >>> 15;
    }
    return h >>> 0;
  }

  private same(idx: number, data: Uint32Array, off: number): boolean {
    const base = idx * this.stride;
    for (let i = 0; i < this.stride; i++) if (this.arena[base + i] !== data[off + i]) return false;
    return true;
  }

  /** Index of the word at data[off..], or −1. */
  indexOf(data: Uint32Array, off = 0): number {
    let slot = this.hash(data, off) & this.mask;
    for (;;) {
      const idx = this.table[slot]!;
      if (idx < 0) return -1;
      if (this.same(idx, data, off)) return idx;
      slot = (slot + 1) & this.mask;
    }
  }

  has(data: Uint32Array, off = 0): boolean {
    return this.indexOf(data, off) >= 0;
  }

  /** Add the word at data[off..]; returns its index if new, −1 if already present. */
  add(data: Uint32Array, off = 0, flag = 0): number {
    let slot = this.hash(data, off) & this.mask;
    for (;;) {
      const idx = this.table[slot]!;
      if (idx < 0) break;
      if (this.same(idx, data, off)) {
        this.flags[idx]! |= flag;
        return -1;
      }
      slot = (slot + 1) & this.mask;
    }
    if ((this.n + 1) * this.stride > this.arena.length) {
      const bigger = new Uint32Array(this.arena.length * 2);
      bigger.set(this.arena);
      this.arena = bigger;
    }
    const idx = this.n++;
    let w = 0;
    for (let i = 0; i < this.stride; i++) {
      const x = data[off + i]!;
      this.arena[idx * this.stride + i] = x;
      w += popcount32(x);
    }
    this.weights.push(w);
    this.flags.push(flag);
    this.table[slot] = idx;
    if (this.n * 2 > this.table.length) this.rehash();
    return idx;
  }

  private rehash(): void {
    const size = this.table.length * 2;
    this.table = new Int32Array(size).fill(-1);
    this.mask = size - 1;
    for (let idx = 0; idx < this.n; idx++) {
      let slot = this.hash(this.arena, idx * this.stride) & this.mask;
      while (this.table[slot]! >= 0) slot = (slot + 1) & this.mask;
      this.table[slot] = idx;
    }
  }

  /** The packed word with index idx (a view into the arena; copy before the store grows). */
  word(idx: number): Uint32Array {
    return this.arena.subarray(idx * this.stride, (idx + 1) * this.stride);
  }

  weight(idx: number): number {
    return this.weights[idx]!;
  }

  flag(idx: number): number {
    return this.flags[idx]!;
  }

  /** All words packed back to back, in insertion order. */
  packed(): Uint32Array {
    return this.arena.slice(0, this.n * this.stride);
  }
}

/** Flag bit: the word is a row of the original matrix. */
export const ORIGINAL_ROW = 1;

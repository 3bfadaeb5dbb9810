import { packedSupport } from '../gf2/bitmatrix.js';
import { packedWeight } from '../gf2/popcount.js';

/** A kept word: packed n-bit vector and its weight. */
export interface WeightedWord {
  readonly word: Uint32Array;
  readonly weight: number;
}

/**
 * Distinct words of weight ≤ a limit, keyed by their packed content. With `adaptive`, the limit follows
 * the lightest word added (a distance run keeps only the current minimum-weight logical operators);
 * otherwise it stays fixed (an up-to-W enumeration keeps everything up to W).
 * Memory is proportional to the words kept; callers add only the rare light words, never in hot loops.
 */
export class WordCollection {
  private readonly byKey = new Map<string, WeightedWord>();
  private limitWeight: number;
  private dropped = false;

  /** `capacity`: most words kept; further words within the limit are dropped and `truncated` is set. */
  constructor(readonly codeWords: number, limit: number, readonly adaptive: boolean, readonly capacity = Infinity) {
    this.limitWeight = limit;
  }

  /** Whether a word within the limit had to be dropped for capacity (counts are then lower bounds). */
  get truncated(): boolean {
    return this.dropped;
  }

  /** The current weight limit W: words heavier than W are not kept. */
  get limit(): number {
    return this.limitWeight;
  }

  get size(): number {
    return this.byKey.size;
  }

  /** Weight of the lightest word kept, or Infinity. */
  lightest(): number {
    let m = Infinity;
    for (const v of this.byKey.values()) if (v.weight < m) m = v.weight;
    return m;
  }

  /** Add a packed word (copied); returns whether it was new and within the limit. */
  add(word: Uint32Array, weight = packedWeight(word, 0, this.codeWords)): boolean {
    if (weight > this.limitWeight) return false;
    const key = keyOf(word, this.codeWords);
    if (this.byKey.has(key)) return false;
    if (this.byKey.size >= this.capacity && !(this.adaptive && weight < this.limitWeight)) {
      this.dropped = true;
      return false;
    }
    this.byKey.set(key, { word: word.slice(0, this.codeWords), weight });
    if (this.adaptive && weight < this.limitWeight) this.lower(weight);
    return true;
  }

  /** Lower the limit to w, dropping heavier words. */
  lower(w: number): void {
    if (w >= this.limitWeight) return;
    this.limitWeight = w;
    for (const [k, v] of this.byKey) if (v.weight > w) this.byKey.delete(k);
    this.dropped = false; // whatever was dropped was heavier than the new limit
  }

  /** Number of kept words of weight exactly w. */
  countOfWeight(w: number): number {
    let c = 0;
    for (const v of this.byKey.values()) if (v.weight === w) c++;
    return c;
  }

  /** Kept words, sorted by weight, then by support lexicographically (a deterministic order). */
  sorted(): WeightedWord[] {
    const all = [...this.byKey.values()].map((v) => ({ ...v, support: packedSupport(v.word, 0, this.codeWords) }));
    all.sort((a, b) => a.weight - b.weight || compareSupports(a.support, b.support));
    return all.map(({ word, weight }) => ({ word, weight }));
  }
}

export function keyOf(word: Uint32Array, words: number): string {
  let s = '';
  for (let i = 0; i < words; i++) s += (word[i]! >>> 0).toString(36) + ',';
  return s;
}

export function compareSupports(a: readonly number[], b: readonly number[]): number {
  const m = Math.min(a.length, b.length);
  for (let i = 0; i < m; i++) if (a[i] !== b[i]) return a[i]! - b[i]!;
  return a.length - b.length;
}

/**
 * Approximate memory one kept word takes in a WordCollection of length-n words (the packed copy, its key
 * string and the map entry), for turning a memory limit into a word cap. An estimate, on the high side.
 */
export function collectionWordBytes(n: number): number {
  const stride = (n + 31) >>> 5;
  return 200 + 4 * stride + 16 * stride;
}

/** The word cap a memory limit allows, never above `maxWords`. */
export function wordCapFor(n: number, maxWords: number, maxMemory: number): number {
  return Math.max(1, Math.min(maxWords, Math.floor(maxMemory / collectionWordBytes(n))));
}

import seedrandom from 'seedrandom';

/**
 * Random streams. The user's seed (a string or integer) and a stream index derive, through seedrandom,
 * the 128-bit state of a xoshiro128** generator used inside hot loops. Stream i of seed S is the same
 * whatever the worker count, which is what makes parallel runs reproducible.
 */
export class Xoshiro128 {
  private a: number;
  private b: number;
  private c: number;
  private d: number;

  constructor(a: number, b: number, c: number, d: number) {
    this.a = a | 0;
    this.b = b | 0;
    this.c = c | 0;
    this.d = d | 0;
    if ((this.a | this.b | this.c | this.d) === 0) this.d = 1;
  }

  /** Next 32-bit unsigned integer. */
  nextU32(): number {
    const r = Math.imul(rotl(Math.imul(this.b, 5), 7), 9);
    const t = this.b << 9;
    this.c ^= this.a;
    this.d ^= this.b;
    this.b ^= this.c;
    this.a ^= this.d;
    this.c ^= t;
    this.d = rotl(this.d, 11);
    return r >>> 0;
  }

  /** Uniform double in [0, 1) with 32 bits of randomness. */
  next(): number {
    return this.nextU32() / 4294967296;
  }

  /** Uniform double in [0, 1) with 53 bits. */
  nextDouble(): number {
    const hi = this.nextU32() >>> 5;
    const lo = this.nextU32() >>> 6;
    return (hi * 67108864 + lo) / 9007199254740992;
  }

  /** Uniform integer in [0, n), unbiased (rejection), for n ≤ 2^32. */
  below(n: number): number {
    if (n <= 1) return 0;
    const limit = 4294967296 - (4294967296 % n);
    for (;;) {
      const x = this.nextU32();
      if (x < limit) return x % n;
    }
  }

  /** State, to checkpoint a stream. */
  state(): [number, number, number, number] {
    return [this.a >>> 0, this.b >>> 0, this.c >>> 0, this.d >>> 0];
  }
}

function rotl(x: number, k: number): number {
  return (x << k) | (x >>> (32 - k));
}

/** The generator for stream `index` of `seed` (any non-negative integer index). */
export function streamRng(seed: string | number, index: number): Xoshiro128 {
  const src = seedrandom(`overcheck:${String(seed)}:${index}`);
  const word = () => src.int32();
  return new Xoshiro128(word(), word(), word(), word());
}

/** The default seed used when the user gives none; always printed in results. */
export const DEFAULT_SEED = 1;

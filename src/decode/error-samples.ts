import { wordsFor } from '../gf2/bitmatrix.js';
import type { Xoshiro128 } from '../parallel/seeds.js';
import type { Channel, NoiseModel } from './channel.js';

/**
 * A batch of Pauli errors on n qubits, packed: shot s has its X part in ex[s*stride .. s*stride+stride-1]
 * and its Z part in ez at the same place (Y on a qubit = both bits set).
 */
export interface ErrorSamples {
  readonly n: number;
  readonly stride: number;
  readonly capacity: number;
  readonly ex: Uint32Array;
  readonly ez: Uint32Array;
}

export function errorSamples(n: number, capacity: number): ErrorSamples {
  const stride = wordsFor(n);
  return { n, stride, capacity, ex: new Uint32Array(capacity * stride), ez: new Uint32Array(capacity * stride) };
}

const TWO32 = 4294967296;

/**
 * Fill shots 0..count-1 with errors drawn from the channel. One 32-bit draw per qubit (depolarizing) or two
 * (independent: X then Z), in qubit order, so a stream always maps to the same errors.
 */
export function sampleChannel(ch: Channel, rng: Xoshiro128, out: ErrorSamples, count: number): void {
  const { n, stride, ex, ez } = out;
  ex.fill(0, 0, count * stride);
  ez.fill(0, 0, count * stride);
  if (ch.model === 'depolarizing') {
    const tX = (ch.p / 3) * TWO32;
    const tY = ((2 * ch.p) / 3) * TWO32;
    const tZ = ch.p * TWO32;
    for (let s = 0; s < count; s++) {
      const off = s * stride;
      for (let j = 0; j < n; j++) {
        const u = rng.nextU32();
        if (u >= tZ) continue;
        const w = off + (j >>> 5);
        const bit = 1 << (j & 31);
        if (u < tX) ex[w] = ex[w]! | bit;
        else if (u < tY) {
          ex[w] = ex[w]! | bit;
          ez[w] = ez[w]! | bit;
        } else ez[w] = ez[w]! | bit;
      }
    }
  } else {
    const t = ch.p * TWO32;
    for (let s = 0; s < count; s++) {
      const off = s * stride;
      for (let j = 0; j < n; j++) {
        const w = off + (j >>> 5);
        const bit = 1 << (j & 31);
        if (rng.nextU32() < t) ex[w] = ex[w]! | bit;
        if (rng.nextU32() < t) ez[w] = ez[w]! | bit;
      }
    }
  }
}

function setPauli(out: ErrorSamples, off: number, j: number, kind: number): void {
  // kind 0 = X, 1 = Y, 2 = Z
  const w = off + (j >>> 5);
  const bit = 1 << (j & 31);
  if (kind !== 2) out.ex[w] = out.ex[w]! | bit;
  if (kind !== 0) out.ez[w] = out.ez[w]! | bit;
}

/**
 * Random errors of weight exactly t: t distinct qubits uniformly (partial Fisher–Yates on `perm`, which must
 * hold a permutation of 0..n-1 and is left permuted), then under depolarizing noise X, Y or Z uniformly on
 * each, under independent noise one type (X or Z, equally likely) for the whole error.
 */
export function sampleFixedWeight(model: NoiseModel, t: number, rng: Xoshiro128, perm: Int32Array, out: ErrorSamples, count: number): void {
  const { n, stride } = out;
  out.ex.fill(0, 0, count * stride);
  out.ez.fill(0, 0, count * stride);
  for (let s = 0; s < count; s++) {
    const off = s * stride;
    const kind = model === 'independent' ? 2 * rng.below(2) : -1;
    for (let i = 0; i < t; i++) {
      const k = i + rng.below(n - i);
      const q = perm[k]!;
      perm[k] = perm[i]!;
      perm[i] = q;
      setPauli(out, off, q, kind < 0 ? rng.below(3) : kind);
    }
  }
}

/**
 * Every error of weight t, numbered: under depolarizing noise index i is combination ⌊i / 3^t⌋ (in
 * lexicographic order) with the base-3 digits of i mod 3^t as types (X, Y, Z; least significant digit on the
 * smallest qubit); under independent noise indices below C(n,t) are X errors, the rest Z errors.
 */
export class FixedWeightErrors {
  readonly n: number;
  readonly t: number;
  readonly model: NoiseModel;
  readonly total: number;
  private readonly binom: Float64Array;
  private readonly combination: Int32Array;

  constructor(model: NoiseModel, n: number, t: number) {
    this.n = n;
    this.t = t;
    this.model = model;
    this.binom = new Float64Array((n + 1) * (t + 1));
    for (let a = 0; a <= n; a++) {
      this.binom[a * (t + 1)] = 1;
      for (let b = 1; b <= t; b++) this.binom[a * (t + 1) + b] = a === 0 ? 0 : this.choose(a - 1, b - 1) + this.choose(a - 1, b);
    }
    const c = this.choose(n, t);
    this.total = model === 'depolarizing' ? c * 3 ** t : 2 * c;
    this.combination = new Int32Array(t);
  }

  /** C(a, b) for a ≤ n, b ≤ t (exact while below 2^53). */
  choose(a: number, b: number): number {
    return b < 0 || b > a ? 0 : this.binom[a * (this.t + 1) + b]!;
  }

  /** Write errors first .. first+count-1 into shots 0..count-1. Precondition: first + count ≤ total. */
  fill(first: number, count: number, out: ErrorSamples): void {
    const { t, n } = this;
    const stride = out.stride;
    out.ex.fill(0, 0, count * stride);
    out.ez.fill(0, 0, count * stride);
    const types = 3 ** t;
    const c = this.choose(n, t);
    for (let s = 0; s < count; s++) {
      const i = first + s;
      let rank: number;
      let digits = 0;
      let kind = -1;
      if (this.model === 'depolarizing') {
        rank = Math.floor(i / types);
        digits = i - rank * types;
      } else {
        kind = i < c ? 0 : 2;
        rank = i < c ? i : i - c;
      }
      this.unrank(rank);
      const off = s * stride;
      for (let k = 0; k < t; k++) {
        let type = kind;
        if (type < 0) {
          type = digits % 3;
          digits = (digits - type) / 3;
        }
        setPauli(out, off, this.combination[k]!, type);
      }
    }
  }

  /** The t-subset of rank r in lexicographic order, into this.combination. */
  private unrank(r: number): void {
    const { n, t } = this;
    let x = 0;
    for (let slot = 0; slot < t; slot++) {
      for (;;) {
        const below = this.choose(n - x - 1, t - slot - 1);
        if (r < below) {
          this.combination[slot] = x++;
          break;
        }
        r -= below;
        x++;
      }
    }
  }
}

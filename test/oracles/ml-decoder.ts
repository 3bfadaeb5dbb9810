// Exact maximum-likelihood decoding of a small CSS code (n ≤ 12) by brute force, degenerate: for a syndrome
// it sums the probability of every error in each coset e·L·S (L a logical class, S the stabilizer group)
// and picks the most likely logical class. Clarity over speed; results are memoised per syndrome.
import { type BitMatrix, getBit } from '../../src/gf2/bitmatrix.js';
import { rowBasis } from '../../src/gf2/elimination.js';
import type { Channel } from '../../src/decode/channel.js';

function rowsAsInts(m: BitMatrix): number[] {
  const out: number[] = [];
  for (let r = 0; r < m.rows; r++) {
    let x = 0;
    for (let c = 0; c < m.cols; c++) if (getBit(m, r, c)) x |= 1 << c;
    out.push(x);
  }
  return out;
}

function span(gens: number[]): number[] {
  let out = [0];
  for (const g of gens) out = out.concat(out.map((x) => x ^ g));
  return out;
}

function parity(x: number): number {
  let p = 0;
  while (x) {
    p ^= 1;
    x &= x - 1;
  }
  return p;
}

function popcount(x: number): number {
  let c = 0;
  while (x) {
    c++;
    x &= x - 1;
  }
  return c;
}

export interface SmallCode {
  n: number;
  hx: BitMatrix;
  hz: BitMatrix;
  lx: BitMatrix;
  lz: BitMatrix;
}

export class MlDecoder {
  private readonly hx: number[];
  private readonly hz: number[];
  private readonly lx: number[];
  private readonly lz: number[];
  private readonly stabX: number[];
  private readonly stabZ: number[];
  private readonly memo = new Map<string, [number, number]>();
  private readonly weightProb: number[][];

  constructor(
    readonly code: SmallCode,
    readonly channel: Channel,
  ) {
    if (code.n > 12) throw new RangeError('ML oracle: n ≤ 12');
    this.hx = rowsAsInts(code.hx);
    this.hz = rowsAsInts(code.hz);
    this.lx = rowsAsInts(code.lx);
    this.lz = rowsAsInts(code.lz);
    this.stabX = span(rowsAsInts(rowBasis(code.hx).reduced));
    this.stabZ = span(rowsAsInts(rowBasis(code.hz).reduced));
    const { n } = code;
    const p = channel.p;
    // weightProb[a][b]: probability of a Pauli with a = |x ∨ z| (depolarizing) or a = |x|, b = |z| (independent)
    this.weightProb = [];
    for (let a = 0; a <= n; a++) {
      const row: number[] = [];
      for (let b = 0; b <= n; b++) {
        row.push(channel.model === 'depolarizing' ? (1 - p) ** (n - a) * (p / 3) ** a : p ** (a + b) * (1 - p) ** (2 * n - a - b));
      }
      this.weightProb.push(row);
    }
  }

  private prob(x: number, z: number): number {
    if (this.channel.model === 'depolarizing') return this.weightProb[popcount(x | z)]![0]!;
    return this.weightProb[popcount(x)]![popcount(z)]!;
  }

  /** The ML correction (x part, z part) for the syndrome of error (ex, ez). */
  correction(ex: number, ez: number): [number, number] {
    const key = `${this.hz.map((h) => parity(h & ex)).join('')}|${this.hx.map((h) => parity(h & ez)).join('')}`;
    const hit = this.memo.get(key);
    if (hit) return hit;
    const k = this.lx.length;
    let best = -1;
    let bestC: [number, number] = [ex, ez];
    for (let a = 0; a < 1 << k; a++) {
      let x0 = ex;
      for (let i = 0; i < k; i++) if ((a >>> i) & 1) x0 ^= this.lx[i]!;
      for (let b = 0; b < 1 << k; b++) {
        let z0 = ez;
        for (let i = 0; i < k; i++) if ((b >>> i) & 1) z0 ^= this.lz[i]!;
        let total = 0;
        for (const sx of this.stabX) for (const sz of this.stabZ) total += this.prob(x0 ^ sx, z0 ^ sz);
        if (total > best) {
          best = total;
          bestC = [x0, z0];
        }
      }
    }
    this.memo.set(key, bestC);
    return bestC;
  }

  /** Whether ML decoding leaves a logical error on (ex, ez). */
  fails(ex: number, ez: number): boolean {
    const [cx, cz] = this.correction(ex, ez);
    const rx = ex ^ cx;
    const rz = ez ^ cz;
    return this.lz.some((l) => parity(l & rx) === 1) || this.lx.some((l) => parity(l & rz) === 1);
  }
}

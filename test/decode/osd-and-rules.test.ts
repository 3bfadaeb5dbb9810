import { describe, expect, it } from 'vitest';
import { checkScratch, minSumPass, sumProductPass } from '../../src/decode/check-rules.js';
import { OsdDecoder } from '../../src/decode/osd.js';
import { tannerEdges } from '../../src/decode/tanner-edges.js';
import { type BitMatrix, fromDense, getBit, vstack } from '../../src/gf2/bitmatrix.js';
import { rank } from '../../src/gf2/elimination.js';
import { streamRng, type Xoshiro128 } from '../../src/parallel/seeds.js';

function randomFullRank(rng: Xoshiro128, rows: number, cols: number): BitMatrix {
  for (;;) {
    const h = fromDense(Array.from({ length: rows }, () => Array.from({ length: cols }, () => (rng.next() < 0.45 ? 1 : 0))));
    if (rank(h) === rows) return h;
  }
}

function syndromeOf(h: BitMatrix, e: number[]): Uint8Array {
  return Uint8Array.from({ length: h.rows }, (_, r) => e.reduce((s, v, c) => s ^ (v & getBit(h, r, c)), 0));
}

const cost = (e: ArrayLike<number>, llr: Float64Array) => Array.from(e).reduce((s, v, j) => s + (v ? llr[j]! : 0), 0);

describe('OSD', () => {
  it('order 0 and the combination sweep solve the syndrome; with ≤ 2 columns outside the information set the sweep is exhaustive, so it finds the least soft weight (brute force)', () => {
    for (let t = 0; t < 60; t++) {
      const rng = streamRng('osd', t);
      const n = 7 + rng.below(4);
      const m = n - 1 - rng.below(2); // n − rank = 1 or 2
      const h = randomFullRank(rng, m, n);
      const e = Array.from({ length: n }, () => (rng.next() < 0.3 ? 1 : 0));
      const s = syndromeOf(h, e);
      const llr = Float64Array.from({ length: n }, () => -2 + 6 * rng.next());
      const out0 = new Uint8Array(n);
      new OsdDecoder(h, false).decode(s, llr, out0);
      expect([...syndromeOf(h, [...out0])]).toEqual([...s]);
      const outCs = new Uint8Array(n);
      new OsdDecoder(h, true, 2).decode(s, llr, outCs);
      expect([...syndromeOf(h, [...outCs])]).toEqual([...s]);
      let best = Infinity;
      for (let x = 0; x < 1 << n; x++) {
        const cand = Array.from({ length: n }, (_, j) => (x >>> j) & 1);
        if (syndromeOf(h, cand).every((b, r) => b === s[r])) best = Math.min(best, cost(cand, llr));
      }
      expect(cost(outCs, llr)).toBeCloseTo(best, 10);
      expect(cost(out0, llr)).toBeGreaterThanOrEqual(best - 1e-12);
      // redundant rows change nothing: same row space, same solutions
      const extra = fromDense([Array.from({ length: n }, (_, c) => getBit(h, 0, c) ^ getBit(h, 1, c))]);
      const hh = vstack(h, extra);
      const ss = syndromeOf(hh, e);
      const outR = new Uint8Array(n);
      new OsdDecoder(hh, true, 2).decode(ss, llr, outR);
      expect([...outR]).toEqual([...outCs]);
    }
  });
});

describe('check rules against their formulas, including saturated messages', () => {
  const d = 6;
  const g = tannerEdges(fromDense([Array.from({ length: d }, () => 1)]));
  const maxLlr = 50;

  it('sum-product in the ratio domain equals 2·atanh(∏ tanh(x/2)), clamped', () => {
    for (let t = 0; t < 400; t++) {
      const rng = streamRng('sp-rule', t);
      const big = t % 3 === 0 ? 80 : 8;
      const postLlr = Array.from({ length: d }, () => (rng.next() - 0.5) * 2 * big);
      const c2vLlr = Array.from({ length: d }, () => (rng.next() - 0.5) * 2 * Math.min(big, 40));
      const syndrome = Uint8Array.of(rng.below(2));
      // state layout: messages (d), beliefs (d), products (d)
      const state = Float64Array.from([...c2vLlr, ...postLlr].map(Math.exp).concat(new Array<number>(d).fill(1)));
      sumProductPass(g, state, d, 2 * d, syndrome, 1, Math.exp(maxLlr), checkScratch(d));
      const c2v = state.subarray(0, d);
      const prod = state.subarray(2 * d);
      for (let k = 0; k < d; k++) {
        let y = syndrome[0] ? -1 : 1;
        for (let j = 0; j < d; j++) if (j !== k) y *= Math.tanh((postLlr[j]! - c2vLlr[j]!) / 2);
        const ref = Math.max(-maxLlr, Math.min(maxLlr, 2 * Math.atanh(y)));
        const got = Math.log(c2v[k]!);
        if (Math.abs(ref) < 30) expect(Math.abs(got - ref)).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(ref)) + 1e-13 * Math.exp(Math.abs(ref)));
        else {
          // both saturated: same sign, large
          expect(Math.sign(got)).toBe(Math.sign(ref));
          expect(Math.abs(got)).toBeGreaterThan(25);
        }
        expect(Math.log(prod[g.edgeVar[k]!]!)).toBeCloseTo(got, 9);
      }
    }
  });

  it('min-sum equals (−1)^s · scale · ∏ sign · min |x|', () => {
    for (let t = 0; t < 200; t++) {
      const rng = streamRng('ms-rule', t);
      const x = Array.from({ length: d }, () => (rng.next() - 0.5) * 20);
      const state = Float64Array.from([...new Array<number>(d).fill(0), ...x, ...new Array<number>(d).fill(0)]);
      const syndrome = Uint8Array.of(rng.below(2));
      minSumPass(g, state, d, 2 * d, syndrome, 0.8, maxLlr, checkScratch(d));
      const c2v = state.subarray(0, d);
      for (let k = 0; k < d; k++) {
        const others = x.filter((_, j) => j !== k);
        const sign = others.reduce((s, v) => s * Math.sign(v), syndrome[0] ? -1 : 1);
        expect(c2v[k]).toBeCloseTo(sign * 0.8 * Math.min(...others.map(Math.abs)), 12);
      }
    }
  });
});

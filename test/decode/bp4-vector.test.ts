import { describe, expect, it } from 'vitest';
import { QuaternaryBp } from '../../src/decode/bp4.js';
import { pauliProbabilities } from '../../src/decode/channel.js';
import { buildFamily } from '../../src/codes/families/index.js';
import type { BitMatrix } from '../../src/gf2/bitmatrix.js';
import { streamRng } from '../../src/parallel/seeds.js';
import { anticommutes } from '../oracles/pauli-brute.js';
import { VectorBp4 } from '../oracles/vector-bp4.js';
import { pauliChecks, randomCss, randomDistribution } from './helpers.js';

// The tanh rule loses relative precision as |LLR| grows (2 atanh y for y within e^{-|L|} of 1), so the
// tolerance grows like machine epsilon times e^{|L|}: tight for the messages that matter, loose for saturated ones.
function near(got: number, want: number, label: string): void {
  const tol = 1e-9 * Math.max(1, Math.abs(want)) + 1e-14 * Math.exp(Math.min(Math.abs(want), 50));
  expect(Math.abs(got - want), `${label}: ${got} vs ${want}`).toBeLessThanOrEqual(tol);
}

function compare(dx: BitMatrix, dz: BitMatrix, prior: number[][], seed: number, schedule: 'flooding' | 'serial', iterations: number): void {
  const n = dx.cols;
  const rng = streamRng('bp4-error', seed);
  const w = prior.map(() => rng.below(4) * (rng.next() < 0.35 ? 1 : 0));
  const syn: number[] = [];
  const pushRows = (m: BitMatrix, type: 'X' | 'Z') => {
    for (let r = 0; r < m.rows; r++) {
      let b = 0;
      for (let c = 0; c < n; c++) if ((m.data[r * m.stride + (c >>> 5)]! >>> (c & 31)) & 1) b ^= anticommutes(w[c]!, type);
      syn.push(b);
    }
  };
  pushRows(dx, 'X');
  pushRows(dz, 'Z');
  const syndrome = Uint8Array.from(syn);
  const checks = pauliChecks(dx, dz, syndrome);
  const oracle = new VectorBp4(n, prior, checks);
  const bp = new QuaternaryBp(dx, dz, { rule: 'sum-product', scale: 1, schedule, iterations, earlyStop: false });
  bp.setPrior(Float64Array.from(prior.flat()));
  bp.start(syndrome);
  const post = new Float64Array(4);
  const check = (label: string) => {
    checks.forEach((c, i) => {
      const same = c.type === 'X' ? 1 : 3; // the Pauli equal to the check's own on this qubit
      const anti = c.type === 'X' ? 3 : 1;
      c.vars.forEach((v, k) => {
        const e = bp.g.checkStart[i]! + k;
        const q = oracle.state.q[i]![k]!;
        const varMsg = Math.log((q[0]! + q[same]!) / (q[2]! + q[4 - same]!));
        near(bp.variableMessageLlr(e), varMsg, `${label}: variable ${v} → check ${i}`);
        const r = oracle.state.r[i]![k]!;
        const checkMsg = Math.log(r[0]! / r[anti]!);
        near(bp.checkMessageLlr(e), checkMsg, `${label}: check ${i} → variable ${v}`);
      });
    });
    for (let j = 0; j < n; j++) {
      bp.posterior(j, post);
      for (let k = 0; k < 4; k++) expect(post[k], `${label}: posterior of qubit ${j}`).toBeCloseTo(oracle.state.posterior[j]![k]!, 9);
    }
  };
  check('start');
  for (let t = 1; t <= iterations; t++) {
    bp.iterate();
    if (schedule === 'flooding') oracle.floodingIteration();
    else oracle.serialIteration();
    check(`iteration ${t}`);
  }
}

describe('scalar-message BP4 equals vector-message BP4, message for message', () => {
  for (const schedule of ['flooding', 'serial'] as const) {
    it(`random small CSS codes, ${schedule}`, () => {
      for (let t = 0; t < 12; t++) {
        const rng = streamRng('bp4-codes', t);
        const n = 6 + rng.below(4);
        const { hx, hz } = randomCss(t, n, 2 + rng.below(3), 2 + rng.below(3));
        const prior = t % 2 === 0 ? Array.from({ length: n }, () => randomDistribution(rng, 4)) : Array.from({ length: n }, () => pauliProbabilities({ model: 'depolarizing', p: 0.02 + 0.3 * rng.next() }));
        compare(hx, hz, prior, t, schedule, 6);
      }
    });
  }

  it('surface code d=3 under depolarizing noise (loops of length 4 and more)', () => {
    const built = buildFamily('surface:d=3');
    if (built.kind !== 'css') throw new Error('expected a CSS code');
    const prior = Array.from({ length: 9 }, () => pauliProbabilities({ model: 'depolarizing', p: 0.1 }));
    compare(built.code.hx, built.code.hz, prior, 99, 'flooding', 8);
  });
});

describe('min-sum BP4 qubit update', () => {
  // source: Kuo & Lai, "Refined belief propagation decoding of sparse-graph quantum codes", IEEE JSAIT 1(2), 2020:
  // the Z part of qubit j sends ln[(pI + pX e^{-B_j}) / (pZ + pY e^{-B_j})] + A_j (X part: Z and X swapped), exactly,
  // whatever the check rule. The decoder reuses these terms while a sum repeats. With the zero syndrome on a code
  // whose qubits have three checks a side, min-sum messages saturate at the clamp, so the sums of the last
  // iterations at p = 0.05 (3 × 50) recur at once under a prior so strong that its first messages saturate too:
  // a reuse that ignored the change of prior would show here.
  it('is the exact marginal after every iteration, also after the prior changed', () => {
    const built = buildFamily('bb:l=6,m=6,A=x^3+y+y^2,B=y^3+x+x^2');
    if (built.kind !== 'css') throw new Error('expected a CSS code');
    const { hx, hz } = built.code;
    const n = hx.cols;
    const opts = { rule: 'min-sum' as const, scale: 0.75, schedule: 'flooding' as const, iterations: 30, earlyStop: false };
    const reused = new QuaternaryBp(hx, hz, opts);
    const zero = new Uint8Array(hx.rows + hz.rows);
    reused.setUniformPrior(pauliProbabilities({ model: 'depolarizing', p: 0.05 }));
    reused.decode(zero);
    expect(reused.acc[0]).toBe(3 * reused.maxLlr);
    const rng = streamRng('bp4-min-sum-memo', 0);
    for (const p of [1e-30, 0.12]) {
      const pauli = pauliProbabilities({ model: 'depolarizing', p });
      const [pI, pX, pY, pZ] = pauli as [number, number, number, number];
      reused.setUniformPrior(pauli);
      const fresh = new QuaternaryBp(hx, hz, opts);
      fresh.setUniformPrior(pauli);
      for (let k = 0; k < 3; k++) {
        const s = k === 0 ? zero : Uint8Array.from({ length: zero.length }, () => (rng.next() < 0.2 ? 1 : 0));
        reused.start(s);
        fresh.start(s);
        for (let t = 1; t <= 30; t++) {
          reused.iterate();
          fresh.iterate();
          for (let j = 0; j < n; j++) {
            const a = reused.acc[j]!;
            const b = reused.acc[n + j]!;
            const label = `p ${p}, shot ${k}, iteration ${t}, qubit ${j}`;
            expect(reused.belief[j], `${label}, Z part`).toBeCloseTo(Math.log((pI + pX * Math.exp(-b)) / (pZ + pY * Math.exp(-b))) + a, 9);
            expect(reused.belief[n + j], `${label}, X part`).toBeCloseTo(Math.log((pI + pZ * Math.exp(-a)) / (pX + pY * Math.exp(-a))) + b, 9);
          }
          expect(Array.from(reused.state)).toEqual(Array.from(fresh.state));
          expect(Array.from(reused.hard)).toEqual(Array.from(fresh.hard));
        }
      }
    }
  });
});

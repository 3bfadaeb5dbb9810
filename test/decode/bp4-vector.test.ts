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

import { describe, expect, it } from 'vitest';
import { fromSupports, zeros } from '../../src/gf2/bitmatrix.js';
import { BinaryBp } from '../../src/decode/bp2.js';
import { QuaternaryBp } from '../../src/decode/bp4.js';
import type { BpOptions } from '../../src/decode/bp-options.js';
import { tannerEdges } from '../../src/decode/tanner-edges.js';
import { streamRng } from '../../src/parallel/seeds.js';
import { anticommutes, binaryMarginals, pauliMarginals } from '../oracles/pauli-brute.js';
import { randomDistribution, randomTree } from './helpers.js';

const exact = (schedule: 'flooding' | 'serial'): BpOptions => ({ rule: 'sum-product', scale: 1, schedule, iterations: 40, earlyStop: false });

// source: Pearl, "Probabilistic Reasoning in Intelligent Systems", Morgan Kaufmann, 1988 — on a cycle-free
// factor graph, sum-product belief propagation converges to the exact marginals.
describe('sum-product BP on Tanner trees gives exact marginals', () => {
  for (const schedule of ['flooding', 'serial'] as const) {
    it(`binary BP, ${schedule} schedule, 40 random trees`, () => {
      for (let t = 0; t < 40; t++) {
        const rng = streamRng('tree2', t);
        const { n, checks } = randomTree(rng, 4 + rng.below(9));
        const h = fromSupports(checks.length, n, checks);
        const q = Array.from({ length: n }, () => 0.03 + 0.45 * rng.next());
        let e = 0;
        for (let j = 0; j < n; j++) if (rng.next() < q[j]!) e |= 1 << j;
        const syndrome = Uint8Array.from(checks.map((c) => c.reduce((s, v) => s ^ ((e >>> v) & 1), 0)));
        const truth = binaryMarginals(n, q, checks.map((vars, i) => ({ vars, bit: syndrome[i]! })));
        const bp = new BinaryBp(tannerEdges(h), exact(schedule));
        bp.setPrior(Float64Array.from(q, (x) => Math.log((1 - x) / x)));
        bp.decode(syndrome);
        const llr = bp.posteriorLlr();
        for (let j = 0; j < n; j++) expect(llr[j]).toBeCloseTo(Math.log((1 - truth[j]!) / truth[j]!), 8);
      }
    });

    it(`quaternary BP (scalar messages), ${schedule} schedule, 30 random trees`, () => {
      for (let t = 0; t < 30; t++) {
        const rng = streamRng('tree4', t);
        const { n, checks } = randomTree(rng, 3 + rng.below(5));
        const types = checks.map(() => (rng.below(2) === 0 ? 'X' : 'Z') as 'X' | 'Z');
        const xs = checks.filter((_, i) => types[i] === 'X');
        const zs = checks.filter((_, i) => types[i] === 'Z');
        const dx = xs.length ? fromSupports(xs.length, n, xs) : zeros(0, n);
        const dz = zs.length ? fromSupports(zs.length, n, zs) : zeros(0, n);
        const prior = Array.from({ length: n }, () => randomDistribution(rng, 4));
        const w = prior.map((p) => {
          let u = rng.next();
          for (let k = 0; k < 3; k++) {
            if (u < p[k]!) return k;
            u -= p[k]!;
          }
          return 3;
        });
        const ordered = [...xs.map((vars) => ({ type: 'X' as const, vars })), ...zs.map((vars) => ({ type: 'Z' as const, vars }))];
        const pc = ordered.map((c) => ({ ...c, bit: c.vars.reduce((s, v) => s ^ anticommutes(w[v]!, c.type), 0) }));
        const truth = pauliMarginals(n, prior, pc);
        const bp = new QuaternaryBp(dx, dz, exact(schedule));
        bp.setPrior(Float64Array.from(prior.flat()));
        bp.decode(Uint8Array.from(pc.map((c) => c.bit)));
        const got = new Float64Array(4);
        for (let j = 0; j < n; j++) {
          bp.posterior(j, got);
          for (let k = 0; k < 4; k++) expect(got[k]).toBeCloseTo(truth[j]![k]!, 9);
        }
      }
    });
  }
});

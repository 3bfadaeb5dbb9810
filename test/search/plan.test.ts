import { describe, expect, it } from 'vitest';
import { buildFamily } from '../../src/codes/families/index.js';
import { rowBasis } from '../../src/gf2/elimination.js';
import { pairProbe, sternProbe, systematicDensity } from '../../src/search/isd.js';
import { planSearch } from '../../src/search/plan.js';
import { supportSize } from '../../src/search/run.js';

/** Generator [I_k | 0]: every systematic row is its pivot alone, whatever the information set. */
function identityGenerator(k: number, n: number): Uint32Array {
  const s = (n + 31) >>> 5;
  const g = new Uint32Array(k * s);
  for (let r = 0; r < k; r++) g[r * s + (r >>> 5)] = 1 << (r & 31);
  return g;
}

describe('kernel probes count what the kernels do (exact counts on [I | 0] by hand)', () => {
  it('Lee–Brickell pairs: every pair sum has weight 2', () => {
    const k = 10;
    for (const n of [40, 100]) {
      const s = (n + 31) >>> 5;
      const g = identityGenerator(k, n);
      const pairs = (k * (k - 1)) / 2;
      // W = 2: every pair passes the two-word test, then reads the other s − 2 words, and is kept
      expect(pairProbe(k, n, g, 2)).toEqual({ words: pairs * (1 + Math.max(0, s - 2)), keptRows: k, keptPairs: pairs });
      // W = 1: the pivots lie in the first word, so every pair is rejected on its first two words
      expect(pairProbe(k, n, g, 1)).toEqual({ words: 0, keptRows: k, keptPairs: 0 });
    }
  });

  it('Stern: every half-sum projects to zero, so every pair of half-sums collides', () => {
    const k = 10;
    const n = 80;
    const g = identityGenerator(k, n);
    // halves of 5 rows: 1 + 5 + C(5,2) = 16 sums of ≤ 2 rows each (p = 2), 1 + 5 = 6 (p = 1); the zero word is excluded
    for (const [p, half] of [[1, 6], [2, 16]] as const) {
      const all = sternProbe(k, n, g, n, p, 6);
      expect(all.collisions).toBe(half * half - 1);
      expect(all.kept).toBe(half * half - 1);
      expect(all.words).toBe((half * half - 1) * 3); // W = n: all 3 words read
      // W = 1: only the 10 single rows are light; a heavier sum stops after its first word
      const light = sternProbe(k, n, g, 1, p, 6);
      expect(light.kept).toBe(10);
      expect(light.words).toBe(light.collisions + 10 * 2);
    }
  });
});

describe('planner choice on published codes (a consequence of the cost model and the probe counts, not of timing)', () => {
  const plan = (spec: string, W: number) => {
    const b = buildFamily(spec);
    if (b.kind !== 'css') throw new Error('expected css');
    const h = b.code.hx;
    const basis = rowBasis(h);
    const k = basis.rank;
    const d = systematicDensity(k, h.cols, basis.reduced.data);
    return planSearch({
      n: supportSize(basis.reduced), k, maxWeight: W, method: 'isd', targetMiss: 1e-6, density: d.mean, sparseRows: d.sparseRows,
      measured: { pairs: pairProbe(k, h.cols, basis.reduced.data, W), stern: (p, l) => sternProbe(k, h.cols, basis.reduced.data, W, p, l) },
    });
  };

  it('bb [[144,12]] rowspace(HX), W = 12: Lee–Brickell p = 2 (sparse rows make Stern window collisions many)', () => {
    // source: Bravyi et al., Nature 627, 778 (2024) (the code); the choice matches scripts/bench/planner.ts (DEVELOPERS.md)
    const r = plan('bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2', 12);
    expect(r.method === 'isd' && r.settings).toEqual({ variant: 'lee-brickell', p: 2, window: 0, segment: 1 });
  });

  it('gb [[254,28]] rowspace(HX), W = 10: Stern p = 2 (near-random systematic rows)', () => {
    // source: Panteleev & Kalachev, Quantum 5, 585 (2021) (the code); the choice matches scripts/bench/planner.ts
    const r = plan('gb:l=127,a=1+x^15+x^20+x^28+x^66,b=1+x^58+x^59+x^100+x^121', 10);
    expect(r.method === 'isd' && r.settings.variant).toBe('stern');
    expect(r.method === 'isd' && r.settings.p).toBe(2);
  });
});

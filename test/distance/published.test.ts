import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildFamily } from '../../src/codes/families/index.js';
import { fromDense, toDense, type BitMatrix } from '../../src/gf2/index.js';
import { auditDistance, type AuditSettings } from '../../src/distance/audit.js';
import { classicalCheckProblem, classicalGeneratorProblem } from '../../src/distance/problem.js';
import type { CssDistanceReport, ClassicalDistanceReport, SideReport } from '../../src/distance/result.js';
import { openPool, type TaskPool } from '../../src/parallel/pool.js';

let pool: TaskPool;
beforeAll(async () => {
  pool = await openPool(0);
});
afterAll(async () => {
  await pool.close();
});

const never = { shouldStop: () => false, stopReason: () => 'time-limit' as const };

async function css(spec: string, settings: Partial<AuditSettings> = {}): Promise<CssDistanceReport> {
  const b = buildFamily(spec);
  if (b.kind !== 'css') throw new Error('expected a CSS family');
  const r = await auditDistance(pool, { kind: 'css', code: b.code, label: spec, side: 'both' }, { method: 'auto', seed: 1, ...settings }, never);
  if (r.kind !== 'css') throw new Error('expected a CSS report');
  return r;
}

async function classicalH(spec: string): Promise<ClassicalDistanceReport> {
  const b = buildFamily(spec);
  if (b.kind !== 'classical') throw new Error('expected a classical family');
  const r = await auditDistance(pool, { kind: 'classical', problem: classicalCheckProblem(b.h), label: spec }, { method: 'certify', seed: 1 }, never);
  if (r.kind !== 'classical') throw new Error('expected a classical report');
  return r;
}

function expectCertified(s: SideReport | undefined, d: number): void {
  expect(s).toBeDefined();
  expect(s!.upper).toBe(d);
  expect(s!.lower).toBe(d);
  expect(s!.certified).toBe(true);
  expect(s!.countExact).toBe(true);
  expect(s!.missProbability).toBe(0);
  expect(s!.witness.length).toBe(d);
}

describe('quantum codes with published distances', () => {
  it('generalized bicycle [[48,6,8]] and [[46,2,9]], certified', async () => {
    // source: Panteleev & Kalachev, "Degenerate quantum LDPC codes with good finite length performance", Quantum 5, 585 (2021)
    const a = await css('gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17', { method: 'certify' });
    expectCertified(a.dx, 8);
    expectCertified(a.dz, 8);
    expect(a.d).toEqual({ upper: 8, lower: 8, certified: true });
    // source: Panteleev & Kalachev, Quantum 5, 585 (2021)
    const b = await css('gb:l=23,a=1+x^5+x^8+x^12,b=1+x+x^5+x^7', { method: 'certify' });
    expectCertified(b.dx, 9);
    expectCertified(b.dz, 9);
  });

  it('bivariate bicycle [[72,12,6]], certified', async () => {
    // source: Bravyi et al., "High-threshold and low-overhead fault-tolerant quantum memory", Nature 627, 778 (2024)
    const r = await css('bb:l=6,m=6,A=x^3+y+y^2,B=y^3+x+x^2', { method: 'certify' });
    expectCertified(r.dx, 6);
    expectCertified(r.dz, 6);
  });

  // The information-set search, stopped at miss probability 1e-3, reaches the published distance on these
  // in well under a second each (certifying them is left to the benchmark, scripts/bench/distance.ts).
  const upperChecks: [string, number, number][] = [
    ['bb:l=15,m=3,A=x^9+y+y^2,B=1+x^2+x^7', 10, 1e-3], // source: Bravyi et al., Nature 627, 778 (2024): [[90,8,10]]
    ['bb:l=9,m=6,A=x^3+y+y^2,B=y^3+x+x^2', 10, 1e-3], // source: Bravyi et al., Nature 627, 778 (2024): [[108,8,10]]
    ['bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2', 12, 1e-3], // source: Bravyi et al., Nature 627, 778 (2024): [[144,12,12]]
  ];
  for (const [spec, d, targetMiss] of upperChecks) {
    it(`${spec}: upper bound ${d}`, async () => {
      const r = await css(spec, { method: 'isd', targetMiss });
      expect(r.d.upper).toBe(d);
      for (const s of [r.dx!, r.dz!]) {
        expect(s.upper).toBe(d);
        expect(s.lower).toBeLessThanOrEqual(d);
        expect(s.count).toBeGreaterThan(0);
        expect(s.countExact).toBe(false);
        expect(s.missProbability).toBeGreaterThan(0);
        expect(s.missProbability).toBeLessThan(1);
      }
    });
  }

  it('toric L×L has d = L; rotated surface d×d has d = d; hgp of the [7,4] Hamming code with itself has d = 3', async () => {
    for (const L of [2, 3, 4, 5]) {
      // common practice: toric code [[2L², 2, L]]
      const r = await css(`toric:L=${L}`);
      expectCertified(r.dx, L);
      expectCertified(r.dz, L);
      // common practice: the lightest non-contractible loops of the L×L torus are the 2L straight ones
      if (L >= 3) expect([r.dx!.count, r.dz!.count]).toEqual([2 * L, 2 * L]);
    }
    for (const d of [2, 3, 5, 7]) {
      // common practice: rotated surface code [[d², 1, d]]
      const r = await css(`surface:d=${d}`);
      expectCertified(r.dx, d);
      expectCertified(r.dz, d);
    }
    // common practice / Tillich & Zémor, "Quantum LDPC codes with positive rate and minimum distance proportional to n^(1/2)" (2014):
    // hypergraph product distance min(d(H1), d(H2)) = 3 here
    const h = await css('hgp:h1=(cyclic:n=7,g=1+x+x^3),h2=(cyclic:n=7,g=1+x+x^3)');
    expectCertified(h.dx, 3);
    expectCertified(h.dz, 3);
  });
});

describe('classical codes', () => {
  it('[7,4,3] Hamming, [23,12,7] Golay, [15,7,5] BCH from their check matrices', async () => {
    // source: MacWilliams & Sloane, The Theory of Error-Correcting Codes (1977)
    const ham = await classicalH('cyclic:n=7,g=1+x+x^3');
    expectCertified(ham.d, 3);
    expect(ham.d.count).toBe(7); // source: MacWilliams & Sloane (1977): Hamming weight enumerator 1 + 7z³ + 7z⁴ + z⁷
    const golay = await classicalH('cyclic:n=23,g=x^11+x^10+x^6+x^5+x^4+x^2+1');
    expectCertified(golay.d, 7);
    expect(golay.d.count).toBe(253); // source: MacWilliams & Sloane (1977): Golay A7 = 253
    const bch = await classicalH('cyclic:n=15,g=x^8+x^7+x^6+x^4+1');
    expectCertified(bch.d, 5); // source: MacWilliams & Sloane (1977): [15,7,5] BCH
    expect(bch.d.count).toBe(18); // from memory: weight enumerator of the [15,7,5] BCH code, A5 = 18
    expect(bch.k).toBe(7);
  });

  it('[24,12,8] extended Golay from a generator matrix (Golay generator plus a parity bit)', async () => {
    const g = buildFamily('cyclic:n=23,g=x^11+x^10+x^6+x^5+x^4+x^2+1');
    if (g.kind !== 'classical') throw new Error('classical');
    const ext = toDense(g.generator!).map((row) => [...row, row.reduce((a, v) => a ^ v, 0)]);
    const gen: BitMatrix = fromDense(ext, 24);
    for (const method of ['certify', 'exhaustive'] as const) {
      const r = await auditDistance(pool, { kind: 'classical', problem: classicalGeneratorProblem(gen), label: 'golay24' }, { method, seed: 1 }, never);
      if (r.kind !== 'classical') throw new Error('classical');
      expect(r.k).toBe(12);
      // source: MacWilliams & Sloane (1977): extended Golay [24,12,8], A8 = 759
      expectCertified(r.d, 8);
      expect(r.d.count).toBe(759);
    }
  });
});

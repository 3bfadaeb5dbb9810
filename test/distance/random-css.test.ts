import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hypergraphProduct } from '../../src/codes/families/index.js';
import { cssCode, type CssCode } from '../../src/codes/css.js';
import { fromDense, kernel, multiply, toDense, packSupport, multiplyVector, RowSpaceSolver } from '../../src/gf2/index.js';
import { auditDistance, type DistanceMethod } from '../../src/distance/audit.js';
import type { CssDistanceReport } from '../../src/distance/result.js';
import { InputError } from '../../src/errors.js';
import { openPool, type TaskPool } from '../../src/parallel/pool.js';
import { bruteCssDistance } from '../oracles/min-weight.js';

let pool: TaskPool;
beforeAll(async () => {
  pool = await openPool(0);
});
afterAll(async () => {
  await pool.close();
});

const never = { shouldStop: () => false, stopReason: () => 'time-limit' as const };

/** Random small classical matrices; their hypergraph products are random small CSS codes (n ≤ 18 kept). */
const smallMatrix = fc.record({ r: fc.integer({ min: 1, max: 3 }), c: fc.integer({ min: 2, max: 4 }) }).chain(({ r, c }) =>
  fc.array(fc.array(fc.integer({ min: 0, max: 1 }), { minLength: c, maxLength: c }), { minLength: r, maxLength: r }).map((d) => fromDense(d, c)));
const productCss = fc.tuple(smallMatrix, smallMatrix).map(([a, b]) => hypergraphProduct(a, b)).filter((c) => c.n <= 18);

/**
 * Random CSS codes of another shape, with larger distances: random HX on n ≤ 20 qubits, and HZ made of
 * random combinations of a basis of ker HX, a few fewer than its dimension (so k is small).
 */
const kernelCss = fc
  .record({ n: fc.integer({ min: 6, max: 20 }), r: fc.integer({ min: 2, max: 8 }), kk: fc.integer({ min: 1, max: 3 }) })
  .chain(({ n, r, kk }) =>
    fc.array(fc.array(fc.integer({ min: 0, max: 1 }), { minLength: n, maxLength: n }), { minLength: r, maxLength: r }).chain((d) => {
      const hx = fromDense(d, n);
      const ker = kernel(hx);
      const s = Math.max(1, ker.rows - kk);
      return fc
        .array(fc.array(fc.integer({ min: 0, max: 1 }), { minLength: ker.rows, maxLength: ker.rows }), { minLength: s, maxLength: s })
        .map((coeffs) => cssCode(hx, multiply(fromDense(coeffs, ker.rows), ker)));
    }),
  );
const smallCss = fc.oneof(productCss, kernelCss);

async function audit(code: CssCode, method: DistanceMethod, extra: { iterations?: number } = {}): Promise<CssDistanceReport | null> {
  try {
    const r = await auditDistance(pool, { kind: 'css', code, label: 'random', side: 'both' }, { method, seed: 7, ...extra }, never);
    if (r.kind !== 'css') throw new Error('css expected');
    return r;
  } catch (e) {
    if (e instanceof InputError) return null; // k = 0
    throw e;
  }
}

describe('random small CSS codes against brute force', () => {
  for (const method of ['certify', 'exhaustive', 'auto'] as const) {
    it(`${method}: certified dX, dZ and their counts equal the exhaustive minimum`, async () => {
      await fc.assert(
        fc.asyncProperty(smallCss, async (code) => {
          const hx = toDense(code.hx);
          const hz = toDense(code.hz);
          const bx = bruteCssDistance(hx, hz, code.n);
          const bz = bruteCssDistance(hz, hx, code.n);
          const r = await audit(code, method);
          if (bx === null) {
            expect(bz).toBeNull();
            expect(r).toBeNull();
            return;
          }
          expect(r).not.toBeNull();
          for (const [s, b, checks, stabs] of [
            [r!.dx!, bx, code.hz, code.hx],
            [r!.dz!, bz!, code.hx, code.hz],
          ] as const) {
            expect(s.certified).toBe(true);
            expect(s.upper).toBe(b.d);
            expect(s.lower).toBe(b.d);
            expect(s.countExact).toBe(true);
            expect(s.count).toBe(b.count);
            // the witness, checked here once more by the test itself
            const w = packSupport(code.n, s.witness);
            expect(s.witness.length).toBe(b.d);
            expect([...multiplyVector(checks, w)].every((x) => x === 0)).toBe(true);
            expect(new RowSpaceSolver(stabs).contains(w)).toBe(false);
          }
          expect(r!.d.upper).toBe(Math.min(bx.d, bz!.d));
          expect(r!.d.lower).toBe(Math.min(bx.d, bz!.d));
        }),
        { numRuns: method === 'auto' ? 40 : 80 },
      );
    });
  }

  it('isd alone: bounds are always sound (lower ≤ d ≤ upper), the miss probability is a probability', async () => {
    await fc.assert(
      fc.asyncProperty(smallCss, fc.integer({ min: 0, max: 3 }), async (code, it) => {
        const bx = bruteCssDistance(toDense(code.hx), toDense(code.hz), code.n);
        const r = await audit(code, 'isd', { iterations: it });
        if (bx === null) return;
        const s = r!.dx!;
        expect(s.lower).toBeLessThanOrEqual(bx.d);
        expect(s.upper).toBeGreaterThanOrEqual(bx.d);
        expect(s.certified).toBe(s.lower === s.upper);
        expect(s.missProbability).toBeGreaterThanOrEqual(0);
        expect(s.missProbability).toBeLessThanOrEqual(1);
        if (s.certified) expect(s.upper).toBe(bx.d);
      }),
      { numRuns: 40 },
    );
  });
});

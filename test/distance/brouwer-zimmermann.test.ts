import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildFamily } from '../../src/codes/families/index.js';
import { fromDense, rowSupport, type BitMatrix } from '../../src/gf2/index.js';
import { augmentedBasis } from '../../src/distance/augmented.js';
import {
  binomial,
  boundForLevels,
  enumerateUpTo,
  EnumerationSchedule,
  planEnumeration,
  scanLevel,
  unrankCombination,
} from '../../src/distance/brouwer-zimmermann.js';
import { bruteWordsUpTo, toMask } from '../oracles/min-weight.js';

const denseMatrix = (rows: { min: number; max: number }, cols: { min: number; max: number }) =>
  fc.record({ r: fc.integer(rows), c: fc.integer(cols) }).chain(({ r, c }) =>
    fc.array(fc.array(fc.integer({ min: 0, max: 1 }), { minLength: c, maxLength: c }), { minLength: r, maxLength: r }).map((d) => ({ d, c })));

function masksOf(m: BitMatrix): number[] {
  const out: number[] = [];
  for (let r = 0; r < m.rows; r++) out.push(toMask(Array.from({ length: m.cols }, (_, c) => (rowSupport(m, r).includes(c) ? 1 : 0))));
  return out.sort((a, b) => a - b);
}

describe('combinations', () => {
  it('unranking lists the t-subsets in lexicographic order', () => {
    const subsets = (K: number, t: number, from = 0): number[][] =>
      t === 0 ? [[]] : Array.from({ length: Math.max(0, K - from) }, (_, i) => from + i).flatMap((c) => subsets(K, t - 1, c + 1).map((s) => [c, ...s]));
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 11 }), fc.integer({ min: 1, max: 11 }), (K, t0) => {
        const t = Math.min(t0, K);
        const expected = subsets(K, t);
        expect(binomial(K, t)).toBe(expected.length);
        const idx = new Int32Array(t);
        expected.forEach((s, r) => {
          unrankCombination(K, t, r, idx);
          expect([...idx]).toEqual(s);
        });
      }),
      { numRuns: 30 },
    );
  });

  it('binomial coefficients (common practice: Pascal)', () => {
    expect(binomial(27, 7)).toBe(888030);
    expect(binomial(78, 11)).toBe(7778680504140);
    expect(binomial(10, 11)).toBe(0);
  });

  it('a level split into chunks finds the same hits as one pass', () => {
    fc.assert(
      fc.property(denseMatrix({ min: 2, max: 8 }, { min: 8, max: 40 }), fc.integer({ min: 1, max: 4 }), fc.integer({ min: 1, max: 9 }), ({ d, c }, t0, chunk) => {
        const plan = planEnumeration(augmentedBasis(fromDense(d, c)));
        if (plan.dim === 0) return;
        const m = plan.matrices[0]!;
        const t = Math.min(t0, plan.dim);
        const whole: number[] = [];
        expect(scanLevel(m, t, 0, binomial(plan.dim, t), c, whole)).toBe(binomial(plan.dim, t));
        expect(whole.length).toBe(t * binomial(plan.dim, t)); // W = n keeps every combination
        const pieces: number[] = [];
        for (let s = 0; s < binomial(plan.dim, t); s += chunk) scanLevel(m, t, s, Math.min(chunk, binomial(plan.dim, t) - s), c, pieces);
        expect(pieces).toEqual(whole);
      }),
      { numRuns: 60 },
    );
  });
});

describe('information sets', () => {
  it('are disjoint, have the stated ranks, and the systematic forms are unit vectors on them', () => {
    fc.assert(
      fc.property(denseMatrix({ min: 1, max: 10 }, { min: 4, max: 50 }), ({ d, c }) => {
        const b = augmentedBasis(fromDense(d, c));
        const plan = planEnumeration(b, 3);
        const used = new Set<number>();
        for (const s of plan.sets) {
          for (const col of s.columns) {
            expect(used.has(col)).toBe(false);
            used.add(col);
          }
          expect(s.deficit).toBe(plan.dim - s.rank);
        }
        if (plan.dim > 0) expect(plan.sets[0]!.rank).toBe(plan.dim);
        plan.matrices.forEach((m, j) => {
          const cols = plan.sets[j]!.columns;
          for (let i = 0; i < m.dim; i++) {
            for (let q = 0; q < cols.length; q++) {
              const bit = (m.full[i * m.codeWords + (cols[q]! >>> 5)]! >>> (cols[q]! & 31)) & 1;
              expect(bit).toBe(i === q && m.pivot[i] === 1 ? 1 : 0);
            }
          }
        });
      }),
      { numRuns: 80 },
    );
  });

  it('bound: Σ max(0, t_j + 1 − deficit_j), and n + 1 once a set is fully enumerated', () => {
    const b = buildFamily('cyclic:n=23,g=x^11+x^10+x^6+x^5+x^4+x^2+1');
    if (b.kind !== 'classical') throw new Error('classical');
    const plan = planEnumeration(augmentedBasis(b.generator!));
    expect(plan.sets.map((s) => s.rank)).toEqual([12, 11]);
    expect(boundForLevels(plan, [0, 0])).toBe(1);
    expect(boundForLevels(plan, [3, 3])).toBe(4 + 3);
    expect(boundForLevels(plan, [12, 0])).toBe(24);
    const s = new EnumerationSchedule(plan);
    const order: string[] = [];
    for (let i = 0; i < 4; i++) {
      const u = s.next()!;
      order.push(`${u.set}@${u.level}`);
      s.complete(u);
    }
    expect(order).toEqual(['0@1', '1@1', '0@2', '1@2']);
  });
});

describe('enumerateUpTo returns exactly the words of weight ≤ W', () => {
  it('random small codes, without and with a filter, against brute force', () => {
    fc.assert(
      fc.property(
        denseMatrix({ min: 1, max: 9 }, { min: 3, max: 18 }),
        fc.integer({ min: 0, max: 8 }),
        fc.array(fc.array(fc.integer({ min: 0, max: 1 }), { minLength: 18, maxLength: 18 }), { minLength: 0, maxLength: 3 }),
        fc.boolean(),
        ({ d, c }, W, f0, useFilter) => {
          const filterDense = f0.map((r) => r.slice(0, c));
          const filter = useFilter && filterDense.length > 0 ? fromDense(filterDense, c) : undefined;
          const r = enumerateUpTo(fromDense(d, c), W, filter, { chunkSize: 5 });
          expect(r.complete).toBe(true);
          expect(r.proof.bound).toBeGreaterThan(Math.min(W, c));
          expect(masksOf(r.words)).toEqual(bruteWordsUpTo(d, W, filter ? filterDense : undefined));
          r.weights.forEach((w, i) => expect(w).toBe(rowSupport(r.words, i).length));
        },
      ),
      { numRuns: 150 },
    );
  });

  it('adaptive mode keeps exactly the lightest filtered words', () => {
    fc.assert(
      fc.property(denseMatrix({ min: 1, max: 9 }, { min: 3, max: 18 }), ({ d, c }) => {
        const r = enumerateUpTo(fromDense(d, c), c, undefined, { adaptive: true });
        const all = bruteWordsUpTo(d, c);
        if (all.length === 0) {
          expect(r.words.rows).toBe(0);
          return;
        }
        const min = Math.min(...all.map((x) => rowSupportOfMask(x).length));
        expect(r.maxWeight).toBe(min);
        expect(r.complete).toBe(true);
        expect(masksOf(r.words)).toEqual(bruteWordsUpTo(d, min).filter((x) => rowSupportOfMask(x).length === min));
      }),
      { numRuns: 80 },
    );
  });

  it('Golay [23,12]: A7 = 253, A8 = 506', () => {
    const b = buildFamily('cyclic:n=23,g=x^11+x^10+x^6+x^5+x^4+x^2+1');
    if (b.kind !== 'classical') throw new Error('classical');
    const r = enumerateUpTo(b.generator!, 8);
    expect(r.complete).toBe(true);
    // source: MacWilliams & Sloane, The Theory of Error-Correcting Codes (1977): weight distribution of the Golay code
    expect(r.weights.filter((w) => w === 7).length).toBe(253);
    expect(r.weights.filter((w) => w === 8).length).toBe(506);
    expect(r.weights.every((w) => w >= 7)).toBe(true);
  });

  it('a budget too small leaves the result marked incomplete with the bound reached', () => {
    const b = buildFamily('cyclic:n=23,g=x^11+x^10+x^6+x^5+x^4+x^2+1');
    if (b.kind !== 'classical') throw new Error('classical');
    const r = enumerateUpTo(b.generator!, 8, undefined, { budget: 100 });
    expect(r.complete).toBe(false);
    expect(r.proof.bound).toBeLessThanOrEqual(8);
    expect(r.proof.combinations).toBeLessThanOrEqual(100);
    // every word listed is a genuine light codeword even so
    for (const w of r.weights) expect(w).toBeGreaterThanOrEqual(7);
  });
});

function rowSupportOfMask(x: number): number[] {
  const out: number[] = [];
  for (let j = 0; j < 31; j++) if ((x >>> j) & 1) out.push(j);
  return out;
}

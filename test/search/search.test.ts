import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildFamily } from '../../src/codes/families/index.js';
import { type BitMatrix, fromDense, packSupport, rank, RowSpaceSolver } from '../../src/gf2/index.js';
import { openPool } from '../../src/parallel/pool.js';
import { runSearch, supportSize, type SearchOptions } from '../../src/search/run.js';
import { bruteRowspaceWords } from '../oracles/rowspace-words.js';

const inline = await openPool(0);

function css(spec: string) {
  const b = buildFamily(spec);
  if (b.kind !== 'css') throw new Error('expected css');
  return b;
}

const key = (w: number[][]) => new Set(w.map((s) => s.join(',')));

async function search(h: BitMatrix, o: Partial<SearchOptions> & { maxWeight: number }, symmetry?: ReturnType<typeof css>['symmetry'], pool = inline) {
  return runSearch({ side: 'x', h, symmetry }, { method: 'auto', seed: 1, maxWords: 1e6, ...o }, { pool });
}

describe('row-space search against brute force', () => {
  const small = fc.record({ r: fc.integer({ min: 1, max: 9 }), c: fc.integer({ min: 4, max: 40 }), d: fc.double({ min: 0.1, max: 0.6, noNaN: true }) })
    .chain(({ r, c, d }) => fc.array(fc.array(fc.double({ min: 0, max: 1, noNaN: true }).map((x) => (x < d ? 1 : 0)), { minLength: c, maxLength: c }), { minLength: r, maxLength: r }).map((m) => fromDense(m, c)));

  it('exhaustive enumeration returns exactly the brute-force set', async () => {
    await fc.assert(fc.asyncProperty(small, fc.integer({ min: 1, max: 12 }), async (h, W) => {
      const r = await search(h, { maxWeight: W, method: 'exhaustive' });
      expect(key(r.words)).toEqual(bruteRowspaceWords(h, W));
      expect(r.complete).toBe(true);
    }), { numRuns: 40 });
  });

  it('information-set search: only true words, and with enough iterations the full set', async () => {
    await fc.assert(fc.asyncProperty(small, fc.integer({ min: 1, max: 10 }), fc.integer({ min: 0, max: 1000 }), async (h, W, seed) => {
      // Lee–Brickell / Stern with p ≤ 2 can reach weight W only when W − 2 ≤ n − k (else the planner refuses)
      fc.pre(W - 2 <= supportSize(h) - rank(h));
      const truth = bruteRowspaceWords(h, W);
      const few = await search(h, { maxWeight: W, method: 'isd', iterations: 3, seed });
      const solver = new RowSpaceSolver(h);
      for (const w of few.words) {
        expect(truth.has(w.join(','))).toBe(true);
        expect(solver.contains(packSupport(h.cols, w))).toBe(true);
        expect(w.length).toBeLessThanOrEqual(W);
      }
      const full = await search(h, { maxWeight: W, method: 'isd', targetMiss: 1e-12, seed });
      expect(key(full.words)).toEqual(truth);
      for (let w = 1; w <= W; w++) expect(full.counts[w]).toBe([...truth].filter((s) => s.split(',').length === w).length);
    }), { numRuns: 30 });
  });
});

describe('published codes', () => {
  const gb48 = css('gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17'); // source: Panteleev & Kalachev, Quantum 5, 585 (2021)

  it('gb [[48,6]] rowspace(HX): exhaustive list (weight ≤ 12) and information-set search at miss 1e-6 agree exactly', async () => {
    const ex = await search(gb48.code.hx, { maxWeight: 12, method: 'exhaustive' });
    expect(ex.complete).toBe(true);
    expect(ex.counts[8]).toBe(24); // the 24 rows of weight 8 (brute force over the 2^21 combinations, here and below)
    expect(ex.original.length).toBe(24);
    const isd = await search(gb48.code.hx, { maxWeight: 12, method: 'isd', targetMiss: 1e-6 }, gb48.symmetry);
    expect(isd.method).toBe('isd');
    expect(Math.max(...Object.values(isd.missProbability))).toBeLessThan(1e-6);
    expect(key(isd.words)).toEqual(key(ex.words));
    const plain = await search(gb48.code.hx, { maxWeight: 12, method: 'isd', targetMiss: 1e-6 });
    expect(key(plain.words)).toEqual(key(ex.words));
  });

  it('bb [[72,12]]: orbit expansion returns the same set as a plain search (weight ≤ 12)', async () => {
    const bb72 = css('bb:l=6,m=6,A=x^3+y+y^2,B=y^3+x+x^2'); // source: Bravyi et al., Nature 627, 778 (2024)
    const plain = await search(bb72.code.hx, { maxWeight: 12, method: 'isd', targetMiss: 1e-9 });
    const orb = await search(bb72.code.hx, { maxWeight: 12, method: 'isd', targetMiss: 1e-9 }, bb72.symmetry);
    expect(key(orb.words)).toEqual(key(plain.words));
    // one orbit of the 36-element shift group holds the 36 rows
    expect(orb.counts[6]).toBe(36);
    expect(orb.orbits[6]).toBe(1);
    expect(plain.orbits[6]).toBe(36);
  });

  it('the same seed and iterations give the same words for any worker count', async () => {
    const bb = css('bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2');
    const pool = await openPool(2);
    try {
      const a = await search(bb.code.hx, { maxWeight: 12, method: 'isd', iterations: 60, seed: 5 }, undefined, inline);
      const b = await search(bb.code.hx, { maxWeight: 12, method: 'isd', iterations: 60, seed: 5 }, undefined, pool);
      expect(b.words).toEqual(a.words);
      expect(b.iterations).toBe(a.iterations);
      const c = await search(bb.code.hx, { maxWeight: 12, method: 'isd', iterations: 60, seed: 6 }, undefined, pool);
      expect(c.seed).toBe(6);
    } finally {
      await pool.close();
    }
  });
});

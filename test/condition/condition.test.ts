import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildFamily } from '../../src/codes/families/index.js';
import { parseBudget } from '../../src/condition/budget.js';
import { verifyCandidates } from '../../src/condition/candidates.js';
import { conditionSide, matrixFigures } from '../../src/condition/condition.js';
import { ShortCycleDelta } from '../../src/condition/cycle-delta.js';
import { STRATEGIES } from '../../src/condition/select.js';
import { equals, multiply, packedSupport, packSupport, rank, rowSupport, RowSpaceSolver, supports } from '../../src/gf2/index.js';
import { openPool } from '../../src/parallel/pool.js';
import { runSearch } from '../../src/search/run.js';
import { bruteShortCycles } from '../oracles/short-cycles.js';

const sparseRows = fc.record({ r: fc.integer({ min: 1, max: 9 }), c: fc.integer({ min: 2, max: 12 }) }).chain(({ r, c }) =>
  fc.array(fc.uniqueArray(fc.integer({ min: 0, max: c - 1 }), { minLength: 0, maxLength: Math.min(c, 6) }), { minLength: r, maxLength: r }).map((rows) => ({ rows, c })));

describe('incremental 4- and 6-cycle counts', () => {
  it('summed deltas equal brute-force counts, in any row order, with repeated rows', () => {
    fc.assert(fc.property(sparseRows, fc.boolean(), ({ rows, c }, dup) => {
      const all = dup && rows.length > 0 ? [...rows, rows[0]!] : rows;
      const figs = matrixFigures(c, all.map((r) => packSupport(c, r)), 'serial', 1);
      const b = bruteShortCycles(all);
      expect(figs.cycles['4']).toBe(b.c4);
      expect(figs.cycles['6']).toBe(b.c6);
    }), { numRuns: 300 });
  });

  it('K(a,b) closed forms: C(a,2)C(b,2) 4-cycles and C(a,3)C(b,3)·3!·2!/2 6-cycles', () => {
    // common practice: counting alternating arrangements in the complete bipartite graph
    const ch = (n: number, k: number) => (k > n ? 0 : k === 2 ? (n * (n - 1)) / 2 : (n * (n - 1) * (n - 2)) / 6);
    for (const [a, b] of [[2, 2], [3, 3], [4, 5], [6, 4]] as const) {
      const full = Array.from({ length: a }, () => Array.from({ length: b }, (_, j) => j));
      const f = matrixFigures(b, full.map((r) => packSupport(b, r)), 'serial', 1);
      expect(f.cycles['4']).toBe(ch(a, 2) * ch(b, 2));
      expect(f.cycles['6']).toBe((ch(a, 3) * ch(b, 3) * 6 * 2) / 2);
    }
  });

  it('a delta query does not change the state', () => {
    const d = new ShortCycleDelta(6);
    d.add(packSupport(6, [0, 1, 2]));
    const q = packSupport(6, [1, 2, 3]);
    expect(d.delta(q)).toEqual(d.delta(q));
    expect(d.delta(q).d4).toBe(1);
  });
});

describe('conditioning', () => {
  const gb = buildFamily('gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17');
  if (gb.kind !== 'css') throw new Error('css');
  const hx = gb.code.hx;

  it('properties: rows in the row space, map·H = matrix, rank kept, budgets respected, seed-deterministic', async () => {
    const pool = await openPool(0);
    const found = await runSearch({ side: 'x', h: hx }, { maxWeight: 12, method: 'exhaustive', seed: 1, maxWords: 1e5 }, { pool });
    const cands = verifyCandidates(hx, found.words, 'search');
    expect(cands.dropped.originalRow).toBe(24);
    expect(cands.words.length).toBe(found.wordCount - 24);
    const budgets = fc.record({
      extra: fc.option(fc.integer({ min: 0, max: 200 }), { nil: undefined }),
      edges: fc.option(fc.integer({ min: 192, max: 2000 }), { nil: undefined }),
      colDegree: fc.option(fc.integer({ min: 4, max: 40 }), { nil: undefined }),
      rowWeight: fc.option(fc.integer({ min: 8, max: 12 }), { nil: undefined }),
    });
    fc.assert(fc.property(budgets, fc.constantFrom('lightest', 'balanced', 'fewest-cycles', 'orbits'), fc.integer({ min: 0, max: 5 }), fc.constantFrom('all', 'minimal'), (b, strategy, seed, basis) => {
      const budget = Object.fromEntries(Object.entries(b).filter(([, v]) => v !== undefined));
      const req = { side: 'x', h: hx, candidates: cands, basis: basis as 'all' | 'minimal', budget, latencyModel: 'serial' as const, iterations: 3, strategy: strategy as (typeof STRATEGIES)[number], seed, symmetry: gb.symmetry };
      const out = conditionSide(req);
      const solver = new RowSpaceSolver(hx);
      for (let r = 0; r < out.matrix.rows; r++) expect(solver.contains(out.matrix.data.subarray(r * out.matrix.stride, (r + 1) * out.matrix.stride))).toBe(true);
      expect(equals(multiply(out.map, hx), out.matrix)).toBe(true);
      expect(rank(out.matrix)).toBe(rank(hx));
      if (budget.extra !== undefined) expect(out.added.length).toBeLessThanOrEqual(budget.extra);
      if (budget.edges !== undefined) expect(out.after.edges).toBeLessThanOrEqual(budget.edges);
      if (budget.colDegree !== undefined) expect(out.after.maxColDegree).toBeLessThanOrEqual(budget.colDegree);
      if (budget.rowWeight !== undefined) for (const i of out.added) expect(cands.weights[i]).toBeLessThanOrEqual(budget.rowWeight);
      const again = conditionSide(req);
      expect(supports(again.matrix)).toEqual(supports(out.matrix));
      // no duplicate rows
      expect(new Set(supports(out.matrix).map((s) => s.join(','))).size).toBe(out.matrix.rows);
    }), { numRuns: 25 });
  });

  it('the orbits strategy keeps the matrix quasi-cyclic', () => {
    const cands = verifyCandidates(hx, [], 'none');
    expect(cands.words.length).toBe(0);
    const found = [] as number[][];
    // weight-12 words: sums of two rows sharing 2 columns; take them from pairs of rows
    for (let a = 0; a < hx.rows; a++) for (let b = a + 1; b < hx.rows; b++) {
      const s = new Set(rowSupport(hx, a));
      const sum = [...rowSupport(hx, b).filter((c) => !s.delete(c)), ...s].sort((x, y) => x - y);
      if (sum.length === 12) found.push(sum);
    }
    const c2 = verifyCandidates(hx, found, 'pairs');
    const out = conditionSide({ side: 'x', h: hx, candidates: c2, basis: 'all', budget: parseBudget('extra=60'), latencyModel: 'serial', iterations: 3, strategy: 'orbits', seed: 1, symmetry: gb.symmetry });
    expect(out.added.length).toBeGreaterThan(0);
    expect(out.added.length).toBeLessThanOrEqual(60);
    // shifting every added row by one position (in both halves) gives an added row again
    const addedSet = new Set(out.added.map((i) => packedSupport(c2.words[i]!, 0, c2.words[i]!.length).join(',')));
    for (const key of addedSet) {
      const shifted = key.split(',').map(Number).map((c) => (c < 24 ? (c + 1) % 24 : 24 + ((c - 24 + 1) % 24))).sort((x, y) => x - y).join(',');
      expect(addedSet.has(shifted)).toBe(true);
    }
  });

  it('refuses words outside the row space and budgets the original already breaks', () => {
    expect(() => verifyCandidates(hx, [[0]], 'w.json')).toThrow(/w.json: word 1 .* not in the row space/);
    const cands = verifyCandidates(hx, [], 'none');
    expect(() => conditionSide({ side: 'x', h: hx, candidates: cands, basis: 'all', budget: parseBudget('rows=10'), latencyModel: 'serial', iterations: 3, strategy: 'lightest', seed: 1 })).toThrow(/rows=10 is below the 24 rows/);
    expect(() => parseBudget('rows=1,speed=3')).toThrow(/unknown key "speed"/);
  });
});

describe('the pruning counter agrees with the cycle census', () => {
  it('4- and 6-cycle totals equal cycleCensus on random matrices', async () => {
    const { cycleCensus } = await import('../../src/graph/census.js');
    const { fromRowVectors } = await import('../../src/gf2/index.js');
    fc.assert(fc.property(sparseRows, ({ rows, c }) => {
      const vs = rows.map((r) => packSupport(c, r));
      const figs = matrixFigures(c, vs, 'serial', 1);
      const census = cycleCensus(fromRowVectors(c, vs), 6);
      expect(BigInt(figs.cycles['4'])).toBe(census.cycles.get(4) ?? 0n);
      expect(BigInt(figs.cycles['6'])).toBe(census.cycles.get(6) ?? 0n);
    }), { numRuns: 200 });
  });
});

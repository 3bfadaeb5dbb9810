import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildFamily } from '../../src/codes/families/index.js';
import { fromDense, toDense, zeros, setBit, type BitMatrix } from '../../src/gf2/bitmatrix.js';
import { packedOverlap } from '../../src/gf2/popcount.js';
import { cycleCensus } from '../../src/graph/census.js';
import { homTarget } from '../../src/graph/homomorphisms.js';
import { quotientCycleCount } from '../../src/graph/quotientcycles.js';
import { sidedGraph, tannerGraph } from '../../src/graph/tanner.js';
import { InputError } from '../../src/errors.js';
import { oracleCensus } from '../oracles/cycles.js';
import { smallMatrix, transposeDense } from './matrices.js';

const C = (n: number, k: number): bigint => {
  let r = 1n;
  for (let i = 0; i < k; i++) r = (r * BigInt(n - i)) / BigInt(i + 1);
  return r;
};
const fact = (n: number): bigint => (n <= 1 ? 1n : BigInt(n) * fact(n - 1));

function complete(a: number, b: number): BitMatrix {
  const m = zeros(a, b);
  for (let i = 0; i < a; i++) for (let j = 0; j < b; j++) setBit(m, i, j, 1);
  return m;
}

function css(spec: string) {
  const b = buildFamily(spec);
  if (b.kind !== 'css') throw new Error(spec);
  return b.code;
}

/** Census and brute force agree on counts, girth and per-node participation. */
function expectMatchesOracle(dense: number[][], cols: number, maxLength: number, quotientOnly = false): void {
  const m = fromDense(dense, cols);
  const got = cycleCensus(m, maxLength, { quotientOnly });
  const want = oracleCensus(dense, cols, maxLength);
  for (let L = 4; L <= maxLength; L += 2) expect(got.cycles.get(L)).toBe(BigInt(want.counts.get(L)!));
  expect(got.girth).toBe(want.girth);
  expect(Array.from(got.rowCycles.get(4)!)).toEqual(want.perRow.get(4));
  expect(Array.from(got.colCycles.get(4)!)).toEqual(want.perCol.get(4));
  if (want.girth !== null && want.girth <= maxLength) {
    expect(Array.from(got.rowCycles.get(want.girth)!)).toEqual(want.perRow.get(want.girth));
    expect(Array.from(got.colCycles.get(want.girth)!)).toEqual(want.perCol.get(want.girth));
  }
}

describe('cycle census against brute-force enumeration', () => {
  it('lengths 4, 6, 8 by the overlap formulas, either side iterated', () => {
    fc.assert(
      fc.property(smallMatrix(7, 8), ({ m, cols }) => {
        expectMatchesOracle(m, cols, 8);
        expectMatchesOracle(transposeDense(m, cols), m.length, 8);
      }),
      { numRuns: 150 },
    );
  });

  it('lengths 10 and 12 by the quotient method', () => {
    fc.assert(
      fc.property(smallMatrix(5, 6), ({ m, cols }) => {
        expectMatchesOracle(m, cols, 12);
      }),
      { numRuns: 25 },
    );
  });

  it('the quotient method alone also gives 4, 6, 8', () => {
    fc.assert(
      fc.property(smallMatrix(5, 6), ({ m, cols }) => {
        expectMatchesOracle(m, cols, 8, true);
      }),
      { numRuns: 25 },
    );
  });

  it('mid-size graphs (no brute force): quotient counts with the sides swapped agree, and with the 8-cycle formula', () => {
    const mid = fc
      .record({ rows: fc.integer({ min: 17, max: 24 }), cols: fc.integer({ min: 17, max: 22 }), density: fc.double({ min: 0.12, max: 0.3, noNaN: true }) })
      .chain(({ rows, cols, density }) =>
        fc.array(fc.array(fc.double({ min: 0, max: 1, noNaN: true }).map((x) => (x < density ? 1 : 0)), { minLength: cols, maxLength: cols }), { minLength: rows, maxLength: rows }).map((m) => ({ m, cols })),
      );
    fc.assert(
      fc.property(mid, ({ m, cols }) => {
        const h = fromDense(m, cols);
        const base = cycleCensus(h, 10);
        const other = homTarget(sidedGraph(tannerGraph(h), base.iterated !== 'rows'));
        for (const k of [4, 5]) expect(quotientCycleCount(other, k)).toBe(base.cycles.get(2 * k));
      }),
      { numRuns: 3 },
    );
  });

  it('toric code HX: girth 6 at L = 3, 8 from L = 4 on; counts up to 12 (brute force)', () => {
    for (const L of [3, 4, 5]) {
      const hx = css(`toric:L=${L}`).hx;
      expectMatchesOracle(toDense(hx), hx.cols, 12);
      expect(cycleCensus(hx, 8).girth).toBe(L === 3 ? 6 : 8);
    }
  });

  it('bb [[144,12]] HX up to length 10 (brute force)', () => {
    const hx = css('bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2').hx;
    expectMatchesOracle(toDense(hx), hx.cols, 10);
  });
});

describe('closed forms', () => {
  it('#4-cycles = Σ over row pairs C(overlap, 2), on larger random matrices', () => {
    // common practice
    fc.assert(
      fc.property(smallMatrix(30, 60), ({ m, cols }) => {
        const h = fromDense(m, cols);
        let want = 0n;
        for (let i = 0; i < h.rows; i++) {
          for (let j = i + 1; j < h.rows; j++) want += C(packedOverlap(h.data, i * h.stride, h.data, j * h.stride, h.stride), 2);
        }
        expect(cycleCensus(h, 4).cycles.get(4)).toBe(want);
      }),
      { numRuns: 60 },
    );
  });

  it('K(a,b): C(a,2)·C(b,2) 4-cycles, C(a,3)·C(b,3)·3!·2!/2 6-cycles, C(a,k)·C(b,k)·k!·(k−1)!/2 2k-cycles', () => {
    // common practice: a 2k-cycle of K(a,b) picks k nodes on each side and arranges them alternately;
    // the k!·k! alternating sequences give each cycle 2k times (k rotations × 2 directions), so
    // k!·(k−1)!/2 cycles per choice — 3!·2!/2 = 6 for k = 3, 4!·3!/2 = 72 for k = 4.
    const want = (a: number, b: number, k: number) => (C(a, k) * C(b, k) * fact(k) * fact(k - 1)) / 2n;
    for (const [a, b] of [[2, 2], [3, 5], [4, 4], [6, 5], [7, 9]] as const) {
      const c = cycleCensus(complete(a, b), 12);
      expect(c.cycles.get(4)).toBe(C(a, 2) * C(b, 2));
      expect(c.cycles.get(6)).toBe(C(a, 3) * C(b, 3) * 6n);
      for (const k of [4, 5, 6]) expect(c.cycles.get(2 * k)).toBe(want(a, b, k));
      expect(c.girth).toBe(4);
      // every row lies on (a−1)·C(b,2) 4-cycles
      expect(Array.from(c.rowCycles.get(4)!)).toEqual(new Array(a).fill(Number(BigInt(a - 1) * C(b, 2))));
    }
  });

  it('counts beyond 2^53 stay exact (K(150,200) up to 8, K(30,36) up to 12 through the modular path)', () => {
    const want = (a: number, b: number, k: number) => (C(a, k) * C(b, k) * fact(k) * fact(k - 1)) / 2n;
    const big = cycleCensus(complete(150, 200), 8);
    expect(big.cycles.get(8)).toBe(want(150, 200, 4));
    expect(big.cycles.get(8)! > 2n ** 53n).toBe(true);
    const mid = cycleCensus(complete(30, 36), 12);
    for (const k of [5, 6]) expect(mid.cycles.get(2 * k)).toBe(want(30, 36, k));
    expect(mid.cycles.get(12)! > 2n ** 53n).toBe(true);
  });

  it('forests: girth null, every count and participation zero', () => {
    // common practice: a forest has no cycles
    const forest = fc
      .record({ nodes: fc.integer({ min: 1, max: 40 }), seedEdges: fc.array(fc.nat(), { minLength: 40, maxLength: 40 }), keep: fc.array(fc.boolean(), { minLength: 40, maxLength: 40 }) })
      .map(({ nodes, seedEdges, keep }) => {
        // node i > 0 attaches to an earlier node of the other side (or stays a root when `keep` is false)
        const side = [0];
        const idx = [0];
        let rows = 1;
        let cols = 0;
        const edges: [number, number][] = [];
        for (let i = 1; i < nodes; i++) {
          const parent = seedEdges[i]! % i;
          const s = keep[i] ? 1 - side[parent]! : side[parent]!;
          side.push(s);
          idx.push(s === 0 ? rows++ : cols++);
          if (keep[i]) edges.push(s === 0 ? [idx[i]!, idx[parent]!] : [idx[parent]!, idx[i]!]);
        }
        const m = zeros(rows, Math.max(cols, 1));
        for (const [r, c] of edges) setBit(m, r, c, 1);
        return m;
      });
    fc.assert(
      fc.property(forest, fc.boolean(), (m, long) => {
        const c = cycleCensus(m, long && m.rows <= 16 && m.cols <= 16 ? 12 : 8);
        expect(c.girth).toBeNull();
        for (const n of c.cycles.values()) expect(n).toBe(0n);
        expect(c.rowCycles.get(4)!.every((x) => x === 0)).toBe(true);
        expect(c.colCycles.get(4)!.every((x) => x === 0)).toBe(true);
      }),
      { numRuns: 40 },
    );
  });

  it('participation sums: Σ over rows (and over columns) of L-cycles through them = (L/2)·N_L', () => {
    fc.assert(
      fc.property(smallMatrix(25, 30), ({ m, cols }) => {
        const c = cycleCensus(fromDense(m, cols), 8);
        for (const L of c.rowCycles.keys()) {
          const n = c.cycles.get(L)!;
          expect(BigInt(c.rowCycles.get(L)!.reduce((a, b) => a + b, 0))).toBe((BigInt(L) / 2n) * n);
          expect(BigInt(c.colCycles.get(L)!.reduce((a, b) => a + b, 0))).toBe((BigInt(L) / 2n) * n);
        }
      }),
      { numRuns: 40 },
    );
  });

  it('a girth beyond the maximum length is found and counted (cycle C_20 as a 10×10 matrix)', () => {
    // common practice: the cycle graph C_2n has girth 2n and one cycle
    const m = zeros(10, 10);
    for (let i = 0; i < 10; i++) {
      setBit(m, i, i, 1);
      setBit(m, i, (i + 1) % 10, 1);
    }
    const c = cycleCensus(m, 8);
    expect(c.girth).toBe(20);
    expect(c.cycles.get(20)).toBe(1n);
    expect(c.methods.get(20)).toBe('breadth-first-search');
    expect(Array.from(c.rowCycles.get(20)!)).toEqual(new Array(10).fill(1));
  });

  it('rejects a bad maximum length', () => {
    for (const L of [2, 3, 7, 14, 0.5]) expect(() => cycleCensus(zeros(2, 2), L)).toThrow(InputError);
  });

  it('refuses quotient work above the limit', () => {
    expect(() => cycleCensus(complete(10, 10), 12, { workLimit: 10 })).toThrow(/steps/);
  });
});

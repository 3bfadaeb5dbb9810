import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  RowSpaceSolver, echelon, fromDense, getBit, kernel, multiply, multiplyTransposed, packSupport,
  rank, toDense, transpose, vstack, fromRowVectors, rowSupport, packedSupport, zeros, colWeights, rowWeights,
} from '../../src/gf2/index.js';
import { denseMultiply, denseRank, denseTranspose } from '../oracles/dense-gf2.js';

/** Random dense matrices, including widths that straddle the 32-bit word boundary. */
const denseMatrix = (maxRows = 40, maxCols = 70) =>
  fc.record({ rows: fc.integer({ min: 0, max: maxRows }), cols: fc.integer({ min: 1, max: maxCols }), density: fc.double({ min: 0.05, max: 0.95, noNaN: true }) })
    .chain(({ rows, cols, density }) =>
      fc.array(fc.array(fc.double({ min: 0, max: 1, noNaN: true }).map((x) => (x < density ? 1 : 0)), { minLength: cols, maxLength: cols }), { minLength: rows, maxLength: rows })
        .map((m) => ({ m, cols })));

describe('packed GF(2) engine against the dense oracle', () => {
  it('dense round trip and tail bits stay zero', () => {
    fc.assert(fc.property(denseMatrix(), ({ m, cols }) => {
      const p = fromDense(m, cols);
      expect(toDense(p)).toEqual(m);
      if (p.stride > 0) for (let r = 0; r < p.rows; r++) expect(p.data[r * p.stride + p.stride - 1]! & ~p.tailMask).toBe(0);
    }));
  });

  it('rank agrees with the oracle and rank(A) = rank(Aᵀ)', () => {
    fc.assert(fc.property(denseMatrix(), ({ m, cols }) => {
      const a = fromDense(m, cols);
      const r = rank(a);
      expect(r).toBe(denseRank(m, cols));
      expect(rank(transpose(a))).toBe(r);
      expect(echelon(a).rank).toBe(r);
    }));
  });

  it('transpose and products agree with the oracle', () => {
    fc.assert(fc.property(denseMatrix(20, 40), denseMatrix(20, 40), ({ m, cols }, { m: m2, cols: c2 }) => {
      const a = fromDense(m, cols);
      expect(toDense(transpose(a))).toEqual(denseTranspose(m, cols));
      // A·B with B shaped cols × c2 built from m2 rows cycled
      const bDense = Array.from({ length: cols }, (_, i) => m2.length ? m2[i % m2.length]! : new Array<number>(c2).fill(0));
      const b = fromDense(bDense, c2);
      expect(toDense(multiply(a, b))).toEqual(denseMultiply(m, bDense, c2));
      expect(toDense(multiplyTransposed(a, transpose(b)))).toEqual(denseMultiply(m, bDense, c2));
    }));
  });

  it('kernel: H·Kᵀ = 0, rows independent, dim = n − rank', () => {
    fc.assert(fc.property(denseMatrix(), ({ m, cols }) => {
      const h = fromDense(m, cols);
      const k = kernel(h);
      expect(k.rows).toBe(cols - rank(h));
      expect(rank(k)).toBe(k.rows);
      const prod = multiplyTransposed(h, k);
      expect(prod.data.every((x) => x === 0)).toBe(true);
    }));
  });

  it('solve round-trips: x·H = v for v in the row space; null otherwise; membership = rank test', () => {
    fc.assert(fc.property(denseMatrix(30, 50), fc.array(fc.boolean(), { minLength: 30, maxLength: 30 }), fc.array(fc.integer({ min: 0, max: 49 }), { maxLength: 10 }),
      ({ m, cols }, pick, extra) => {
        const h = fromDense(m, cols);
        const solver = new RowSpaceSolver(h);
        // a combination of rows
        const comb = zeros(1, h.rows);
        pick.slice(0, h.rows).forEach((b, i) => { if (b) comb.data[i >>> 5]! |= 1 << (i & 31); });
        const v = multiply(comb, h);
        const x = solver.solve(v.data);
        expect(x).not.toBeNull();
        const back = multiply(fromRowVectors(h.rows, [x!]), h);
        expect(back.data).toEqual(v.data);
        // an arbitrary vector: membership agrees with rank(H) = rank([H; v])
        const u = packSupport(cols, extra.filter((c) => c < cols));
        const inSpace = rank(vstack(h, fromRowVectors(cols, [u]))) === rank(h);
        expect(solver.contains(u)).toBe(inSpace);
        expect(solver.solve(u) !== null).toBe(inSpace);
      }));
  });

  it('supports, weights and bit access are consistent', () => {
    fc.assert(fc.property(denseMatrix(), ({ m, cols }) => {
      const a = fromDense(m, cols);
      const rw = rowWeights(a);
      const cw = colWeights(a);
      for (let r = 0; r < a.rows; r++) {
        const s = rowSupport(a, r);
        expect(s).toEqual(m[r]!.flatMap((v, j) => (v ? [j] : [])));
        expect(rw[r]).toBe(s.length);
        expect(packedSupport(a.data, r * a.stride, a.stride)).toEqual(s);
      }
      for (let c = 0; c < cols; c++) expect(cw[c]).toBe(m.reduce((t, row) => t + row[c]!, 0));
      for (let r = 0; r < a.rows; r++) for (let c = 0; c < cols; c++) expect(getBit(a, r, c)).toBe(m[r]![c]);
    }));
  });
});

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fromDense } from '../../src/gf2/bitmatrix.js';
import { structureSummary } from '../../src/graph/structure.js';
import { tannerGraph } from '../../src/graph/tanner.js';
import { smallMatrix } from './matrices.js';

describe('structure summary', () => {
  it('histograms and row-overlap counts match direct counting', () => {
    fc.assert(
      fc.property(smallMatrix(20, 40), ({ m, cols }) => {
        const s = structureSummary(tannerGraph(fromDense(m, cols)));
        const rowW = new Map<number, number>();
        for (const r of m) {
          const w = r.reduce((a, b) => a + b, 0);
          rowW.set(w, (rowW.get(w) ?? 0) + 1);
        }
        const colW = new Map<number, number>();
        for (let c = 0; c < cols; c++) {
          const w = m.reduce((a, r) => a + r[c]!, 0);
          colW.set(w, (colW.get(w) ?? 0) + 1);
        }
        const pairs: number[] = [];
        for (let i = 0; i < m.length; i++) {
          for (let j = i + 1; j < m.length; j++) {
            let o = 0;
            for (let c = 0; c < cols; c++) o += m[i]![c]! & m[j]![c]!;
            while (pairs.length <= o) pairs.push(0);
            pairs[o]! += 1;
          }
        }
        if (pairs.length === 0) pairs.push(0);
        expect(new Map(s.rowWeights)).toEqual(rowW);
        expect(new Map(s.colDegrees)).toEqual(colW);
        expect([...s.rowOverlaps]).toEqual(pairs);
        expect(s.edges).toBe(m.flat().reduce((a, b) => a + b, 0));
      }),
      { numRuns: 100 },
    );
  });
});

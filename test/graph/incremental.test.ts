import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fromDense, packSupport } from '../../src/gf2/bitmatrix.js';
import { cycleCensus } from '../../src/graph/census.js';
import { CycleTracker } from '../../src/graph/incremental.js';
import { InputError } from '../../src/errors.js';
import { oracleCensus } from '../oracles/cycles.js';
import { smallMatrix } from './matrices.js';

/** A random script of additions (row supports) and removals (picks among the rows present). */
const script = (cols: number) =>
  fc.array(
    fc.oneof(
      fc.record({ op: fc.constant('add' as const), row: fc.uniqueArray(fc.integer({ min: 0, max: cols - 1 }), { maxLength: cols }) }),
      fc.record({ op: fc.constant('remove' as const), pick: fc.nat() }),
    ),
    { maxLength: 10 },
  );

function counts(t: CycleTracker): { four: bigint; six: bigint } {
  const c = cycleCensus(t.matrix(), 6);
  return { four: c.cycles.get(4)!, six: c.cycles.get(6)! };
}

describe('incremental 4- and 6-cycle deltas', () => {
  for (const table of [true, false]) {
    it(`deltas equal full recounts (${table ? 'with' : 'without'} the column-overlap table)`, () => {
      fc.assert(
        fc.property(
          smallMatrix(8, 9).chain((c) => script(c.cols).map((s) => ({ ...c, s }))),
          ({ m, cols, s }) => {
            const t = new CycleTracker(cols, fromDense(m, cols), { table });
            expect({ four: BigInt(t.four), six: BigInt(t.six) }).toEqual(counts(t));
            for (const step of s) {
              const before = counts(t);
              if (step.op === 'add') {
                const packed = step.row.length % 2 === 0;
                const predicted = t.deltaAdd(packed ? packSupport(cols, step.row) : step.row);
                const { delta } = t.add(step.row);
                expect(delta).toEqual(predicted);
                const after = counts(t);
                expect(BigInt(delta.four)).toBe(after.four - before.four);
                expect(BigInt(delta.six)).toBe(after.six - before.six);
              } else {
                const ids = t.ids();
                if (ids.length === 0) continue;
                const id = ids[step.pick % ids.length]!;
                const predicted = t.deltaRemove(id);
                expect(t.remove(id)).toEqual(predicted);
                const after = counts(t);
                expect(BigInt(predicted.four)).toBe(before.four - after.four);
                expect(BigInt(predicted.six)).toBe(before.six - after.six);
              }
              expect({ four: BigInt(t.four), six: BigInt(t.six) }).toEqual(counts(t));
            }
          },
        ),
        { numRuns: 120 },
      );
    });
  }

  it('the delta of removing a row is the number of cycles through it (brute force)', () => {
    fc.assert(
      fc.property(smallMatrix(6, 7), ({ m, cols }) => {
        const t = new CycleTracker(cols, fromDense(m, cols));
        const o = oracleCensus(m, cols, 6);
        for (const id of t.ids()) expect(t.deltaRemove(id)).toEqual({ four: o.perRow.get(4)![id], six: o.perRow.get(6)![id] });
      }),
      { numRuns: 60 },
    );
  });

  it('ids stay stable; bad rows and ids are input errors', () => {
    const t = new CycleTracker(4, fromDense([[1, 1, 0, 0], [1, 1, 1, 0]], 4));
    expect(t.add([2, 3]).id).toBe(2);
    t.remove(0);
    expect(t.ids()).toEqual([1, 2]);
    expect(t.support(1)).toEqual([0, 1, 2]);
    expect(() => t.remove(0)).toThrow(InputError);
    expect(() => t.deltaAdd([4])).toThrow(InputError);
    expect(() => t.deltaAdd([1, 1])).toThrow(InputError);
    expect(() => t.deltaAdd(new Uint32Array(2))).toThrow(InputError);
  });
});

import fc from 'fast-check';

/**
 * Small dense 0/1 matrices for oracle comparisons: random density, optionally a repeated row, an
 * all-zero column and a column with a single one (degree 0 and 1 nodes), so that those cases always
 * come up.
 */
export interface DenseCase {
  readonly m: number[][];
  readonly cols: number;
}

export function smallMatrix(maxRows: number, maxCols: number): fc.Arbitrary<DenseCase> {
  return fc
    .record({
      rows: fc.integer({ min: 1, max: maxRows }),
      cols: fc.integer({ min: 1, max: maxCols }),
      density: fc.double({ min: 0.15, max: 0.85, noNaN: true }),
      repeat: fc.boolean(),
      zeroCol: fc.boolean(),
      leafCol: fc.boolean(),
    })
    .chain(({ rows, cols, density, repeat, zeroCol, leafCol }) =>
      fc
        .tuple(
          fc.array(fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { minLength: cols, maxLength: cols }), { minLength: rows, maxLength: rows }),
          fc.nat(),
        )
        .map(([u, pick]) => {
          const m = u.map((r) => r.map((x) => (x < density ? 1 : 0)));
          if (repeat && m.length > 1) m[m.length - 1] = [...m[pick % (m.length - 1)]!];
          let c = cols;
          if (zeroCol && c < maxCols + 2) {
            m.forEach((r) => r.push(0));
            c++;
          }
          if (leafCol) {
            m.forEach((r, i) => r.push(i === pick % m.length ? 1 : 0));
            c++;
          }
          return { m, cols: c };
        }),
    );
}

/** The transpose of a dense matrix (to exercise both choices of the iterated side). */
export function transposeDense(m: readonly (readonly number[])[], cols: number): number[][] {
  return Array.from({ length: cols }, (_, c) => m.map((r) => r[c]!));
}

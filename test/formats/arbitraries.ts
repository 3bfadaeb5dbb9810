import fc from 'fast-check';
import { type BitMatrix, fromDense } from '../../src/gf2/index.js';

/** Widths that straddle the 32-bit word boundaries, mixed with small and zero widths. */
const width = fc.oneof(
  fc.integer({ min: 0, max: 8 }),
  fc.constantFrom(31, 32, 33, 63, 64, 65),
  fc.integer({ min: 0, max: 70 }),
);

/** Random binary matrices (0..maxRows rows, widths near 32/64 included), with a random density. */
export function matrixArb(maxRows = 24): fc.Arbitrary<BitMatrix> {
  return fc
    .record({ rows: fc.integer({ min: 0, max: maxRows }), cols: width, density: fc.double({ min: 0, max: 1, noNaN: true }) })
    .chain(({ rows, cols, density }) =>
      fc
        .array(fc.array(fc.double({ min: 0, max: 1, noNaN: true }).map((x) => (x < density ? 1 : 0)), { minLength: cols, maxLength: cols }), {
          minLength: rows,
          maxLength: rows,
        })
        .map((d) => fromDense(d, cols)),
    );
}

/** One edit to a text: the kinds of damage a file picks up by hand editing, truncation or bad tools. */
export type Mutation =
  | { op: 'delete'; at: number }
  | { op: 'insert'; at: number; ch: string }
  | { op: 'replace'; at: number; ch: string }
  | { op: 'truncate'; at: number }
  | { op: 'duplicateLine'; at: number }
  | { op: 'deleteLine'; at: number };

/** Characters that matter to at least one of the formats. */
const alphabet = fc.constantFrom(...'0123456789 \n\t\r-+.eE%#{}[],:"xM'.split(''), 'null', '99999', '%%MatrixMarket');

export const mutationArb: fc.Arbitrary<Mutation> = fc.oneof(
  fc.record({ op: fc.constant('delete' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('insert' as const), at: fc.nat(), ch: alphabet }),
  fc.record({ op: fc.constant('replace' as const), at: fc.nat(), ch: alphabet }),
  fc.record({ op: fc.constant('truncate' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('duplicateLine' as const), at: fc.nat() }),
  fc.record({ op: fc.constant('deleteLine' as const), at: fc.nat() }),
);

/** Apply a mutation; positions are taken modulo the text (or line count) so every edit lands. */
export function mutate(text: string, mu: Mutation): string {
  const n = text.length;
  switch (mu.op) {
    case 'delete': {
      if (n === 0) return text;
      const i = mu.at % n;
      return text.slice(0, i) + text.slice(i + 1);
    }
    case 'insert': {
      const i = mu.at % (n + 1);
      return text.slice(0, i) + mu.ch + text.slice(i);
    }
    case 'replace': {
      if (n === 0) return mu.ch;
      const i = mu.at % n;
      return text.slice(0, i) + mu.ch + text.slice(i + 1);
    }
    case 'truncate':
      return text.slice(0, mu.at % (n + 1));
    case 'duplicateLine':
    case 'deleteLine': {
      const lines = text.split('\n');
      const i = mu.at % lines.length;
      if (mu.op === 'duplicateLine') lines.splice(i, 0, lines[i]!);
      else lines.splice(i, 1);
      return lines.join('\n');
    }
  }
}

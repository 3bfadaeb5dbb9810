import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/errors.js';
import { type BitMatrix, equals, getBit, rowSupport, toDense, zeros } from '../../src/gf2/index.js';
import { type MatrixFormat, parseMatrix, serializeMatrix } from '../../src/formats/index.js';
import { parseAlist } from '../../src/formats/alist.js';
import { parseDense } from '../../src/formats/dense.js';
import { parseJsonMatrix } from '../../src/formats/json.js';
import { parseMatrixMarket } from '../../src/formats/matrix-market.js';
import { matrixArb } from './arbitraries.js';

const FORMATS: readonly MatrixFormat[] = ['mtx', 'alist', 'dense', 'json'];
const fitsDense = (m: BitMatrix) => m.rows > 0 && m.cols > 0;

function expectSame(got: BitMatrix, want: BitMatrix): void {
  expect([got.rows, got.cols]).toEqual([want.rows, want.cols]);
  expect(toDense(got)).toEqual(toDense(want));
  expect(equals(got, want)).toBe(true);
}

describe('round trip: parse(serialize(m)) = m', () => {
  for (const f of FORMATS) {
    it(`${f}, format given`, () => {
      fc.assert(
        fc.property(matrixArb(), (m) => {
          fc.pre(f !== 'dense' || fitsDense(m));
          expectSame(parseMatrix(serializeMatrix(m, f), `t.${f}`, f), m);
        }),
        { numRuns: 150 },
      );
    });

    it(`${f}, format sniffed from content (no extension)`, () => {
      fc.assert(
        fc.property(matrixArb(), (m) => {
          fc.pre(f !== 'dense' || fitsDense(m));
          expectSame(parseMatrix(serializeMatrix(m, f), 'matrix-file'), m);
        }),
        { numRuns: 60 },
      );
    });
  }

  it('serialize is stable: serialize(parse(serialize(m))) = serialize(m)', () => {
    fc.assert(
      fc.property(matrixArb(), fc.constantFrom(...FORMATS), (m, f) => {
        fc.pre(f !== 'dense' || fitsDense(m));
        const s = serializeMatrix(m, f);
        expect(serializeMatrix(parseMatrix(s, 'x', f), f)).toBe(s);
      }),
      { numRuns: 100 },
    );
  });

  it('dense refuses a matrix with no rows or no columns (documented choice), other formats keep it', () => {
    for (const [r, c] of [[0, 0], [0, 5], [3, 0]] as const) {
      const m = zeros(r, c);
      expect(() => serializeMatrix(m, 'dense')).toThrow(InputError);
      expect(() => serializeMatrix(m, 'dense')).toThrow(/mtx, alist or json/);
      for (const f of ['mtx', 'alist', 'json'] as const) expectSame(parseMatrix(serializeMatrix(m, f), 'x', f), m);
    }
  });
});

// Writers for the other accepted dialects, written independently of src/formats from the format
// descriptions, so the parsers are checked on text they did not produce.
function shuffle<T>(xs: T[], keys: number[]): T[] {
  return xs.map((x, i) => ({ x, k: keys[i % Math.max(keys.length, 1)] ?? 0 })).sort((a, b) => a.k - b.k).map((e) => e.x);
}

function mtxCoordinateInteger(m: BitMatrix, zerosAt: boolean[], keys: number[]): string {
  const entries: string[] = [];
  let z = 0;
  for (let r = 0; r < m.rows; r++) {
    for (let c = 0; c < m.cols; c++) {
      if (getBit(m, r, c)) entries.push(`${r + 1} ${c + 1} 1`);
      else if (zerosAt[z++ % Math.max(zerosAt.length, 1)]) entries.push(`  ${r + 1}\t${c + 1}   0  `); // explicit zero = no entry
    }
  }
  const body = shuffle(entries, keys);
  return [`%%matrixmarket MATRIX Coordinate Integer GENERAL`, '% a comment', '%', `${m.rows} ${m.cols} ${body.length}`, ...body.flatMap((e, i) => (i % 5 === 0 ? ['', e] : [e]))].join('\r\n');
}

function mtxArray(m: BitMatrix): string {
  const vals: string[] = [];
  for (let c = 0; c < m.cols; c++) for (let r = 0; r < m.rows; r++) vals.push(String(getBit(m, r, c))); // column-major
  return ['%%MatrixMarket matrix array integer general', `% ${m.rows} by ${m.cols}`, `${m.rows} ${m.cols}`, ...vals].join('\n') + '\n';
}

function alistUnpadded(m: BitMatrix): string {
  const rows = Array.from({ length: m.rows }, (_, r) => rowSupport(m, r).map((c) => c + 1));
  const cols: number[][] = Array.from({ length: m.cols }, () => []);
  rows.forEach((cs, r) => cs.forEach((c) => cols[c - 1]!.push(r + 1)));
  const maxC = Math.max(0, ...cols.map((l) => l.length));
  const maxR = Math.max(0, ...rows.map((l) => l.length));
  return [`${m.cols} ${m.rows}`, `${Math.min(maxC + 1, m.rows)} ${maxR}`, cols.map((l) => l.length).join(' '), rows.map((l) => l.length).join(' '),
    ...cols.map((l) => l.join('  ')), ...rows.map((l) => `${l.join(' ')} 0`)].join('\n');
}

function denseSpaced(m: BitMatrix): string {
  const lines = ['# a dense matrix', ''];
  for (let r = 0; r < m.rows; r++) {
    lines.push(`${toDense(m)[r]!.join(r % 2 ? ' ' : '\t')}   # row ${r}`);
    if (r % 3 === 0) lines.push('   ', '#');
  }
  return lines.join('\n');
}

function jsonLoose(m: BitMatrix): string {
  const support = Array.from({ length: m.rows }, (_, r) => rowSupport(m, r).reverse());
  return JSON.stringify({ support, cols: m.cols, rows: m.rows }, null, 2);
}

describe('other accepted dialects read back the same matrix', () => {
  it('Matrix Market coordinate integer (explicit zeros, any order, mixed case, CRLF, blank lines)', () => {
    fc.assert(fc.property(matrixArb(12), fc.array(fc.boolean(), { minLength: 1, maxLength: 9 }), fc.array(fc.nat(), { maxLength: 20 }), (m, z, keys) => {
      expectSame(parseMatrixMarket(mtxCoordinateInteger(m, z, keys), 'x.mtx'), m);
    }), { numRuns: 80 });
  });

  it('Matrix Market array integer, column-major', () => {
    fc.assert(fc.property(matrixArb(12), (m) => expectSame(parseMatrixMarket(mtxArray(m), 'x.mtx'), m)), { numRuns: 80 });
  });

  it('alist with unpadded lists, a generous maximum and trailing zero on row lists', () => {
    fc.assert(fc.property(matrixArb(), (m) => expectSame(parseAlist(alistUnpadded(m), 'x.alist'), m)), { numRuns: 80 });
  });

  it('dense with spaces, tabs, comments and blank lines', () => {
    fc.assert(fc.property(matrixArb(), (m) => {
      fc.pre(fitsDense(m));
      expectSame(parseDense(denseSpaced(m), 'x.txt'), m);
    }), { numRuns: 80 });
  });

  it('JSON with keys in another order, indented, supports unsorted', () => {
    fc.assert(fc.property(matrixArb(), (m) => expectSame(parseJsonMatrix(jsonLoose(m), 'x.json'), m)), { numRuns: 80 });
  });
});

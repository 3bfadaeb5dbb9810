import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { FormatError } from '../../src/errors.js';
import { type BitMatrix, wordsFor } from '../../src/gf2/index.js';
import { type MatrixFormat, parseMatrix, serializeMatrix } from '../../src/formats/index.js';
import { matrixArb, mutate, mutationArb } from './arbitraries.js';

const FORMATS: readonly MatrixFormat[] = ['mtx', 'alist', 'dense', 'json'];

/** A parse result is acceptable only as a well-formed BitMatrix. */
function expectWellFormed(m: BitMatrix): void {
  expect(Number.isInteger(m.rows) && m.rows >= 0).toBe(true);
  expect(Number.isInteger(m.cols) && m.cols >= 0).toBe(true);
  expect(m.stride).toBe(wordsFor(m.cols));
  expect(m.data).toBeInstanceOf(Uint32Array);
  expect(m.data.length).toBe(m.rows * m.stride);
  for (let r = 0; r < m.rows && m.stride > 0; r++) expect(m.data[r * m.stride + m.stride - 1]! & ~m.tailMask).toBe(0);
}

/** Parse and accept exactly two outcomes: a well-formed matrix, or a one-line FormatError on a real line. */
function parseOrFormatError(text: string, file: string, format?: MatrixFormat): void {
  let m: BitMatrix;
  try {
    m = parseMatrix(text, file, format);
  } catch (e) {
    if (!(e instanceof FormatError)) throw new Error(`not a FormatError: ${String(e)}\n--- input ---\n${text}`);
    expect(e.file).toBe(file);
    expect(Number.isInteger(e.line)).toBe(true);
    expect(e.line).toBeGreaterThanOrEqual(1);
    expect(e.line).toBeLessThanOrEqual(Math.max(text.split('\n').length, 1));
    expect(e.message).not.toMatch(/[\n\r]/);
    expect(e.message.startsWith(`${file}:${e.line}: `)).toBe(true);
    expect(e.problem.length).toBeGreaterThan(0);
    return;
  }
  expectWellFormed(m);
}

describe('fuzz: mutated files give a matrix or a FormatError, nothing else', () => {
  for (const f of FORMATS) {
    it(`${f}`, () => {
      fc.assert(
        fc.property(matrixArb(10), fc.array(mutationArb, { minLength: 1, maxLength: 4 }), (m, mus) => {
          fc.pre(f !== 'dense' || (m.rows > 0 && m.cols > 0));
          const text = mus.reduce(mutate, serializeMatrix(m, f));
          parseOrFormatError(text, `fuzz.${f}`, f);
          parseOrFormatError(text, 'fuzz-sniffed'); // through content sniffing
        }),
        { numRuns: 400 },
      );
    });
  }

  it('arbitrary strings', () => {
    fc.assert(
      fc.property(fc.string({ maxLength: 60 }), fc.constantFrom<MatrixFormat | undefined>(...FORMATS, undefined), (text, f) => parseOrFormatError(text, 'junk', f)),
      { numRuns: 400 },
    );
  });
});

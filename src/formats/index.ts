import { readFileSync } from 'node:fs';
import { fileProblem, writeTextFileAtomic } from './atomic.js';
import { InputError } from '../errors.js';
import type { BitMatrix } from '../gf2/bitmatrix.js';
import { parseAlist, serializeAlist } from './alist.js';
import { parseDense, serializeDense } from './dense.js';
import { parseJsonMatrix, serializeJsonMatrix } from './json.js';
import { rejectEmpty } from './lines.js';
import { parseMatrixMarket, serializeMatrixMarket } from './matrix-market.js';
import { detectFormat, type MatrixFormat } from './sniff.js';

export type { MatrixFormat } from './sniff.js';
export { detectFormat, formatFromExtension, sniffFormat } from './sniff.js';
export { parseAlist, serializeAlist, parseDense, serializeDense, parseJsonMatrix, serializeJsonMatrix, parseMatrixMarket, serializeMatrixMarket };

const PARSERS: Record<MatrixFormat, (text: string, file: string) => BitMatrix> = {
  mtx: parseMatrixMarket,
  alist: parseAlist,
  dense: parseDense,
  json: parseJsonMatrix,
};

const WRITERS: Record<MatrixFormat, (m: BitMatrix) => string> = {
  mtx: serializeMatrixMarket,
  alist: serializeAlist,
  dense: serializeDense,
  json: serializeJsonMatrix,
};

/**
 * Parse matrix text (pure). `file` is only used in error messages. Without `format`, the format comes
 * from the extension of `file`, else from the content. Throws FormatError(file, line, problem).
 */
export function parseMatrix(text: string, file: string, format?: MatrixFormat): BitMatrix {
  rejectEmpty(text, file);
  return PARSERS[format ?? detectFormat(file, text)](text, file);
}

/** Matrix text in the given format (pure). InputError when the format cannot hold the matrix (dense, 0 rows). */
export function serializeMatrix(m: BitMatrix, format: MatrixFormat): string {
  try {
    return WRITERS[format](m);
  } catch (e) {
    // V8's string size limit (about 2^29 characters) reached while joining the text
    if (e instanceof RangeError && /string length/i.test(e.message)) {
      throw new InputError(`the ${format} text of a ${m.rows} x ${m.cols} matrix is larger than the longest string Node can build`);
    }
    throw e;
  }
}

/** Read and parse a matrix file; format by extension, else by content. One-line InputError on any problem. */
export function readMatrixFile(path: string): BitMatrix {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    throw fileProblem(path, e, 'read');
  }
  return parseMatrix(text, path);
}

/**
 * Write a matrix file atomically (temporary file, then rename); the text is built before anything is touched.
 */
export function writeMatrixFile(path: string, m: BitMatrix, format: MatrixFormat): void {
  writeTextFileAtomic(path, serializeMatrix(m, format));
}

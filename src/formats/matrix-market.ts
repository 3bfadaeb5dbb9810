import { FormatError } from '../errors.js';
import { type BitMatrix, rowSupport, setBit, zeros } from '../gf2/bitmatrix.js';
import { checkSize, quote, rejectEmpty, splitLines, tokens, wholeNumber } from './lines.js';

/**
 * Matrix Market exchange format (NIST), restricted to binary matrices.
 *
 * Accepted headers (keywords case-insensitive):
 *   %%MatrixMarket matrix coordinate pattern general   one "i j" line per 1-entry
 *   %%MatrixMarket matrix coordinate integer general   "i j v" lines, v ∈ {0, 1}; v = 0 is no entry
 *   %%MatrixMarket matrix array integer general        one value (0 or 1) per line, column-major
 * Lines starting with `%` and blank lines after the header are ignored. The first other line is the size
 * line ("M N NNZ" for coordinate, "M N" for array). Indices are 1-based. A coordinate entry given twice is
 * an error; fewer entries than stated is a truncated file; more is an error too.
 * We write coordinate pattern general, entries in row-major order.
 */

const SUPPORTED = 'supported: matrix coordinate pattern general, matrix coordinate integer general, matrix array integer general';

type Layout = 'coordinate' | 'array';
type Field = 'pattern' | 'integer';

function parseHeader(line: string, file: string): { layout: Layout; field: Field } {
  const t = tokens(line);
  if (t[0]?.toLowerCase() !== '%%matrixmarket') {
    throw new FormatError(file, 1, `expected the Matrix Market header "%%MatrixMarket matrix coordinate pattern general", found ${quote(line.trim())}`);
  }
  if (t.length !== 5) throw new FormatError(file, 1, `malformed Matrix Market header: expected 4 words after %%MatrixMarket, found ${t.length - 1}; ${SUPPORTED}`);
  const [object, layout, field, symmetry] = t.slice(1).map((w) => w.toLowerCase()) as [string, string, string, string];
  const kind = `${object} ${layout} ${field} ${symmetry}`;
  if (object !== 'matrix') throw new FormatError(file, 1, `unsupported Matrix Market object "${kind}"; ${SUPPORTED}`);
  if (layout !== 'coordinate' && layout !== 'array') throw new FormatError(file, 1, `unknown Matrix Market format "${layout}"; ${SUPPORTED}`);
  if (field !== 'pattern' && field !== 'integer') throw new FormatError(file, 1, `unsupported Matrix Market field "${field}" (only binary matrices); ${SUPPORTED}`);
  if (symmetry !== 'general') throw new FormatError(file, 1, `unsupported Matrix Market symmetry "${symmetry}"; ${SUPPORTED}`);
  if (layout === 'array' && field === 'pattern') throw new FormatError(file, 1, `"array pattern" is not a valid Matrix Market type; ${SUPPORTED}`);
  return { layout, field };
}

/** A 0/1 value token of an integer matrix; throws naming the line otherwise. */
function binaryValue(tok: string, file: string, line: number): number {
  if (!/^[+-]?\d+$/.test(tok)) throw new FormatError(file, line, `entry value ${quote(tok)} is not an integer (the field is integer)`);
  const v = Number(tok);
  if (v !== 0 && v !== 1) throw new FormatError(file, line, `entry value ${tok} is not 0 or 1`);
  return v;
}

function index(tok: string, limit: number, what: string, file: string, line: number): number {
  const v = wholeNumber(tok);
  if (v === undefined) throw new FormatError(file, line, `${what} index ${quote(tok)} is not a whole number`);
  if (v < 1 || v > limit) throw new FormatError(file, line, `${what} index ${v} is out of range 1..${limit}`);
  return v - 1;
}

/** Parse a Matrix Market file. Throws FormatError (1-based line) on anything outside the accepted dialect. */
export function parseMatrixMarket(text: string, file: string): BitMatrix {
  rejectEmpty(text, file);
  const lines = splitLines(text);
  const { layout, field } = parseHeader(lines[0]!, file);
  const lastLine = lines.length;

  // Size line: first line after the header that is neither blank nor a comment.
  let i = 1;
  const skip = () => {
    while (i < lines.length && (lines[i]!.trim() === '' || lines[i]!.trimStart().startsWith('%'))) i++;
  };
  skip();
  if (i >= lines.length) throw new FormatError(file, lastLine, 'file ends before the size line (truncated?)');
  const sizeLine = i + 1;
  const st = tokens(lines[i]!);
  const want = layout === 'coordinate' ? 3 : 2;
  const shape = layout === 'coordinate' ? '"rows columns entries"' : '"rows columns"';
  if (st.length !== want) throw new FormatError(file, sizeLine, `size line must be ${shape}, found ${st.length} value${st.length === 1 ? '' : 's'}`);
  const size = st.map(wholeNumber);
  size.forEach((v, k) => {
    if (v === undefined) throw new FormatError(file, sizeLine, `size line value ${quote(st[k]!)} is not a whole number`);
  });
  const rows = size[0]!;
  const cols = size[1]!;
  checkSize(file, sizeLine, rows, cols);
  i++;

  // Positions of the 1-entries, collected first so the matrix is allocated only for a well-formed file.
  const oneRows: number[] = [];
  const oneCols: number[] = [];

  if (layout === 'coordinate') {
    const nnz = size[2]!;
    if (nnz > rows * cols) throw new FormatError(file, sizeLine, `${nnz} entries cannot fit in a ${rows} x ${cols} matrix`);
    const seen = new Map<number, number>();
    const perLine = field === 'pattern' ? 2 : 3;
    const form = field === 'pattern' ? '"row column"' : '"row column value"';
    let count = 0;
    for (; ; i++) {
      skip();
      if (i >= lines.length) break;
      const ln = i + 1;
      if (count === nnz) throw new FormatError(file, ln, `more entries than the ${nnz} stated on the size line (line ${sizeLine})`);
      const t = tokens(lines[i]!);
      if (t.length !== perLine) throw new FormatError(file, ln, `expected an entry ${form}, found ${t.length} value${t.length === 1 ? '' : 's'}`);
      const r = index(t[0]!, rows, 'row', file, ln);
      const c = index(t[1]!, cols, 'column', file, ln);
      const v = field === 'pattern' ? 1 : binaryValue(t[2]!, file, ln);
      const key = r * cols + c;
      const before = seen.get(key);
      if (before !== undefined) throw new FormatError(file, ln, `entry (${r + 1}, ${c + 1}) given twice (first on line ${before})`);
      seen.set(key, ln);
      count++;
      if (v === 1) {
        oneRows.push(r);
        oneCols.push(c);
      }
    }
    if (count < nnz) throw new FormatError(file, lastLine, `file ends after ${count} of ${nnz} entries (truncated?)`);
  } else {
    const total = rows * cols;
    let count = 0;
    for (; ; i++) {
      skip();
      if (i >= lines.length) break;
      const ln = i + 1;
      if (count === total) throw new FormatError(file, ln, `more values than the ${rows} x ${cols} = ${total} stated on the size line (line ${sizeLine})`);
      const t = tokens(lines[i]!);
      if (t.length !== 1) throw new FormatError(file, ln, `expected one value per line, found ${t.length}`);
      if (binaryValue(t[0]!, file, ln) === 1) {
        oneRows.push(count % rows); // column-major: value k is row k mod M of column floor(k / M)
        oneCols.push(Math.floor(count / rows));
      }
      count++;
    }
    if (count < total) throw new FormatError(file, lastLine, `file ends after ${count} of ${total} values (truncated?)`);
  }

  const m = zeros(rows, cols);
  for (let k = 0; k < oneRows.length; k++) setBit(m, oneRows[k]!, oneCols[k]!, 1);
  return m;
}

/** Matrix Market coordinate pattern general, entries row by row, columns ascending. */
export function serializeMatrixMarket(m: BitMatrix): string {
  const body: string[] = [];
  for (let r = 0; r < m.rows; r++) for (const c of rowSupport(m, r)) body.push(`${r + 1} ${c + 1}`);
  const head = ['%%MatrixMarket matrix coordinate pattern general', '% written by overcheck', `${m.rows} ${m.cols} ${body.length}`];
  return `${[...head, ...body].join('\n')}\n`;
}

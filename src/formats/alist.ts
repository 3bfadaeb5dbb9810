import { FormatError } from '../errors.js';
import { type BitMatrix, getBit, rowSupport, setBit, zeros } from '../gf2/bitmatrix.js';
import { checkSize, quote, rejectEmpty, splitLines, tokens, wholeNumber } from './lines.js';

/**
 * alist: the sparse-matrix text convention from MacKay's LDPC work. For an M × N matrix (M rows = checks,
 * N columns = variables), line by line:
 *
 *   1           N M                          (columns, rows)
 *   2           max column weight, max row weight
 *   3           N column weights
 *   4           M row weights
 *   5..N+4      for each column, the 1-based row indices of its 1-entries
 *   N+5..N+M+4  for each row, the 1-based column indices of its 1-entries
 *
 * A list may be padded with trailing zeros (the usual convention pads every list to the maximum weight);
 * a list of weight 0 may be a blank line or zeros only. Each list must hold exactly its stated weight of
 * distinct indices, no weight may exceed the stated maximum, and the row lists must describe the same
 * matrix as the column lists. Blank lines after the last row list are allowed; any other trailing text
 * is an error. Lines at the end of the file that would be blank (empty lists, or an empty weights line
 * when there are no rows or no columns) may be left out: they carry nothing. We write lists padded with zeros to the maximum weight.
 */

function numbersOn(line: string, file: string, ln: number, what: string): number[] {
  return tokens(line).map((t) => {
    const v = wholeNumber(t);
    if (v === undefined) throw new FormatError(file, ln, `${what}: ${quote(t)} is not a whole number`);
    return v;
  });
}

/** Parse an alist file. Throws FormatError (1-based line) on bad counts, ranges or inconsistent lists. */
export function parseAlist(text: string, file: string): BitMatrix {
  rejectEmpty(text, file);
  const lines = splitLines(text);
  /** Line i (0-based); past the end, a line that would be blank (`blankOk`) reads as '', else truncated. */
  const lineAt = (i: number, what: string, blankOk = false): string => {
    if (i >= lines.length && blankOk) return '';
    if (i >= lines.length) throw new FormatError(file, Math.max(lines.length, 1), `file ends before ${what} (line ${i + 1}; truncated?)`);
    return lines[i]!;
  };

  const dims = numbersOn(lineAt(0, 'the size line'), file, 1, 'size line "columns rows"');
  if (dims.length !== 2) throw new FormatError(file, 1, `size line must be "columns rows" (two numbers), found ${dims.length} value${dims.length === 1 ? '' : 's'}`);
  const [n, m] = dims as [number, number];
  checkSize(file, 1, m, n);

  const maxes = numbersOn(lineAt(1, 'the maximum weights line'), file, 2, 'maximum weights line');
  if (maxes.length !== 2) throw new FormatError(file, 2, `second line must be "max column weight, max row weight" (two numbers), found ${maxes.length} value${maxes.length === 1 ? '' : 's'}`);
  const [maxCol, maxRow] = maxes as [number, number];
  if (maxCol > m) throw new FormatError(file, 2, `maximum column weight ${maxCol} exceeds the ${m} rows`);
  if (maxRow > n) throw new FormatError(file, 2, `maximum row weight ${maxRow} exceeds the ${n} columns`);

  const colW = numbersOn(lineAt(2, 'the column weights line', n === 0), file, 3, 'column weights');
  if (colW.length !== n) throw new FormatError(file, 3, `expected ${n} column weights, found ${colW.length}`);
  colW.forEach((w, j) => {
    if (w > maxCol) throw new FormatError(file, 3, `column ${j + 1} has weight ${w}, above the maximum ${maxCol} stated on line 2`);
  });
  const rowW = numbersOn(lineAt(3, 'the row weights line', m === 0), file, 4, 'row weights');
  if (rowW.length !== m) throw new FormatError(file, 4, `expected ${m} row weights, found ${rowW.length}`);
  rowW.forEach((w, r) => {
    if (w > maxRow) throw new FormatError(file, 4, `row ${r + 1} has weight ${w}, above the maximum ${maxRow} stated on line 2`);
  });
  const colTotal = colW.reduce((a, b) => a + b, 0);
  const rowTotal = rowW.reduce((a, b) => a + b, 0);
  if (colTotal !== rowTotal) throw new FormatError(file, 4, `row weights add up to ${rowTotal} but column weights (line 3) add up to ${colTotal}`);

  /** Indices of one list line: `weight` distinct values in 1..limit, then only zero padding. */
  const list = (i: number, weight: number, limit: number, kind: string, other: string, no: number): number[] => {
    const ln = i + 1;
    const vals = numbersOn(lineAt(i, `the list of ${kind} ${no}`, weight === 0), file, ln, `${kind} ${no} list`);
    let k = 0;
    while (k < vals.length && vals[k] !== 0) k++;
    const idx = vals.slice(0, k);
    for (let p = k; p < vals.length; p++) {
      if (vals[p] !== 0) throw new FormatError(file, ln, `${kind} ${no}: ${other} index ${vals[p]} after zero padding (padding zeros must come last)`);
    }
    if (idx.length !== weight) throw new FormatError(file, ln, `${kind} ${no} lists ${idx.length} ${other} indices, but its weight is ${weight}`);
    const seen = new Set<number>();
    for (const v of idx) {
      if (v > limit) throw new FormatError(file, ln, `${kind} ${no}: ${other} index ${v} is out of range 1..${limit}`);
      if (seen.has(v)) throw new FormatError(file, ln, `${kind} ${no}: ${other} index ${v} is listed twice`);
      seen.add(v);
    }
    return idx;
  };

  // The header is consistent, so the matrix size is bounded by the file: safe to allocate now.
  const h = zeros(m, n);
  const colLine = new Int32Array(n);
  for (let j = 0; j < n; j++) {
    colLine[j] = 4 + j + 1;
    for (const r of list(4 + j, colW[j]!, m, 'column', 'row', j + 1)) setBit(h, r - 1, j, 1);
  }
  for (let r = 0; r < m; r++) {
    const i = 4 + n + r;
    const idx = list(i, rowW[r]!, n, 'row', 'column', r + 1);
    for (const c of idx) {
      if (!getBit(h, r, c - 1)) {
        throw new FormatError(file, i + 1, `row ${r + 1} lists column ${c}, but the list of column ${c} (line ${colLine[c - 1]}) does not contain row ${r + 1}`);
      }
    }
    const fromCols = rowSupport(h, r);
    if (fromCols.length !== idx.length) {
      const listed = new Set(idx);
      const missing = fromCols.find((c) => !listed.has(c + 1))!;
      throw new FormatError(file, i + 1, `row ${r + 1} does not list column ${missing + 1}, but the list of column ${missing + 1} (line ${colLine[missing]}) contains row ${r + 1}`);
    }
  }
  for (let i = 4 + n + m; i < lines.length; i++) {
    if (lines[i]!.trim() !== '') throw new FormatError(file, i + 1, `unexpected text after the ${m} row lists: ${quote(lines[i]!.trim())}`);
  }
  return h;
}

/** alist text for a matrix, every list padded with zeros to the maximum weight. */
export function serializeAlist(h: BitMatrix): string {
  const rowLists: number[][] = [];
  for (let r = 0; r < h.rows; r++) rowLists.push(rowSupport(h, r).map((c) => c + 1));
  const colLists: number[][] = Array.from({ length: h.cols }, () => []);
  rowLists.forEach((cs, r) => {
    for (const c of cs) colLists[c - 1]!.push(r + 1);
  });
  const maxCol = colLists.reduce((a, l) => Math.max(a, l.length), 0);
  const maxRow = rowLists.reduce((a, l) => Math.max(a, l.length), 0);
  const padded = (l: number[], to: number) => [...l, ...new Array<number>(to - l.length).fill(0)].join(' ');
  const out = [
    `${h.cols} ${h.rows}`,
    `${maxCol} ${maxRow}`,
    colLists.map((l) => l.length).join(' '),
    rowLists.map((l) => l.length).join(' '),
    ...colLists.map((l) => padded(l, maxCol)),
    ...rowLists.map((l) => padded(l, maxRow)),
  ];
  return `${out.join('\n')}\n`;
}

import { FormatError, InputError } from '../errors.js';
import { type BitMatrix, getBit, setBit, zeros } from '../gf2/bitmatrix.js';
import { quote, rejectEmpty, splitLines } from './lines.js';

/**
 * Dense text: one matrix row per line, one character `0` or `1` per entry, spaces or tabs allowed
 * anywhere between entries. `#` starts a comment that runs to the end of the line; blank and
 * comment-only lines are ignored. Every row must have as many entries as the first.
 *
 * A matrix with zero rows or zero columns has no dense text (every line of it would be blank), so
 * `serializeDense` refuses it with an InputError pointing at the other formats, and a file with no rows
 * at all is an error when read. A file cut at a line boundary cannot be told from a shorter matrix: use
 * a format with a size line when that matters. We write rows without spaces.
 */

/** Longest string V8 builds (2^29 - 24 characters on 64-bit), with a margin. */
const MAX_TEXT_LENGTH = 2 ** 29 - 64;

/** Parse dense 0/1 text. Throws FormatError (1-based line) on bad characters, ragged rows or no rows. */
export function parseDense(text: string, file: string): BitMatrix {
  rejectEmpty(text, file);
  const lines = splitLines(text);
  const rows: Uint8Array[] = [];
  let width = -1;
  let firstLine = 0;
  for (let i = 0; i < lines.length; i++) {
    const raw = lines[i]!;
    const hash = raw.indexOf('#');
    const body = hash < 0 ? raw : raw.slice(0, hash);
    const bits = new Uint8Array(body.length);
    let k = 0;
    for (let p = 0; p < body.length; p++) {
      const ch = body[p]!;
      if (ch === '0' || ch === '1') bits[k++] = ch === '1' ? 1 : 0;
      else if (ch === ' ' || ch === '\t') continue;
      else if (ch >= '2' && ch <= '9') throw new FormatError(file, i + 1, `entry ${quote(ch)} (character ${p + 1}) is not 0 or 1`);
      else throw new FormatError(file, i + 1, `unexpected character ${quote(ch)} (character ${p + 1}); rows are 0/1 characters with optional spaces`);
    }
    if (k === 0) continue; // blank or comment-only line
    if (width < 0) {
      width = k;
      firstLine = i + 1;
    } else if (k !== width) {
      throw new FormatError(file, i + 1, `row has ${k} entries, but the first row (line ${firstLine}) has ${width}`);
    }
    rows.push(bits.subarray(0, k));
  }
  if (rows.length === 0) throw new FormatError(file, 1, 'no matrix rows (only blank lines and comments)');
  const m = zeros(rows.length, width);
  rows.forEach((bits, r) => {
    for (let c = 0; c < width; c++) if (bits[c]) setBit(m, r, c, 1);
  });
  return m;
}

/** Dense text, one line of 0/1 characters per row. InputError for a matrix with no rows or no columns. */
export function serializeDense(m: BitMatrix): string {
  if (m.rows === 0 || m.cols === 0) {
    throw new InputError(`dense text cannot hold a ${m.rows} x ${m.cols} matrix (no rows or no columns); write it as mtx, alist or json`);
  }
  if (m.rows * (m.cols + 1) > MAX_TEXT_LENGTH) {
    throw new InputError(`dense text of a ${m.rows} x ${m.cols} matrix would exceed the largest string Node can build; write it as mtx, alist or json`);
  }
  const out: string[] = [];
  const chars = new Array<string>(m.cols);
  for (let r = 0; r < m.rows; r++) {
    for (let c = 0; c < m.cols; c++) chars[c] = getBit(m, r, c) ? '1' : '0';
    out.push(chars.join(''));
  }
  return `${out.join('\n')}\n`;
}

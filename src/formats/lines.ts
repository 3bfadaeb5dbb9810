import { FormatError } from '../errors.js';

/**
 * Shared text handling for the line-oriented parsers: splitting into numbered lines, the empty-file
 * check, the size limit and quoting of offending text in one-line messages.
 */

/**
 * The lines of a text, without their terminators. `\n` and `\r\n` both end a line; a final terminator
 * does not start another (empty) line. A leading byte-order mark is dropped. Line i of the result is
 * line i+1 of the file.
 */
export function splitLines(text: string): string[] {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const lines = body.split('\n');
  if (lines.length > 0 && lines[lines.length - 1] === '') lines.pop();
  for (let i = 0; i < lines.length; i++) {
    const l = lines[i]!;
    if (l.endsWith('\r')) lines[i] = l.slice(0, -1);
  }
  return lines;
}

/** Throws the "empty file" error (line 1) when the text has nothing but whitespace. */
export function rejectEmpty(text: string, file: string): void {
  if (/^[\s\ufeff]*$/.test(text)) throw new FormatError(file, 1, 'empty file');
}

/** Whitespace-separated tokens of a line. */
export function tokens(line: string): string[] {
  const t = line.trim();
  return t === '' ? [] : t.split(/\s+/);
}

/**
 * Largest matrix a parser builds, in entries (rows × cols): 2^31 bits = 256 MiB packed. Checked before
 * anything is allocated so a damaged size field cannot exhaust memory.
 */
export const MAX_ENTRIES = 2 ** 31;
/** Largest row or column count (so that indices stay 32-bit integers). */
export const MAX_DIMENSION = 2 ** 30;

/** Throws when a rows × cols matrix is beyond the limits above. */
export function checkSize(file: string, line: number, rows: number, cols: number): void {
  if (rows > MAX_DIMENSION || cols > MAX_DIMENSION || rows * cols > MAX_ENTRIES) {
    throw new FormatError(file, line, `matrix size ${rows} x ${cols} is beyond the supported limit (at most 2^31 entries, 2^30 rows or columns)`);
  }
}

/** A piece of input quoted for a one-line message: escaped, and shortened when long. */
export function quote(s: string): string {
  const short = s.length > 24 ? `${s.slice(0, 24)}…` : s;
  return JSON.stringify(short);
}

/** Parses a decimal whole number (digits only); undefined when `s` is not one or is not a safe integer. */
export function wholeNumber(s: string): number | undefined {
  if (!/^\d+$/.test(s)) return undefined;
  const v = Number(s);
  return Number.isSafeInteger(v) ? v : undefined;
}

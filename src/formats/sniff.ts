import { FormatError } from '../errors.js';
import { splitLines, tokens, wholeNumber } from './lines.js';

/** Matrix file formats overcheck reads and writes. */
export type MatrixFormat = 'mtx' | 'alist' | 'dense' | 'json';

const BY_EXTENSION: Record<string, MatrixFormat> = {
  mtx: 'mtx',
  alist: 'alist',
  txt: 'dense',
  dense: 'dense',
  json: 'json',
};

/** The format a file name's extension names (case-insensitive), if it names one. */
export function formatFromExtension(path: string): MatrixFormat | undefined {
  const base = path.slice(Math.max(path.lastIndexOf('/'), path.lastIndexOf('\\')) + 1);
  const dot = base.lastIndexOf('.');
  if (dot <= 0) return undefined;
  return BY_EXTENSION[base.slice(dot + 1).toLowerCase()];
}

/** First four lines read as an alist header: "N M", two maxima, N column weights, M row weights, equal sums. */
function looksLikeAlist(lines: readonly string[]): boolean {
  if (lines.length < 2) return false;
  const nums = [0, 1, 2, 3].map((i) => lines[i] ?? '').map((l) => tokens(l).map(wholeNumber));
  if (nums.some((row) => row.some((v) => v === undefined))) return false;
  const [dims, maxes, colW, rowW] = nums as [number[], number[], number[], number[]];
  if (dims.length !== 2 || maxes.length !== 2) return false;
  if (colW.length !== dims[0] || rowW.length !== dims[1]) return false;
  return colW.reduce((a, b) => a + b, 0) === rowW.reduce((a, b) => a + b, 0);
}

/**
 * Guess a format from content: a `%%MatrixMarket` first line, a leading `{` (JSON), an alist header, or
 * a first non-comment line of 0/1 characters (dense), tried in that order. Undefined when none fits.
 */
export function sniffFormat(text: string): MatrixFormat | undefined {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (body.trimStart().startsWith('{')) return 'json';
  const lines = splitLines(body);
  if (/^%%matrixmarket\b/i.test(lines[0]?.trimStart() ?? '')) return 'mtx';
  if (looksLikeAlist(lines)) return 'alist';
  for (const line of lines) {
    const content = line.replace(/#.*$/, '').trim();
    if (content === '') continue;
    return /^[01 \t]+$/.test(content) ? 'dense' : undefined;
  }
  return undefined;
}

/** The format for a file: its extension when it names one, else its content; FormatError when neither tells. */
export function detectFormat(file: string, text: string): MatrixFormat {
  const f = formatFromExtension(file) ?? sniffFormat(text);
  if (f !== undefined) return f;
  throw new FormatError(
    file,
    1,
    'cannot tell the file format: expected a %%MatrixMarket header, a JSON object, an alist header or rows of 0/1 ' +
      '(or name the file .mtx, .alist, .txt/.dense or .json)',
  );
}

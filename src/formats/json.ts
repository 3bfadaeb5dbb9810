import { FormatError } from '../errors.js';
import { type BitMatrix, rowSupport, setBit, zeros } from '../gf2/bitmatrix.js';
import { checkSize, quote, rejectEmpty } from './lines.js';

/**
 * JSON matrix: exactly `{"rows":R,"cols":C,"support":[[...],...]}` — R and C non-negative integers,
 * `support` an array of R arrays, row r holding the 0-based column indices of its 1-entries (integers
 * in 0..C-1, no index twice; any order). No other keys. Standard JSON (RFC 8259) otherwise. Errors name
 * the line of the offending value, so the text is parsed here with positions kept rather than by
 * JSON.parse. We write one row per line, indices ascending.
 */

type JsonNode =
  | { t: 'object'; pos: number; end: number; entries: { key: string; keyPos: number; value: JsonNode }[] }
  | { t: 'array'; pos: number; items: JsonNode[] }
  | { t: 'number'; pos: number; v: number }
  | { t: 'string'; pos: number; v: string }
  | { t: 'literal'; pos: number; v: boolean | null };

const MAX_DEPTH = 64;

/** Position-keeping JSON reader. Every failure is a FormatError on the line of the offending offset. */
class Reader {
  private i = 0;
  private readonly lineStarts: number[] = [0];

  constructor(private readonly text: string, private readonly file: string) {
    for (let p = 0; p < text.length; p++) if (text.charCodeAt(p) === 10) this.lineStarts.push(p + 1);
    if (text.charCodeAt(0) === 0xfeff) this.i = 1;
  }

  /** 1-based line of a character offset. */
  lineOf(pos: number): number {
    let lo = 0;
    let hi = this.lineStarts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >>> 1;
      if (this.lineStarts[mid]! <= pos) lo = mid;
      else hi = mid - 1;
    }
    return lo + 1;
  }

  fail(pos: number, problem: string): never {
    throw new FormatError(this.file, this.lineOf(Math.min(pos, Math.max(this.text.length - 1, 0))), problem);
  }

  private ws(): void {
    const s = this.text;
    while (this.i < s.length) {
      const c = s.charCodeAt(this.i);
      if (c === 32 || c === 9 || c === 10 || c === 13) this.i++;
      else break;
    }
  }

  private found(): string {
    if (this.i >= this.text.length) return 'the end of the file (truncated?)';
    return quote(this.text.slice(this.i, this.i + 12));
  }

  document(): JsonNode {
    const v = this.value(0);
    this.ws();
    if (this.i < this.text.length) this.fail(this.i, `unexpected text after the JSON value: ${this.found()}`);
    return v;
  }

  private value(depth: number): JsonNode {
    this.ws();
    const s = this.text;
    const pos = this.i;
    if (pos >= s.length) this.fail(pos, 'unexpected end of file (truncated?)');
    const c = s[pos]!;
    if (c === '{' || c === '[') {
      if (depth >= MAX_DEPTH) this.fail(pos, `JSON nested deeper than ${MAX_DEPTH} levels`);
      return c === '{' ? this.object(depth) : this.array(depth);
    }
    if (c === '"') return { t: 'string', pos, v: this.string() };
    if (c === '-' || (c >= '0' && c <= '9')) return this.number();
    for (const [word, v] of [['true', true], ['false', false], ['null', null]] as const) {
      if (s.startsWith(word, pos)) {
        this.i += word.length;
        return { t: 'literal', pos, v };
      }
    }
    return this.fail(pos, `expected a JSON value, found ${this.found()}`);
  }

  private object(depth: number): JsonNode {
    const pos = this.i++;
    const entries: { key: string; keyPos: number; value: JsonNode }[] = [];
    this.ws();
    if (this.text[this.i] === '}') return { t: 'object', pos, end: this.i++, entries };
    for (;;) {
      this.ws();
      const keyPos = this.i;
      if (this.text[this.i] !== '"') this.fail(this.i, `expected a quoted key, found ${this.found()}`);
      const key = this.string();
      this.ws();
      if (this.text[this.i] !== ':') this.fail(this.i, `expected ":" after key ${quote(key)}, found ${this.found()}`);
      this.i++;
      entries.push({ key, keyPos, value: this.value(depth + 1) });
      this.ws();
      const d = this.text[this.i];
      if (d === ',') {
        this.i++;
        continue;
      }
      if (d === '}') return { t: 'object', pos, end: this.i++, entries };
      this.fail(this.i, `expected "," or "}" in an object, found ${this.found()}`);
    }
  }

  private array(depth: number): JsonNode {
    const pos = this.i++;
    const items: JsonNode[] = [];
    this.ws();
    if (this.text[this.i] === ']') {
      this.i++;
      return { t: 'array', pos, items };
    }
    for (;;) {
      items.push(this.value(depth + 1));
      this.ws();
      const d = this.text[this.i];
      if (d === ',') {
        this.i++;
        continue;
      }
      if (d === ']') {
        this.i++;
        return { t: 'array', pos, items };
      }
      this.fail(this.i, `expected "," or "]" in an array, found ${this.found()}`);
    }
  }

  private string(): string {
    const s = this.text;
    const start = this.i++;
    let out = '';
    for (;;) {
      if (this.i >= s.length) this.fail(start, 'string is not closed (truncated?)');
      const c = s.charCodeAt(this.i);
      if (c === 34) {
        this.i++;
        return out;
      }
      if (c < 0x20) this.fail(this.i, 'control character inside a string');
      if (c === 92) {
        const e = s[this.i + 1];
        const simple: Record<string, string> = { '"': '"', '\\': '\\', '/': '/', b: '\b', f: '\f', n: '\n', r: '\r', t: '\t' };
        if (e !== undefined && simple[e] !== undefined) {
          out += simple[e];
          this.i += 2;
        } else if (e === 'u' && /^[0-9a-fA-F]{4}$/.test(s.slice(this.i + 2, this.i + 6))) {
          out += String.fromCharCode(parseInt(s.slice(this.i + 2, this.i + 6), 16));
          this.i += 6;
        } else {
          this.fail(this.i, `bad escape ${quote(s.slice(this.i, this.i + 2))} in a string`);
        }
      } else {
        out += s[this.i];
        this.i++;
      }
    }
  }

  private number(): JsonNode {
    const pos = this.i;
    const m = /-?(?:0|[1-9]\d*)(?:\.\d+)?(?:[eE][+-]?\d+)?/y;
    m.lastIndex = pos;
    const hit = m.exec(this.text);
    if (!hit) this.fail(pos, `malformed number ${this.found()}`);
    this.i = pos + hit[0].length;
    const next = this.text[this.i];
    if (next !== undefined && /[0-9A-Za-z.+-]/.test(next)) this.fail(pos, `malformed number ${quote(this.text.slice(pos, this.i + 1))}`);
    return { t: 'number', pos, v: Number(hit[0]) };
  }
}

function describe(n: JsonNode): string {
  switch (n.t) {
    case 'object':
      return 'an object';
    case 'array':
      return 'an array';
    case 'string':
      return `the string ${quote(n.v)}`;
    case 'number':
      return `the number ${n.v}`;
    case 'literal':
      return String(n.v);
  }
}

/** Parse the JSON matrix shape. Throws FormatError on the line of the first offending value. */
export function parseJsonMatrix(text: string, file: string): BitMatrix {
  rejectEmpty(text, file);
  const rd: Reader = new Reader(text, file); // annotated: lets `rd.fail(...)` (never) narrow types
  const doc = rd.document();
  const shape = 'expected {"rows":R,"cols":C,"support":[[...],...]}';
  if (doc.t !== 'object') return rd.fail(doc.pos, `${shape}, found ${describe(doc)}`);

  const fields = new Map<string, JsonNode>();
  for (const { key, keyPos, value } of doc.entries) {
    if (key !== 'rows' && key !== 'cols' && key !== 'support') rd.fail(keyPos, `unknown key ${quote(key)}; ${shape}`);
    if (fields.has(key)) rd.fail(keyPos, `key ${quote(key)} given twice`);
    fields.set(key, value);
  }
  for (const key of ['rows', 'cols', 'support']) if (!fields.has(key)) rd.fail(doc.end, `missing key "${key}"; ${shape}`);

  const count = (key: 'rows' | 'cols'): number => {
    const n = fields.get(key)!;
    if (n.t !== 'number' || !Number.isSafeInteger(n.v) || n.v < 0) rd.fail(n.pos, `"${key}" must be a non-negative integer, found ${describe(n)}`);
    return n.v;
  };
  const rows = count('rows');
  const cols = count('cols');
  checkSize(file, rd.lineOf(fields.get('cols')!.pos), rows, cols);

  const support = fields.get('support')!;
  if (support.t !== 'array') return rd.fail(support.pos, `"support" must be an array of rows, found ${describe(support)}`);
  if (support.items.length !== rows) rd.fail(support.pos, `"support" has ${support.items.length} rows, but "rows" is ${rows}`);

  const m = zeros(rows, cols);
  const seen = new Set<number>();
  support.items.forEach((row, r) => {
    if (row.t !== 'array') rd.fail(row.pos, `support row ${r} must be an array of column indices, found ${describe(row)}`);
    seen.clear();
    for (const e of row.items) {
      if (e.t !== 'number' || !Number.isSafeInteger(e.v)) rd.fail(e.pos, `support row ${r}: column index must be an integer, found ${describe(e)}`);
      if (e.v < 0 || e.v >= cols) rd.fail(e.pos, `support row ${r}: column index ${e.v} is out of range ${cols === 0 ? '(the matrix has no columns)' : `0..${cols - 1}`}`);
      if (seen.has(e.v)) rd.fail(e.pos, `support row ${r}: column index ${e.v} is listed twice`);
      seen.add(e.v);
      setBit(m, r, e.v, 1);
    }
  });
  return m;
}

/** The JSON matrix shape, one support row per line, indices ascending. */
export function serializeJsonMatrix(m: BitMatrix): string {
  const rows: string[] = [];
  for (let r = 0; r < m.rows; r++) rows.push(`[${rowSupport(m, r).join(',')}]`);
  const head = `{"rows":${m.rows},"cols":${m.cols},"support":[`;
  return rows.length === 0 ? `${head}]}\n` : `${head}\n${rows.join(',\n')}\n]}\n`;
}

import { closeSync, existsSync, fsyncSync, openSync, readFileSync, writeSync } from 'node:fs';
import { writeTextFileAtomic } from './atomic.js';
import { FormatError, InputError } from '../errors.js';

/**
 * The word list file written by `search --out`: JSON lines.
 *   {"words":"overcheck","side":"x","header":{...}}             once per side, first
 *   {"side":"x","support":[...],"original":true}                one per word ("original" only on rows)
 *   {"side":"x","progress":{"iterations":N,"nextStream":S,"complete":b}}   after every flushed batch
 *   {"side":"x","summary":{...}}                                 once per side when the search ends
 * While a search runs the file is appended in batches and fsync'ed, so a kill loses at most the last
 * batch; when it ends the whole file is rewritten through a temporary file and a rename.
 */
export interface WordsHeader {
  codeHash: string;
  n: number;
  maxWeight: number;
  method: string;
  settings: unknown;
  seed: string | number;
}

export interface SideRecord {
  header: WordsHeader | null;
  words: number[][];
  original: Set<string>;
  iterations: number;
  nextStream: number;
  complete: boolean;
  summary: Record<string, unknown> | null;
}

export class WordsWriter {
  private fd: number;
  private pending: string[] = [];

  constructor(readonly path: string, append: boolean) {
    this.fd = openSync(path, append && existsSync(path) ? 'a' : 'w');
  }

  line(obj: unknown): void {
    this.pending.push(JSON.stringify(obj));
  }

  /** Write and fsync everything pending. */
  flush(): void {
    if (this.pending.length === 0) return;
    writeSync(this.fd, `${this.pending.join('\n')}\n`);
    fsyncSync(this.fd);
    this.pending = [];
  }

  close(): void {
    this.flush();
    closeSync(this.fd);
  }
}

/** Replace the file atomically with the given lines. */
export function finalizeWordsFile(path: string, lines: unknown[]): void {
  writeTextFileAtomic(path, lines.map((l) => JSON.stringify(l)).join('\n') + '\n');
}

/**
 * Read a words file (complete or cut short by a kill). A last line that is cut mid-way is ignored; any
 * other malformed line is a FormatError naming it.
 */
export function readWordsFile(path: string): Map<string, SideRecord> {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch {
    throw new InputError(`${path}: cannot read the words file`);
  }
  const lines = text.split('\n');
  const sides = new Map<string, SideRecord>();
  const get = (side: string) => {
    let s = sides.get(side);
    if (!s) {
      s = { header: null, words: [], original: new Set(), iterations: 0, nextStream: 0, complete: false, summary: null };
      sides.set(side, s);
    }
    return s;
  };
  lines.forEach((raw, i) => {
    const line = raw.trim();
    if (line === '') return;
    let obj: Record<string, unknown>;
    try {
      obj = JSON.parse(line) as Record<string, unknown>;
    } catch {
      if (i >= lines.length - 2 && !text.endsWith('\n')) return; // cut off by a kill
      throw new FormatError(path, i + 1, 'not a JSON object');
    }
    if (typeof obj !== 'object' || obj === null || typeof obj['side'] !== 'string') throw new FormatError(path, i + 1, 'expected an object with a "side" field');
    const rec = get(obj['side'] as string);
    if (obj['header']) rec.header = obj['header'] as WordsHeader;
    else if (Array.isArray(obj['support'])) {
      const sup = obj['support'] as unknown[];
      if (!sup.every((c) => Number.isInteger(c) && (c as number) >= 0)) throw new FormatError(path, i + 1, 'support must list non-negative column indices');
      rec.words.push(sup as number[]);
      if (obj['original'] === true) rec.original.add((sup as number[]).join(','));
    } else if (obj['progress']) {
      const p = obj['progress'] as { iterations: number; nextStream: number; complete: boolean };
      rec.iterations = p.iterations;
      rec.nextStream = p.nextStream;
      rec.complete = p.complete;
    } else if (obj['summary']) rec.summary = obj['summary'] as Record<string, unknown>;
    else throw new FormatError(path, i + 1, 'expected a header, support, progress or summary record');
  });
  if (sides.size === 0) throw new FormatError(path, 1, 'empty words file');
  for (const [side, rec] of sides) if (!rec.header) throw new FormatError(path, 1, `no header for side ${side}`);
  return sides;
}

/**
 * Candidate words for conditioning from a file: a search result (`search --json`, one side or {"x","z"}),
 * or a words file written by `search --out`. Returns side → supports.
 */
export function readCandidateWords(path: string): Map<string, number[][]> {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch {
    throw new InputError(`${path}: cannot read the words file`);
  }
  const trimmed = text.trimStart();
  const firstLine = trimmed.split('\n', 1)[0] ?? '';
  let whole: unknown = undefined;
  if (trimmed.startsWith('{')) {
    try {
      whole = JSON.parse(text);
    } catch {
      whole = undefined; // JSON lines: one object per line
    }
  }
  if (whole === undefined) {
    if (!firstLine.startsWith('{')) throw new FormatError(path, 1, 'expected a search result (JSON) or a words file (JSON lines)');
    const sides = readWordsFile(path);
    return new Map([...sides].map(([side, rec]) => [side, rec.words]));
  }
  const out = new Map<string, number[][]>();
  const take = (side: string, obj: unknown) => {
    const words = (obj as { words?: unknown }).words;
    if (!Array.isArray(words)) throw new FormatError(path, 1, `side ${side}: expected a "words" list of supports`);
    words.forEach((w, i) => {
      if (!Array.isArray(w) || !w.every((c) => Number.isInteger(c) && c >= 0)) throw new FormatError(path, 1, `side ${side}: word ${i + 1} is not a list of column indices`);
    });
    out.set(side, words as number[][]);
  };
  const o = whole as Record<string, unknown>;
  if (typeof o['side'] === 'string') take(o['side'] as string, o);
  else {
    for (const side of ['x', 'z', 'h']) if (o[side] && typeof o[side] === 'object') take(side, o[side]);
    if (out.size === 0) throw new FormatError(path, 1, 'no "words" found (expected the output of search --json)');
  }
  return out;
}

import { closeSync, existsSync, ftruncateSync, openSync, readFileSync, writeSync } from 'node:fs';
import { FormatError, InputError } from '../errors.js';
import type { ResultStore } from '../parallel/journal-pool.js';
import { fileProblem } from './atomic.js';

/**
 * The results journal on disk (JSON lines): a header line, then one line per finished task,
 *   {"overcheck":"results-journal","version":1,"command":"trial"}
 *   {"task":"<content key>","kind":"trial-batch","result":<encoded result>}
 * Lines are appended as tasks finish, so a journal survives any kind of stop; a last line cut short by a
 * hard kill is dropped (and cut off the file) when the journal is opened again. See journal-pool.ts for
 * why replaying these results resumes a run exactly.
 */
export const JOURNAL_FORMAT = 'results-journal';

interface Header {
  overcheck: string;
  version: number;
  command: string;
}

export interface JournalContents {
  /** Encoded results by task key, with the task kind. */
  entries: Map<string, { kind: string; encoded: string }>;
  command: string;
  /** Byte length of the whole lines (where an append must start), and whether they end with a newline. */
  validBytes: number;
  endsWithNewline: boolean;
  /** Whether an incomplete last line was found (and is ignored). */
  cutShort: boolean;
}

/**
 * Parse a journal (pure). `expectCommand`: the command that may resume from it (a journal of another
 * command is refused with one line). Malformed lines other than an unterminated last one are FormatErrors.
 */
export function parseJournal(text: string, file: string, expectCommand: string): JournalContents {
  const entries = new Map<string, { kind: string; encoded: string }>();
  let pos = 0;
  let line = 0;
  let command = '';
  let validChars = 0;
  let cutShort = false;
  while (pos < text.length) {
    const nl = text.indexOf('\n', pos);
    const end = nl < 0 ? text.length : nl;
    const raw = text.slice(pos, end);
    line++;
    const last = nl < 0;
    pos = end + 1;
    if (raw.trim() === '' && !last) {
      validChars = pos;
      continue;
    }
    let value: unknown;
    try {
      value = JSON.parse(raw);
    } catch {
      if (last && line > 1) {
        cutShort = true;
        break;
      }
      throw new FormatError(file, line, line === 1 ? 'not a results journal (the first line should be its JSON header)' : 'not JSON');
    }
    if (line === 1) {
      const h = value as Partial<Header>;
      if (h === null || typeof h !== 'object' || h.overcheck !== JOURNAL_FORMAT) throw new FormatError(file, 1, `not a results journal (the header should have "overcheck": "${JOURNAL_FORMAT}")`);
      if (h.version !== 1) throw new FormatError(file, 1, `journal version ${String(h.version)} is not supported (this overcheck reads version 1)`);
      if (typeof h.command !== 'string') throw new FormatError(file, 1, 'the header has no "command"');
      command = h.command;
      if (command !== expectCommand) throw new InputError(`${file}: a journal of "overcheck ${command}", not of "overcheck ${expectCommand}"`);
    } else {
      const e = value as { task?: unknown; kind?: unknown; result?: unknown };
      if (e === null || typeof e !== 'object' || typeof e.task !== 'string' || typeof e.kind !== 'string' || !('result' in e)) {
        if (last) {
          cutShort = true;
          break;
        }
        throw new FormatError(file, line, 'expected {"task": KEY, "kind": KIND, "result": …}');
      }
      // kept encoded: decoded only when a task asks for it
      entries.set(e.task, { kind: e.kind, encoded: JSON.stringify(e.result) });
    }
    // a complete last line without its newline is kept (the appender adds the newline)
    validChars = last ? text.length : pos;
  }
  if (line === 0) throw new FormatError(file, 1, 'empty file (not a results journal)');
  const kept = text.slice(0, validChars);
  return { entries, command, validBytes: Buffer.byteLength(kept), endsWithNewline: kept.endsWith('\n'), cutShort };
}

/**
 * A ResultStore backed by a journal file: earlier entries are read at open, new results appended at once
 * (one write per task, so a kill loses at most the tasks in flight).
 */
export class JournalFile implements ResultStore {
  private fd: number;
  private readonly entries: Map<string, { kind: string; encoded: string }>;
  /** Entries read at open. */
  readonly loaded: number;
  readonly cutShort: boolean;

  /** Open `path` for `command`: continue it when it exists (`mustExist` for --resume), else start one. */
  constructor(readonly path: string, command: string, mustExist: boolean) {
    let text: string | null = null;
    if (existsSync(path)) {
      try {
        text = readFileSync(path, 'utf8');
      } catch (e) {
        throw fileProblem(path, e, 'read');
      }
    } else if (mustExist) throw new InputError(`${path}: no such file`);
    try {
      if (text !== null && (text.length > 0 || mustExist)) {
        const j = parseJournal(text, path, command);
        this.entries = j.entries;
        this.cutShort = j.cutShort;
        // cut an incomplete last line off, then append after the last whole line
        const rw = openSync(path, 'r+');
        ftruncateSync(rw, j.validBytes);
        closeSync(rw);
        this.fd = openSync(path, 'a');
        if (!j.endsWithNewline) writeSync(this.fd, '\n');
      } else {
        this.entries = new Map();
        this.cutShort = false;
        this.fd = openSync(path, 'w');
        writeSync(this.fd, `${JSON.stringify({ overcheck: JOURNAL_FORMAT, version: 1, command })}\n`);
      }
    } catch (e) {
      if (e instanceof InputError) throw e;
      throw fileProblem(path, e, 'write');
    }
    this.loaded = this.entries.size;
  }

  get size(): number {
    return this.entries.size;
  }

  get(key: string): string | undefined {
    return this.entries.get(key)?.encoded;
  }

  put(key: string, kind: string, encoded: string): void {
    if (this.entries.has(key)) return;
    this.entries.set(key, { kind, encoded });
    try {
      writeSync(this.fd, `{"task":${JSON.stringify(key)},"kind":${JSON.stringify(kind)},"result":${encoded}}\n`);
    } catch (e) {
      throw fileProblem(this.path, e, 'write');
    }
  }

  close(): void {
    closeSync(this.fd);
  }
}

/** Write a whole journal at once (the results of a run that kept them in memory until a stop). */
export function writeJournal(path: string, command: string, entries: Iterable<[string, { kind: string; encoded: string }]>): number {
  const file = new JournalFile(path, command, false);
  let n = 0;
  for (const [key, e] of entries) {
    file.put(key, e.kind, e.encoded);
    n++;
  }
  file.close();
  return n;
}

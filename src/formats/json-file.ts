import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { fileProblem, writeTextFileAtomic } from './atomic.js';
import { FormatError, InputError } from '../errors.js';

/**
 * Result files on disk: reading a JSON result (any shape; the caller judges it) and writing a text file
 * atomically. Every problem is one line naming the file.
 */

/** 1-based line of a character offset. */
function lineAt(text: string, pos: number): number {
  let line = 1;
  for (let i = 0; i < pos && i < text.length; i++) if (text.charCodeAt(i) === 10) line++;
  return line;
}

/**
 * Parse one JSON value (pure). FormatError(file, line, problem) when the text is empty, is not JSON, or is
 * JSON lines (several values, one a line) rather than one value.
 */
export function parseJsonText(text: string, file: string): unknown {
  const body = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  if (body.trim() === '') throw new FormatError(file, 1, 'empty file');
  try {
    return JSON.parse(body);
  } catch (e) {
    const message = (e as Error).message;
    const at = /at position (\d+)/.exec(message);
    const pos = at ? Number(at[1]) : body.length;
    const line = lineAt(body, pos);
    if (/non-whitespace character after JSON/.test(message)) {
      const first = body.slice(0, pos).trim();
      if (first.startsWith('{')) throw new FormatError(file, line, 'several JSON values (JSON lines?); expected one JSON object, such as the --json output of a command');
    }
    const problem = message.replace(/\s*in JSON at position \d+.*$/, '').replace(/\s*\(line \d+ column \d+\)$/, '');
    throw new FormatError(file, line, `not JSON: ${problem}`);
  }
}

export interface JsonFile {
  value: unknown;
  /** SHA-256 of the file's bytes, hex. */
  sha256: string;
  bytes: number;
}

/** Read and parse a JSON file; one-line InputError / FormatError on any problem. */
export function readJsonFile(path: string): JsonFile {
  let raw: Buffer;
  try {
    raw = readFileSync(path);
  } catch (e) {
    throw fileProblem(path, e, 'read');
  }
  let text: string;
  try {
    text = raw.toString('utf8');
  } catch (e) {
    throw fileProblem(path, e, 'read');
  }
  const value = parseJsonText(text, path);
  return { value, sha256: createHash('sha256').update(raw).digest('hex'), bytes: raw.length };
}

let tempCounter = 0;

export { writeTextFileAtomic };

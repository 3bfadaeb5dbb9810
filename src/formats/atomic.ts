import { renameSync, unlinkSync, writeFileSync } from 'node:fs';
import { basename, dirname, join } from 'node:path';
import { InputError } from '../errors.js';

/** A one-line InputError for a failed read or write of `path`. */
export function fileProblem(path: string, e: unknown, doing: 'read' | 'write'): InputError {
  const code = (e as NodeJS.ErrnoException | undefined)?.code;
  const why =
    code === 'ENOENT' ? (doing === 'read' ? 'no such file' : 'directory does not exist')
    : code === 'EISDIR' ? 'is a directory'
    : code === 'EACCES' || code === 'EPERM' ? 'permission denied'
    : code === 'ERR_STRING_TOO_LONG' ? 'file too large to read as text (over about 512 MiB)'
    : `cannot ${doing} (${code ?? (e as Error)?.message ?? String(e)})`;
  return new InputError(`${path}: ${why}`);
}

let tempCounter = 0;

/**
 * Write a text file atomically: to a temporary file beside `path`, then renamed over it, so that a reader
 * never sees a half-written file and an interrupted write leaves the old file in place. Every file overcheck
 * writes goes through here.
 */
export function writeTextFileAtomic(path: string, text: string): void {
  const temp = join(dirname(path), `.${basename(path)}.${process.pid}.${tempCounter++}.tmp`);
  try {
    writeFileSync(temp, text, { flag: 'wx' });
    renameSync(temp, path);
  } catch (e) {
    try {
      unlinkSync(temp);
    } catch {
      // never created, or already gone
    }
    throw fileProblem(path, e, 'write');
  }
}

import { writeTextFileAtomic } from './atomic.js';

/** Write a JSON document atomically (temporary file, then rename), indented for people to read. */
export function writeJsonFile(path: string, value: unknown): void {
  writeTextFileAtomic(path, `${JSON.stringify(value, null, 2)}\n`);
}

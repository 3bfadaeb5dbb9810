import { renameSync, writeFileSync } from 'node:fs';

/** Write a JSON document atomically (temporary file, then rename). */
export function writeJsonFile(path: string, value: unknown): void {
  const tmp = `${path}.tmp-${process.pid}`;
  writeFileSync(tmp, `${JSON.stringify(value, null, 2)}\n`);
  renameSync(tmp, path);
}

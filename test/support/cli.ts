// Running the built CLI from tests (npm test builds dist before vitest).
import { spawn, spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';

export const BIN = fileURLToPath(new URL('../../bin/overcheck.js', import.meta.url));

export interface CliRun {
  code: number | null;
  out: string;
  err: string;
}

/** Run overcheck and wait for it. */
export function runCli(args: string[], cwd?: string): CliRun {
  const r = spawnSync(process.execPath, [BIN, ...args], { encoding: 'utf8', cwd, maxBuffer: 64 << 20 });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

/** Run overcheck as a separate process (several at once, for shards). */
export function runCliAsync(args: string[], cwd?: string): Promise<CliRun> {
  return new Promise((resolve, reject) => {
    const c = spawn(process.execPath, [BIN, ...args], { cwd, stdio: ['ignore', 'pipe', 'pipe'] });
    let out = '';
    let err = '';
    c.stdout.on('data', (d: Buffer) => (out += d.toString()));
    c.stderr.on('data', (d: Buffer) => (err += d.toString()));
    c.on('error', reject);
    c.on('close', (code) => resolve({ code, out, err }));
  });
}

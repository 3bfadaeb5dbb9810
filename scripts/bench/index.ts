// `npm run bench -- NAME [--quick]` runs scripts/bench/NAME.ts; with no name it lists the benchmarks.
import { spawnSync } from 'node:child_process';
import { readdirSync } from 'node:fs';
import { join } from 'node:path';

const here = import.meta.dirname;
const names = readdirSync(here).filter((f) => f.endsWith('.ts') && f !== 'index.ts').map((f) => f.slice(0, -3)).sort();
const [name, ...rest] = process.argv.slice(2);
if (!name || !names.includes(name)) {
  process.stdout.write(`benchmarks: ${names.join(', ')}\nrun one with: npm run bench -- NAME [--quick]\n`);
  process.exitCode = name ? 2 : 0;
} else {
  const r = spawnSync(process.execPath, ['--import', 'tsx', join(here, `${name}.ts`), ...rest], { stdio: 'inherit' });
  process.exitCode = r.status ?? 1;
}

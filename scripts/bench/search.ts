// Search benchmark (run by hand: npx tsx scripts/bench/search.ts [--quick]). Prints iteration rates, word
// rates, the ratio to a C build of the same kernel, worker scaling, and times to a target miss probability.
import { execFileSync, spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { buildFamily } from '../../src/codes/families/index.js';
import type { BitMatrix } from '../../src/gf2/bitmatrix.js';
import { rowBasis } from '../../src/gf2/elimination.js';
import { openPool } from '../../src/parallel/pool.js';
import { grayChunk } from '../../src/search/gray.js';
import { isdChunk } from '../../src/search/isd.js';
import { runSearch } from '../../src/search/run.js';

const quick = process.argv.includes('--quick');

function hx(spec: string): BitMatrix {
  const b = buildFamily(spec);
  if (b.kind !== 'css') throw new Error(spec);
  return b.code.hx;
}

const CODES = {
  'bb [[144,12]]': { spec: 'bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2', W: 12 },
  'gb [[254,28]]': { spec: 'gb:l=127,a=1+x^15+x^20+x^28+x^66,b=1+x^58+x^59+x^100+x^121', W: 10 },
};

function kernelRate(h: BitMatrix, W: number, iterations: number) {
  const b = rowBasis(h);
  const t0 = performance.now();
  const r = isdChunk({ rows: b.rank, cols: h.cols, generator: b.reduced.data, maxWeight: W, settings: { variant: 'lee-brickell', p: 2, window: 0, segment: 1 }, seed: 1, stream: 0, iterations, maxWords: 1e7 });
  const secs = (performance.now() - t0) / 1000;
  return { its: iterations / secs, words: r.count / secs, b };
}

function cRate(b: ReturnType<typeof rowBasis>, n: number, W: number, iterations: number): number | null {
  const dir = mkdtempSync(join(tmpdir(), 'oc-bench-'));
  const exe = join(dir, 'isd_lb2');
  try {
    execFileSync('gcc', ['-O2', '-march=native', '-o', exe, join(import.meta.dirname, 'c', 'isd_lb2.c')]);
  } catch {
    return null;
  }
  const input = `${b.rank} ${n} ${W} ${iterations}\n${Array.from(b.reduced.data).join(' ')}\n`;
  writeFileSync(join(dir, 'in.txt'), input);
  const out = spawnSync(exe, { input, encoding: 'utf8' }).stdout.trim().split(' ');
  return iterations / Number(out[1]);
}

for (const [name, { spec, W }] of Object.entries(CODES)) {
  const h = hx(spec);
  const its = quick ? 300 : 1500;
  kernelRate(h, W, 300); // warm up the JIT before timing
  const js = kernelRate(h, W, its);
  const c = cRate(js.b, h.cols, W, its);
  console.log(`${name} rowspace(HX), W=${W}, Lee–Brickell p=2 fresh sets, one thread: ${js.its.toFixed(0)} information sets/s, ${js.words.toFixed(0)} new words/s (chunk-local)` +
    (c ? `; C -O2: ${c.toFixed(0)}/s; JS/C = ${(js.its / c).toFixed(2)}` : '; (gcc not found)'));
  for (const workers of [1, 2]) {
    const pool = await openPool(workers);
    // warm-up: worker start (the tsx loader in particular) is not part of the rate
    await runSearch({ side: 'x', h }, { maxWeight: W, method: 'isd', seed: 9, maxWords: 1e7, iterations: 400 }, { pool });
    const t0 = performance.now();
    const r = await runSearch({ side: 'x', h }, { maxWeight: W, method: 'isd', seed: 1, maxWords: 1e7, iterations: quick ? 4000 : 20000 }, { pool });
    const secs = (performance.now() - t0) / 1000;
    await pool.close();
    console.log(`  planned (${r.plan.method === 'isd' ? r.plan.reason.split(':')[0] : ''}), ${workers} worker(s): ${(r.iterations / secs).toFixed(0)} information sets/s, ${(r.wordCount / secs).toFixed(0)} words/s, ${r.wordCount} words`);
  }
}

{
  const h = hx(CODES['bb [[144,12]]'].spec);
  const pool = await openPool(2);
  const t0 = performance.now();
  const r = await runSearch({ side: 'x', h }, { maxWeight: 12, method: 'isd', seed: 1, maxWords: 1e7, targetMiss: 1e-6 }, { pool });
  await pool.close();
  console.log(`bb [[144,12]] W=12 to miss probability 1e-6 (2 workers, no orbits): ${((performance.now() - t0) / 1000).toFixed(2)} s, ${r.iterations} information sets, ${r.wordCount} words`);
}

{
  const b = buildFamily('hgp:h1=(regular:n=40,col=3,row=4,seed=1)');
  if (b.kind !== 'css') throw new Error('hgp');
  const pool = await openPool(2);
  const t0 = performance.now();
  const r = await runSearch({ side: 'x', h: b.code.hx }, { maxWeight: 10, method: 'isd', seed: 1, maxWords: 1e7, targetMiss: 1e-3 }, { pool });
  await pool.close();
  console.log(`hgp 2,500 qubits W=10 to miss probability 1e-3 (2 workers): ${((performance.now() - t0) / 1000).toFixed(2)} s, ${r.iterations} information sets, ${r.wordCount} words (${r.plan.method === 'isd' ? r.plan.reason.split(':')[0] : ''})`);
}

{
  const h = hx('bb:l=6,m=6,A=x^3+y+y^2,B=y^3+x+x^2');
  const b = rowBasis(h);
  const t0 = performance.now();
  const r = grayChunk({ rows: b.rank, cols: h.cols, basis: b.reduced.data, maxWeight: 12, lowBits: 22, chunk: 0, maxWords: 1e7 });
  const secs = (performance.now() - t0) / 1000;
  console.log(`Gray-code enumeration, bb [[72,12]] rowspace(HX) (rank 30, 3 words/row): ${(r.visited / secs / 1e6).toFixed(1)} M combinations/s per thread; 2^30 would take ${(2 ** 30 / (r.visited / secs)).toFixed(1)} s on one thread`);
}

// Distance-audit benchmark (run by hand: npx tsx scripts/bench/distance.ts [--quick] [--full]). Prints the
// Brouwer–Zimmermann hot-loop rate, the time to the first weight-12 logical of [[144,12,12]], the time to
// certify [[48,6,8]] and [[72,12,6]], and the lower bound reached in 60 s on [[144,12,12]]. End-to-end
// figures run the built CLI (bin/overcheck.js, rebuilt first), which is what users run.
import { execFileSync, spawnSync } from 'node:child_process';
import { join } from 'node:path';
import { buildFamily } from '../../src/codes/families/index.js';
import { logicalBasis } from '../../src/codes/logicals.js';
import { augmentedBasis } from '../../src/distance/augmented.js';
import { auditSide } from '../../src/distance/audit.js';
import { binomial, planEnumeration, scanLevel } from '../../src/distance/brouwer-zimmermann.js';
import { cssSideProblem } from '../../src/distance/problem.js';
import { kernel } from '../../src/gf2/kernel.js';
import { popcount32 } from '../../src/gf2/popcount.js';
import { isdCode, runInformationSetPhase } from '../../src/distance/upper.js';
import { WordCollection } from '../../src/distance/words.js';
import { openPool } from '../../src/parallel/pool.js';

const quick = process.argv.includes('--quick');
const full = process.argv.includes('--full');
const root = join(import.meta.dirname, '..', '..');
const BB144 = 'bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2';
const BB72 = 'bb:l=6,m=6,A=x^3+y+y^2,B=y^3+x+x^2';
const GB48 = 'gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17';
const BB90 = 'bb:l=15,m=3,A=x^9+y+y^2,B=1+x^2+x^7';
const BB108 = 'bb:l=9,m=6,A=x^3+y+y^2,B=y^3+x+x^2';

function css(spec: string) {
  const b = buildFamily(spec);
  if (b.kind !== 'css') throw new Error(spec);
  return b.code;
}

function cpuSeconds(f: () => void): number {
  const c0 = process.cpuUsage();
  f();
  const c = process.cpuUsage(c0);
  return (c.user + c.system) / 1e6;
}

// 1. the hot loop, one thread, in this process (tsx-compiled source)
{
  const code = css(BB144);
  const { lz } = logicalBasis(code);
  const plan = planEnumeration(augmentedBasis(kernel(code.hz), lz));
  const m = plan.matrices[0]!;
  const t = 5;
  const count = quick ? 5_000_000 : binomial(m.dim, t);
  scanLevel(m, t, 0, 2_000_000, 12, []); // warm up the JIT
  const hits: number[] = [];
  const secs = cpuSeconds(() => scanLevel(m, t, 0, count, 12, hits));
  console.log(`[[144,12]] dX, information set of rank ${m.dim} (${m.restWords} words outside it + ${m.rowWords - m.restWords} filter word), level ${t}, W=12: ` +
    `${(count / secs / 1e6).toFixed(1)} M combinations per CPU-second (tsx, one thread)`);
}

// 2. time to the first weight-12 X logical of [[144,12,12]] (information-set search, in this process)
for (const workers of [0, 2]) {
  const code = css(BB144);
  const problem = cssSideProblem(code, logicalBasis(code), 'x');
  const pool = await openPool(workers);
  const t0 = performance.now();
  let first12: number | null = null;
  const r = await auditSide(pool, problem, 0, { method: 'isd', seed: 1 }, {
    shouldStop: () => first12 !== null,
    stopReason: () => 'time-limit',
    progress: (p) => {
      if (p.upper <= 12 && first12 === null) first12 = performance.now() - t0;
    },
  });
  await pool.close();
  const ms = first12 ?? performance.now() - t0;
  console.log(`[[144,12,12]] first weight-12 X logical: ${(ms / 1000).toFixed(2)} s wall with ${workers === 0 ? 'the main thread only' : `${workers} workers`} ` +
    `(upper ${r.upper} after ${r.isd.iterations} information sets, plan and first enumeration pass included; the logical basis itself ` +
    `has a lightest row of weight ${Math.min(...problem.known.map((w) => w.reduce((a, x) => a + popcount32(x), 0)))})`);
}

// 2b. the same by information-set search alone, starting cold (no enumeration pass, no basis rows)
for (const workers of [0, 2]) {
  const code = css(BB144);
  const problem = cssSideProblem(code, logicalBasis(code), 'x');
  const isd = isdCode(problem.basis, problem.filter);
  const pool = await openPool(workers);
  await runInformationSetPhase(pool, isd, new WordCollection(problem.basis.codeWords, 144, true), [], { nextChunk: 0, iterations: 0 }, // warm the workers up
    { seed: 'warm-up', streamBase: 0, maxIterations: 64, targetMiss: 0, lowerBound: 1 }, () => false);
  const collection = new WordCollection(problem.basis.codeWords, 144, true); // cold: no starting word
  const state = { nextChunk: 0, iterations: 0 };
  const t0 = performance.now();
  await runInformationSetPhase(pool, isd, collection, [], state, { seed: 1, streamBase: 0, maxIterations: Infinity, targetMiss: 0, lowerBound: 1 }, () => collection.limit <= 12);
  const secs = (performance.now() - t0) / 1000;
  await pool.close();
  console.log(`[[144,12,12]] first weight-12 X logical by information-set search alone: ${secs.toFixed(2)} s wall, ${state.iterations} information sets, ` +
    `${workers === 0 ? 'main thread' : `${workers} workers`}, starting cold (no word known; the logical basis itself has a row of weight ` +
    `${problem.known.map((w) => w.reduce((a, x) => a + popcount32(x), 0)).sort((a, b) => a - b)[0]})`);
}

// 3. end to end through the built CLI
execFileSync('npm', ['run', 'build'], { cwd: root, stdio: 'ignore' });
function cli(args: string[]): { secs: number; json: Record<string, unknown> } {
  const t0 = performance.now();
  const out = spawnSync('node', [join(root, 'bin', 'overcheck.js'), 'distance', ...args, '--json'], { encoding: 'utf8' });
  const secs = (performance.now() - t0) / 1000;
  if (out.status !== 0 && out.status !== 1) throw new Error(`distance ${args.join(' ')}: exit ${out.status}: ${out.stderr}`);
  return { secs, json: JSON.parse(out.stdout) as Record<string, unknown> };
}
type Side = { upper: number; lower: number; certified: boolean; count: number; countExact: boolean; enumeration: { combinations: number; sets: { level: number }[] } | null };

for (const [name, spec] of [['[[48,6,8]]', GB48], ['[[72,12,6]]', BB72]] as const) {
  for (const workers of ['1', '2']) {
    const { secs, json } = cli(['--family', spec, '--method', 'certify', '--workers', workers]);
    const dx = json['dx'] as Side;
    const dz = json['dz'] as Side;
    console.log(`${name} certify both sides, ${workers} worker${workers === '1' ? '' : 's'}: ${secs.toFixed(2)} s wall; ` +
      `dX = ${dx.upper} (${dx.certified ? 'certified' : 'NOT certified'}, ${dx.count} words, ${dx.enumeration?.combinations} combinations), ` +
      `dZ = ${dz.upper} (${dz.certified ? 'certified' : 'NOT certified'}, ${dz.count} words)`);
  }
}

{
  const limit = quick ? '15' : '60';
  const { secs, json } = cli(['--family', BB144, '--method', 'certify', '--side', 'x', '--time-limit', limit]);
  const dx = json['dx'] as Side;
  console.log(`[[144,12,12]] dX lower bound after --time-limit ${limit} (2 workers): ${dx.lower} (upper ${dx.upper}; ` +
    `levels ${dx.enumeration?.sets.map((s) => s.level).join('/')}; ${dx.enumeration?.combinations.toExponential(2)} combinations; ${secs.toFixed(1)} s wall)`);
}

if (full) {
  const a = cli(['--family', BB90, '--method', 'certify', '--side', 'x']);
  const dx = a.json['dx'] as Side;
  console.log(`[[90,8,10]] dX certify: ${a.secs.toFixed(1)} s wall, dX = ${dx.upper}, certified ${dx.certified}, ${dx.count} words (exact: ${dx.countExact}), ${dx.enumeration?.combinations.toExponential(2)} combinations`);
  const b = cli(['--family', BB108, '--method', 'certify', '--side', 'x', '--time-limit', '120']);
  const dx2 = b.json['dx'] as Side;
  console.log(`[[108,8,10]] dX certify (limit 120 s): ${b.secs.toFixed(1)} s wall, ${dx2.lower} ≤ dX ≤ ${dx2.upper}, certified ${dx2.certified}, ` +
    `${dx2.count} words (exact: ${dx2.countExact}), ${dx2.enumeration?.combinations.toExponential(2)} combinations`);
}

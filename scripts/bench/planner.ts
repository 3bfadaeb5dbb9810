// Planner calibration benchmark (run by hand: npm run bench -- planner [--quick] [--reps N]). For a few codes
// it times one chunk of every information-set variant the planner compares (Lee–Brickell p = 1, 2 with fresh
// sets and swap segments; Stern p = 1, 2 with the planner's windows) on one thread, and prints the measured
// seconds per information set beside the planner's predicted cost per information set (STEP_COST units), the
// iterations each variant needs to the miss target, and so the measured and predicted time to target.
// Ratios are taken against Lee–Brickell p = 2 with fresh sets. Nothing is asserted.
import { buildFamily } from '../../src/codes/families/index.js';
import { rowBasis } from '../../src/gf2/elimination.js';
import { isdChunk, type IsdSettings, pairProbe, type SternCounts, sternProbe, systematicDensity } from '../../src/search/isd.js';
import { isdCandidates, iterationCost, iterationsFor, type MeasuredCounts, planSearch } from '../../src/search/plan.js';
import { supportSize } from '../../src/search/run.js';

const quick = process.argv.includes('--quick');
const repsArg = process.argv.indexOf('--reps');
const REPS = repsArg >= 0 ? Number(process.argv[repsArg + 1]) : quick ? 3 : 5;
/** Seconds one timed chunk should take. */
const SLICE = quick ? 0.08 : 0.25;
const TARGET = 1e-6;

const CASES: { name: string; spec: string; W: number }[] = [
  { name: 'bb [[72,12]]', spec: 'bb:l=6,m=6,A=x^3+y+y^2,B=y^3+x+x^2', W: 12 },
  { name: 'bb [[144,12]]', spec: 'bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2', W: 12 },
  { name: 'gb [[254,28]]', spec: 'gb:l=127,a=1+x^15+x^20+x^28+x^66,b=1+x^58+x^59+x^100+x^121', W: 10 },
  { name: 'hgp [[400,16]]', spec: 'hgp:h1=(regular:n=16,col=3,row=4,seed=1)', W: 8 },
];

const label = (s: IsdSettings) => (s.variant === 'stern' ? `Stern p=${s.p} l=${s.window}` : `LB p=${s.p} seg=${s.segment}`);
const same = (a: IsdSettings, b: IsdSettings) => a.variant === b.variant && a.p === b.p && a.window === b.window && a.segment === b.segment;

for (const c of CASES) {
  const built = buildFamily(c.spec);
  if (built.kind !== 'css') throw new Error(c.spec);
  const h = built.code.hx;
  const basis = rowBasis(h);
  const k = basis.rank;
  const nEff = supportSize(basis.reduced);
  const probe = systematicDensity(k, h.cols, basis.reduced.data);
  // the same probe counts as runSearch gives the planner
  const sternCache = new Map<string, SternCounts>();
  const stern = (p: number, l: number) => {
    const key = `${p}:${l}`;
    if (!sternCache.has(key)) sternCache.set(key, sternProbe(k, h.cols, basis.reduced.data, c.W, p, l));
    return sternCache.get(key)!;
  };
  const measured: MeasuredCounts = { pairs: pairProbe(k, h.cols, basis.reduced.data, c.W), stern };
  const plan = planSearch({ n: nEff, k, maxWeight: c.W, method: 'isd', targetMiss: TARGET, density: probe.mean, sparseRows: probe.sparseRows, measured });
  const candidates = isdCandidates(nEff, k, c.W, probe.sparseRows);
  const run = (s: IsdSettings, iterations: number, stream: number) => {
    const t0 = performance.now();
    isdChunk({ rows: k, cols: h.cols, generator: basis.reduced.data, maxWeight: c.W, settings: s, seed: 'bench', stream, iterations, maxWords: 1e7 });
    return (performance.now() - t0) / 1000;
  };
  // size each variant's chunk to about SLICE seconds (after a JIT warm-up), a whole number of segments
  const size = candidates.map((s) => {
    run(s, s.segment * 4, 0);
    let its = s.segment * 4;
    let t = run(s, its, 1);
    while (t < SLICE / 8) {
      its *= 4;
      t = run(s, its, 1);
    }
    return Math.max(s.segment, Math.round((its * SLICE) / t / s.segment) * s.segment);
  });
  const best = candidates.map(() => Infinity);
  // interleaved repeats, best of REPS: load from other processes drifts less between variants
  for (let r = 0; r < REPS; r++) {
    candidates.forEach((s, i) => {
      const its = size[i]!;
      best[i] = Math.min(best[i]!, run(s, its, 2 + r) / its);
    });
  }
  const rows = candidates.map((s, i) => {
    let iters = 0;
    for (let w = 1; w <= c.W; w++) iters = Math.max(iters, iterationsFor(nEff, k, w, s, TARGET));
    const ops = iterationCost(nEff, k, c.W, s, probe.mean, measured);
    // the random-code stand-ins alone (what a caller without probe counts, e.g. the distance audit, gets)
    const model = iterationCost(nEff, k, c.W, s, probe.mean);
    return { s, secs: best[i]!, ops, model, iters, coll: s.variant === 'stern' ? stern(s.p, s.window).collisions : null };
  });
  const ref = rows.find((r) => r.s.variant === 'lee-brickell' && r.s.p === 2 && r.s.segment === 1)!;
  const fastest = rows.reduce((a, b) => (b.secs * b.iters < a.secs * a.iters ? b : a));
  const chosen = plan.method === 'isd' ? plan.settings : null;
  console.log(`\n${c.name} rowspace(HX): n = ${h.cols} (${nEff} distinct columns), k = ${k}, W = ${c.W}, systematic density ${probe.mean.toFixed(3)}, miss target ${TARGET}`);
  console.log('variant              µs/set  pred cost/set  ns/unit  meas/LB2  pred/LB2  pred÷meas  model÷meas  sets to target  meas s to target  probe collisions');
  for (const r of rows) {
    const meas = r.secs / ref.secs;
    const pred = r.ops / ref.ops;
    const mark = (chosen && same(r.s, chosen) ? ' <planner' : '') + (r === fastest ? ' <fastest' : '');
    console.log(
      `${label(r.s).padEnd(19)} ${(r.secs * 1e6).toFixed(1).padStart(8)} ${r.ops.toExponential(3).padStart(14)} ${((r.secs / r.ops) * 1e9).toFixed(2).padStart(8)}` +
        ` ${meas.toFixed(2).padStart(9)} ${pred.toFixed(2).padStart(9)} ${(pred / meas).toFixed(2).padStart(10)} ${(r.model / ref.model / meas).toFixed(2).padStart(11)} ${String(r.iters).padStart(15)} ${(r.iters * r.secs).toFixed(4).padStart(17)}` +
        ` ${r.coll === null ? ''.padStart(17) : r.coll.toFixed(0).padStart(17)}${mark}`,
    );
  }
  const plain = planSearch({ n: nEff, k, maxWeight: c.W, method: 'isd', targetMiss: TARGET, density: probe.mean, sparseRows: probe.sparseRows });
  if (plain.method === 'isd') console.log(`without probe counts the planner would pick ${label(plain.settings)}`);
  const pick = chosen ? rows.find((r) => same(r.s, chosen)) : undefined;
  if (pick) {
    console.log(`planner picks ${label(pick.s)}: measured time to target ${(pick.iters * pick.secs).toFixed(4)} s, ${((pick.iters * pick.secs) / (fastest.iters * fastest.secs)).toFixed(2)}× the fastest (${label(fastest.s)})`);
  }
}

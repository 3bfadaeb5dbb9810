/**
 * Cycle census benchmark (run by hand: npx tsx scripts/bench/cycles.ts [--quick]).
 * Times the 4-, 6-, 8-cycle counts (and 10, 12 where affordable) on:
 *   - HX of the bb [[144,12]] code,
 *   - an overcomplete matrix of the gb [[48,6]] code: every row-space word of weight ≤ 12 of HX, of HZ,
 *     and both stacked (the joint graph), found by Gray-code enumeration of the 2^21 combinations of a
 *     row basis (a bench-local helper, not the project's search stage),
 *   - a random sparse 10,000 × 1,000 matrix of row weight 6 (seed printed),
 * and the incremental tracker's per-row deltas against a full recount.
 */
import { buildFamily } from '../../src/codes/families/index.js';
import { type BitMatrix, fromRowVectors, setBit, zeros } from '../../src/gf2/bitmatrix.js';
import { rowBasis } from '../../src/gf2/elimination.js';
import { packedWeight } from '../../src/gf2/popcount.js';
import { vstack } from '../../src/gf2/bitmatrix.js';
import { cycleCensus } from '../../src/graph/census.js';
import { CycleTracker } from '../../src/graph/incremental.js';
import { streamRng } from '../../src/parallel/seeds.js';
import { loadavg } from 'node:os';

const quick = process.argv.includes('--quick');
const SEED = 1;

function css(spec: string): { hx: BitMatrix; hz: BitMatrix } {
  const b = buildFamily(spec);
  if (b.kind !== 'css') throw new Error(`${spec} is not a CSS family`);
  return b.code;
}

/** All nonzero words of rowspace(h) with weight ≤ maxWeight (Gray-code walk over the basis). */
function lowWeightRowspace(h: BitMatrix, maxWeight: number): BitMatrix {
  const { reduced, rank } = rowBasis(h);
  const stride = reduced.stride;
  const cur = new Uint32Array(stride);
  const kept: Uint32Array[] = [];
  for (let i = 1; i < 2 ** rank; i++) {
    const b = 31 - Math.clz32(i & -i);
    for (let w = 0; w < stride; w++) cur[w] = cur[w]! ^ reduced.data[b * stride + w]!;
    if (packedWeight(cur, 0, stride) <= maxWeight) kept.push(cur.slice());
  }
  return fromRowVectors(h.cols, kept);
}

function randomSparse(rows: number, cols: number, weight: number, seed: number): BitMatrix {
  const rng = streamRng(seed, 0);
  const m = zeros(rows, cols);
  for (let r = 0; r < rows; r++) {
    const picked = new Set<number>();
    while (picked.size < weight) picked.add(rng.below(cols));
    for (const c of picked) setBit(m, r, c, 1);
  }
  return m;
}

/** Best of `reps` runs: wall-clock and CPU (user) milliseconds. */
function time<T>(reps: number, f: () => T): { ms: number; cpu: number; value: T } {
  let best = Infinity;
  let cpu = Infinity;
  let value!: T;
  for (let i = 0; i < reps; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    value = f();
    const ms = performance.now() - t0;
    if (ms < best) {
      best = ms;
      cpu = process.cpuUsage(c0).user / 1000;
    }
  }
  return { ms: best, cpu, value };
}

function row(label: string, m: BitMatrix, lengths: number[], reps: number): void {
  const parts: string[] = [];
  let last = '';
  const base: number[] = [];
  let rate = '';
  for (const L of lengths) {
    const r = time(L >= 10 ? 1 : reps, () => cycleCensus(m, L));
    base.push(r.cpu);
    parts.push(`≤${L}: ${fmt(r.ms)} (cpu ${fmt(r.cpu)})`);
    last = `girth ${r.value.girth ?? '∞'}, ` + [...r.value.cycles].map(([k, v]) => `N${k}=${v}`).join(' ');
    if (L >= 10) rate = `, quotient work ${r.value.quotientWork.toExponential(2)} steps, ${(r.value.quotientWork / (r.cpu / 1000)).toExponential(2)} steps/s (cpu, planning included)`;
  }
  const ratio = base.length > 1 ? `  cpu ≤${lengths[lengths.length - 1]} / ≤4 = ${(base[base.length - 1]! / base[0]!).toFixed(1)}×` : '';
  console.log(`${label} ${m.rows}×${m.cols}: ${parts.join('  ')}${ratio}`);
  console.log(`    ${last}${rate}`);
}

function fmt(ms: number): string {
  return ms < 1 ? `${(ms * 1000).toFixed(0)} µs` : ms < 1000 ? `${ms.toFixed(1)} ms` : `${(ms / 1000).toFixed(2)} s`;
}

console.log(`cycle census benchmark (seed ${SEED}${quick ? ', quick' : ''}, load average ${loadavg()[0]!.toFixed(1)}); full census (counts, girth, participation), best of 3 runs (1 for lengths ≥ 10, which include planning)`);
const bb = css('bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2');
row('bb [[144,12]] HX', bb.hx, quick ? [4, 6, 8] : [4, 6, 8, 10, 12], 3);

const gb = css('gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17');
const t0 = performance.now();
const ox = lowWeightRowspace(gb.hx, 12);
const oz = lowWeightRowspace(gb.hz, 12);
console.log(`gb [[48,6]] row spaces, weight ≤ 12: ${ox.rows} + ${oz.rows} words (enumeration ${fmt(performance.now() - t0)})`);
row('gb [[48,6]] overcomplete X', ox, quick ? [4, 6, 8] : [4, 6, 8, 10, 12], 3);
row('gb [[48,6]] overcomplete Z', oz, [4, 6, 8], 3);
const joint = vstack(ox, oz);
row('gb [[48,6]] overcomplete joint', joint, quick ? [4, 6, 8] : [4, 6, 8, 10], 3);

const rnd = randomSparse(10_000, 1_000, 6, SEED);
row('random 10,000×1,000, row weight 6', rnd, [4, 6, 8], quick ? 1 : 3);

// Incremental deltas on the overcomplete joint matrix: every row removed and re-added once.
{
  const tr = new CycleTracker(joint.cols, joint);
  const ids = tr.ids().slice(0, quick ? 200 : 1000);
  const t1 = performance.now();
  let sum = 0;
  for (const id of ids) {
    const d = tr.deltaRemove(id);
    sum += d.four + d.six;
  }
  const perDelta = (performance.now() - t1) / ids.length;
  const full = time(3, () => cycleCensus(joint, 6)).ms;
  console.log(`load average at the end ${loadavg()[0]!.toFixed(1)}`);
  console.log(
    `incremental delta (4 and 6), joint ${joint.rows}×48: ${fmt(perDelta)} per row vs full ≤6 census ${fmt(full)} (${(full / perDelta).toFixed(0)}× faster); checksum ${sum}`,
  );
}

// End to end on the gb [[48,6,8]] code (Panteleev & Kalachev, Quantum 5, 585, 2021): all row-space words of
// weight ≤ 12 added to both sides, decoded by quaternary BP (sum-product, flooding) at 3 iterations.
import { describe, expect, it } from 'vitest';
import { buildFamily } from '../../src/codes/families/index.js';
import { verifyCandidates } from '../../src/condition/candidates.js';
import { conditionSide } from '../../src/condition/condition.js';
import { scorePairs, trialSelector, type TrialScoring, type TrialSelection } from '../../src/condition/trial-select.js';
import { runTrial } from '../../src/decode/runner.js';
import { decoderMatrix, trialCode } from '../../src/decode/trial-engine.js';
import { openPool } from '../../src/parallel/pool.js';
import { runSearch } from '../../src/search/run.js';
import type { BitMatrix } from '../../src/gf2/index.js';

const gb = buildFamily('gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17');
if (gb.kind !== 'css') throw new Error('css');
const code = gb.code;

async function fullOvercomplete(pool: Awaited<ReturnType<typeof openPool>>): Promise<{ hx: BitMatrix; hz: BitMatrix }> {
  const out: BitMatrix[] = [];
  for (const h of [code.hx, code.hz]) {
    const r = await runSearch({ side: 'x', h }, { maxWeight: 12, method: 'exhaustive', seed: 1, maxWords: 1e5 }, { pool });
    const cands = verifyCandidates(h, r.words, 'search');
    out.push(conditionSide({ side: 'x', h, candidates: cands, basis: 'all', budget: {}, latencyModel: 'serial', iterations: 3, strategy: 'lightest', seed: 1 }).matrix);
  }
  return { hx: out[0]!, hz: out[1]! };
}

const bp4 = (iterations: number) => ({ decoder: 'bp4' as const, osd: { kind: 'none' as const }, rule: 'sum-product' as const, scale: 1, schedule: 'flooding' as const, iterations, earlyStop: true });

describe('gb [[48,6,8]] with every redundant check of weight ≤ 12', () => {
  it('has about 1,100 rows per side; BP4 at 3 iterations corrects every weight-2 error', async () => {
    const pool = await openPool(2);
    try {
      const full = await fullOvercomplete(pool);
      expect(full.hx.rows).toBe(1096); // 24 rows + 1072 words of weight 12 (exhaustive enumeration)
      expect(full.hz.rows).toBe(1096);
      const tc = trialCode(code);
      const r = await runTrial({
        code: tc, matrices: [decoderMatrix(tc, 'full', full.hx, full.hz)], decoder: bp4(3), noise: 'depolarizing', ps: [0.01],
        samples: { kind: 'weight', weight: 2, exhaustive: true }, shots: 0, failures: null, timeLimit: null, batch: 256, seed: 1,
      }, pool, { now: () => performance.now() });
      const pt = r.points[0]!;
      expect(pt.shots).toBe(9 * (48 * 47) / 2); // all 3^2·C(48,2) Pauli errors of weight 2
      expect(pt.failures).toBe(0);
    } finally {
      await pool.close();
    }
  }, 120_000);

  it('at p = 0.01 the full set at 3 iterations beats the original matrices at 32; at p = 0.04 it does worse', async () => {
    const pool = await openPool(2);
    try {
      const full = await fullOvercomplete(pool);
      const tc = trialCode(code);
      const plan = (iterations: number, withFull: boolean, ps: number[], shots: number) => ({
        code: tc, matrices: withFull ? [decoderMatrix(tc, 'full', full.hx, full.hz)] : [decoderMatrix(tc, 'original')],
        decoder: bp4(iterations), noise: 'depolarizing' as const, ps, samples: { kind: 'channel' as const }, shots, failures: null, timeLimit: null, batch: 256, seed: 11,
      });
      const hooks = { now: () => performance.now() };
      const orig = await runTrial(plan(32, false, [0.01, 0.04], 20000), pool, hooks);
      const over = await runTrial(plan(3, true, [0.01, 0.04], 20000), pool, hooks);
      const at = (r: typeof orig, p: number) => r.points.find((x) => x.p === p)!;
      // common practice: redundant checks let few-iteration BP beat many-iteration BP at low noise ...
      expect(at(over, 0.01).interval[1]).toBeLessThan(at(orig, 0.01).rate);
      // ... while at higher noise plain flooding BP on the full set is worse (the reason the trial strategy exists)
      expect(at(over, 0.04).rate).toBeGreaterThan(at(orig, 0.04).rate);
    } finally {
      await pool.close();
    }
  }, 180_000);
});

describe('trial strategy', () => {
  it('chooses the prefix with the fewest failures on the scoring samples, within the budget, deterministically', () => {
    const surface = buildFamily('surface:d=3');
    if (surface.kind !== 'css') throw new Error('css');
    const c = surface.code;
    const tc = trialCode(c);
    const scoring: TrialScoring = { code: tc, decoder: bp4(3), noise: 'depolarizing', ps: [0.05], shots: 600, seed: 3 };
    // candidates: sums of pairs of X checks
    const rows: number[][] = [];
    for (let a = 0; a < c.hx.rows; a++) for (let b = a + 1; b < c.hx.rows; b++) {
      const s = new Set<number>();
      for (const r of [a, b]) for (let q = 0; q < c.n; q++) if ((c.hx.data[r * c.hx.stride + (q >>> 5)]! >>> (q & 31)) & 1) { if (s.has(q)) s.delete(q); else s.add(q); }
      rows.push([...s].sort((x, y) => x - y));
    }
    const cands = verifyCandidates(c.hx, rows, 'pairs');
    let selection: TrialSelection | undefined;
    const run = () => conditionSide({
      side: 'x', h: c.hx, candidates: cands, basis: 'all', budget: { extra: 4 }, latencyModel: 'serial', iterations: 3, strategy: 'trial', seed: 1,
      trial: trialSelector(scoring, c.n, (m) => ({ dx: m, dz: c.hz }), (sel) => (selection = sel)),
    });
    const out = run();
    // the reported measurements: nested prefixes from none to the longest that fits, the kept one the fewest failures
    expect(selection!.prefixes[0]!.added).toBe(0);
    expect(selection!.prefixes.at(-1)!.added).toBe(4);
    expect(selection!.chosen).toBe(out.added.length);
    const kept = selection!.prefixes.find((p) => p.added === selection!.chosen)!;
    expect(kept.failures).toBe(Math.min(...selection!.prefixes.map((p) => p.failures)));
    expect(selection!.shots).toBe(600);
    expect(out.added.length).toBeLessThanOrEqual(4);
    expect(run().added).toEqual(out.added);
    // it is at least as good as adding nothing, on the scoring samples
    const { failures } = scorePairs(scoring, [{ label: 'none', dx: c.hx, dz: c.hz }, { label: 'chosen', dx: out.matrix, dz: c.hz }]);
    expect(failures[1]!).toBeLessThanOrEqual(failures[0]!);
  });
});

import { describe, expect, it } from 'vitest';
import { runTrial, trialPoint, type PointResult, type TrialPlan } from '../../src/decode/runner.js';
import { decoderMatrix, trialCode } from '../../src/decode/trial-engine.js';
import { buildFamily } from '../../src/codes/families/index.js';
import { fromRowVectors, rowVector, vstack } from '../../src/gf2/bitmatrix.js';
import { InputError } from '../../src/errors.js';
import { openPool } from '../../src/parallel/pool.js';

function family(spec: string) {
  const b = buildFamily(spec);
  if (b.kind !== 'css') throw new Error('expected a CSS code');
  return trialCode(b.code);
}

/** H plus the sums of consecutive pairs of rows: an overcomplete matrix with the same row space. */
function overcomplete(h: ReturnType<typeof family>['hx']) {
  const extra = [];
  for (let r = 0; r + 1 < h.rows; r += 2) {
    const v = rowVector(h, r);
    for (let w = 0; w < h.stride; w++) v[w] = v[w]! ^ h.data[(r + 1) * h.stride + w]!;
    extra.push(v);
  }
  return vstack(h, fromRowVectors(h.cols, extra));
}

const code = family('toric:L=4');
const base: TrialPlan = {
  code,
  matrices: [decoderMatrix(code, 'original'), decoderMatrix(code, 'pairs', overcomplete(code.hx), overcomplete(code.hz))],
  decoder: { decoder: 'bp4', rule: 'min-sum', scale: 0.75, schedule: 'flooding', iterations: 10, earlyStop: true, osd: { kind: 'order0' } },
  noise: 'depolarizing',
  ps: [0.04, 0.08],
  samples: { kind: 'channel' },
  shots: 700,
  failures: null,
  timeLimit: null,
  batch: 100,
  seed: 'runner-test',
};
const clock = { now: () => performance.now() };
const stable = (pts: PointResult[]) => pts.map(({ decodesPerSecond: _d, ...rest }) => rest);

describe('trial runner', () => {
  it('gives the same counts inline and on two workers, and as trialPoint', async () => {
    const inline = await runTrial(base, await openPool(0), clock);
    const pool = await openPool(2);
    let threaded;
    try {
      threaded = await runTrial(base, pool, clock);
    } finally {
      await pool.close();
    }
    expect(stable(threaded.points)).toEqual(stable(inline.points));
    expect(threaded.comparisons).toEqual(inline.comparisons);
    const direct = trialPoint(base, 0.08);
    expect(direct.counts.map((c) => c.failures)).toEqual(inline.points.filter((p) => p.p === 0.08).map((p) => p.failures));
    expect(inline.points.every((p) => p.shots === 700)).toBe(true);
    // the paired counts are consistent with the marginal counts
    for (const c of inline.comparisons) {
      const mine = inline.points.find((p) => p.label === c.label && p.p === c.p)!;
      const theirs = inline.points.find((p) => p.label === c.baseline && p.p === c.p)!;
      expect(c.onlyThisFailed - c.onlyBaselineFailed).toBe(mine.failures - theirs.failures);
      expect(c.difference).toBeCloseTo(mine.rate - theirs.rate, 12);
    }
  });

  it('stops a point at the first batch boundary where every matrix has the requested failures', async () => {
    const plan: TrialPlan = { ...base, ps: [0.1], shots: 5000, failures: 15, batch: 50 };
    const pool = await openPool(2);
    let r;
    try {
      r = await runTrial(plan, pool, clock);
    } finally {
      await pool.close();
    }
    const shots = r.points[0]!.shots;
    expect(shots % 50).toBe(0);
    expect(shots).toBeLessThan(5000);
    expect(r.points.every((p) => p.failures >= 15 && p.stoppedBy === 'failures')).toBe(true);
    // one batch fewer would not have been enough for some matrix
    const shorter = trialPoint({ ...plan, failures: null, shots: shots - 50 }, 0.1);
    expect(shorter.counts.some((c) => c.failures < 15)).toBe(true);
  });

  it('compares a matrix with itself: no discordant shot', async () => {
    const plan: TrialPlan = { ...base, ps: [0.08], matrices: [decoderMatrix(code, 'a'), decoderMatrix(code, 'b')] };
    const r = await runTrial(plan, await openPool(0), clock);
    expect(r.comparisons[0]!.onlyThisFailed + r.comparisons[0]!.onlyBaselineFailed).toBe(0);
    expect(r.comparisons[0]!.difference).toBe(0);
  });

  it('exhaustive weight-1 audit of the d=3 surface code: 3n errors, all corrected (BP4 + OSD)', async () => {
    const surface = family('surface:d=3');
    const plan: TrialPlan = {
      ...base,
      code: surface,
      matrices: [decoderMatrix(surface, 'original')],
      ps: [0.05],
      samples: { kind: 'weight', weight: 1, exhaustive: true },
      decoder: { ...base.decoder, rule: 'sum-product', scale: 1, osd: { kind: 'sweep', order: 4 } },
    };
    const r = await runTrial(plan, await openPool(0), clock);
    expect(r.points[0]!.shots).toBe(27);
    // common practice: a distance-3 code corrects every single-qubit error
    expect(r.points[0]!.failures).toBe(0);
  });

  it('rejects a decoder matrix row outside the row space, naming it', () => {
    const bad = overcomplete(code.hx);
    bad.data[20 * bad.stride] = bad.data[20 * bad.stride]! ^ 1;
    expect(() => decoderMatrix(code, 'x', bad, code.hz, { x: '--with-x bad.mtx' })).toThrow(InputError);
    expect(() => decoderMatrix(code, 'x', bad, code.hz, { x: '--with-x bad.mtx' })).toThrow(/--with-x bad\.mtx: row 20 /);
  });
});

import { describe, expect, it } from 'vitest';
import type { DecoderOptions } from '../../src/decode/css-decoder.js';
import { trialPoint, type TrialPlan } from '../../src/decode/runner.js';
import { wilsonInterval } from '../../src/decode/statistics.js';
import { decoderMatrix, trialCode } from '../../src/decode/trial-engine.js';
import { buildFamily } from '../../src/codes/families/index.js';

// Below threshold the logical error rate of the toric code falls as L grows (common practice). At p = 0.01
// it is far too small to count directly in a test (about 1e-5 at L = 5 and below 1e-6 beyond), so the rate is
// estimated by weight: under depolarizing noise an error of weight w is uniform among the 3^w·C(n, w) errors
// of that weight, hence P_L(p) = Σ_w C(n,w) p^w (1−p)^(n−w) · f_L(w) exactly, with f_L(w) the failure
// fraction of random weight-w errors (the `--weight` mode). f_L(w) is sampled on the weights that carry the
// rate; the weights left out (too light to fail, or too unlikely to matter) only bound it from below.
const P = 0.01;
const decoder: DecoderOptions = { decoder: 'bp4', rule: 'sum-product', scale: 1, schedule: 'flooding', iterations: 8, earlyStop: true, osd: { kind: 'sweep', order: 4 } };
const STRATA: Record<number, [number, number][]> = {
  // L: [weight, shots]
  5: [[3, 1000], [4, 1000], [5, 600], [6, 400], [7, 300]],
  7: [[4, 1000], [5, 1500], [6, 2000], [7, 2000], [8, 1000], [9, 600], [11, 600]],
  9: [[5, 1000], [6, 1500], [7, 1500], [8, 1500], [9, 800], [10, 400], [11, 600]],
};

function binomialPmf(n: number, w: number, p: number): number {
  let logC = 0;
  for (let i = 0; i < w; i++) logC += Math.log(n - i) - Math.log(i + 1);
  return Math.exp(logC + w * Math.log(p) + (n - w) * Math.log(1 - p));
}

describe('toric code L = 5, 7, 9 under depolarizing noise at p = 0.01 (BP4 + OSD)', () => {
  it('the logical error rate falls as L grows; so does the failure fraction at a fixed weight', () => {
    const estimate: Record<number, number> = {};
    const fraction: Record<number, Map<number, [number, number]>> = {};
    for (const L of [5, 7, 9]) {
      const built = buildFamily(`toric:L=${L}`);
      if (built.kind !== 'css') throw new Error('css');
      const code = trialCode(built.code);
      const n = code.n;
      fraction[L] = new Map();
      let sum = 0;
      for (const [w, shots] of STRATA[L]!) {
        const plan: TrialPlan = {
          code,
          matrices: [decoderMatrix(code, 'original')],
          decoder,
          noise: 'depolarizing',
          ps: [P],
          samples: { kind: 'weight', weight: w, exhaustive: false },
          shots,
          failures: null,
          timeLimit: null,
          batch: 200,
          seed: `toric-${L}`,
        };
        const c = trialPoint(plan, P).counts[0]!;
        fraction[L]!.set(w, [c.failures, c.shots]);
        sum += binomialPmf(n, w, P) * (c.failures / c.shots);
      }
      estimate[L] = sum;
    }
    console.info([5, 7, 9].map((L) => `L=${L} failures by weight: ` + [...fraction[L]!].map(([w, [f, n]]) => `w${w} ${f}/${n}`).join(' ')).join('\n'));
    console.info(`estimated logical error rate at p=${P}: ` + [5, 7, 9].map((L) => `L=${L}: ${estimate[L]!.toExponential(2)}`).join(', '));
    expect(estimate[5]!).toBeGreaterThan(estimate[7]!);
    expect(estimate[7]!).toBeGreaterThan(estimate[9]!);
    // at a fixed weight the larger torus fails significantly less often (Wilson intervals apart)
    for (const [small, large, w] of [[5, 7, 7], [7, 9, 11]] as const) {
      const [fs, ns] = fraction[small]!.get(w)!;
      const [fl, nl] = fraction[large]!.get(w)!;
      expect(wilsonInterval(fl, nl)[1], `weight ${w}: L=${large} vs L=${small}`).toBeLessThan(wilsonInterval(fs, ns)[0]);
    }
  });
});

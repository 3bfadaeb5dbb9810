import { describe, expect, it } from 'vitest';
import { pairedDifferenceInterval, wilsonInterval } from '../../src/decode/statistics.js';
import { streamRng } from '../../src/parallel/seeds.js';

describe('Wilson score interval', () => {
  // source: Newcombe, "Two-sided confidence intervals for the single proportion: comparison of seven methods",
  // Statistics in Medicine 17, 857–872, 1998 — worked examples of the score method (from memory, 4 decimals).
  const cases: [number, number, number, number][] = [
    [81, 263, 0.2553, 0.3662],
    [15, 148, 0.0624, 0.1605],
    [0, 20, 0, 0.1611],
    [1, 29, 0.0061, 0.1718],
  ];
  for (const [k, n, lo, hi] of cases) {
    it(`${k}/${n}`, () => {
      const [l, h] = wilsonInterval(k, n);
      expect(l).toBeCloseTo(lo, 4);
      expect(h).toBeCloseTo(hi, 4);
    });
  }

  it('is symmetric under k ↦ n − k and contains the estimate', () => {
    for (let n = 1; n < 60; n += 7) {
      for (let k = 0; k <= n; k++) {
        const [l, h] = wilsonInterval(k, n);
        const [l2, h2] = wilsonInterval(n - k, n);
        expect(l).toBeCloseTo(1 - h2, 12);
        expect(h).toBeCloseTo(1 - l2, 12);
        expect(l <= k / n && k / n <= h).toBe(true);
      }
    }
  });
});

describe('paired difference interval (Newcombe method 10)', () => {
  it('covers the true difference about 95% of the time on correlated pairs', () => {
    // true cells: both fail 0.04, only first 0.06, only second 0.02, neither 0.88 → difference 0.04
    const cells = [0.04, 0.06, 0.02, 0.88];
    const truth = cells[1]! - cells[2]!;
    const rng = streamRng('paired-coverage', 0);
    const reps = 2000;
    const n = 300;
    let covered = 0;
    for (let r = 0; r < reps; r++) {
      const t = [0, 0, 0, 0];
      for (let i = 0; i < n; i++) {
        let u = rng.next();
        let k = 0;
        while (k < 3 && u >= cells[k]!) u -= cells[k++]!;
        t[k]!++;
      }
      const { interval } = pairedDifferenceInterval({ both: t[0]!, onlyFirst: t[1]!, onlySecond: t[2]!, neither: t[3]! });
      if (interval[0] <= truth && truth <= interval[1]) covered++;
    }
    // common practice: a 95% method's coverage on 2000 replications lies within a few points of 0.95
    expect(covered / reps).toBeGreaterThan(0.93);
    expect(covered / reps).toBeLessThan(0.975);
  });

  it('gives difference 0 inside the interval when both sides fail on the same shots', () => {
    const d = pairedDifferenceInterval({ both: 12, onlyFirst: 0, onlySecond: 0, neither: 488 });
    expect(d.difference).toBe(0);
    expect(d.interval[0]).toBeLessThan(0);
    expect(d.interval[1]).toBeGreaterThan(0);
  });
});

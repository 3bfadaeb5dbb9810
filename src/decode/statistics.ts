/** z for a two-sided 95% interval: the 0.975 quantile of the standard normal distribution. */
export const Z95 = 1.959963984540054;

/**
 * Wilson score interval for a binomial proportion with k events in n trials (Wilson, "Probable inference,
 * the law of succession, and statistical inference", J. Amer. Statist. Assoc. 22, 1927). [0, 1] when n = 0.
 */
export function wilsonInterval(k: number, n: number, z = Z95): [number, number] {
  if (n <= 0) return [0, 1];
  const z2 = z * z;
  const denom = n + z2;
  const center = (k + z2 / 2) / denom;
  const half = (z / denom) * Math.sqrt((k * (n - k)) / n + z2 / 4);
  const lo = k <= 0 ? 0 : Math.max(0, center - half);
  const hi = k >= n ? 1 : Math.min(1, center + half);
  return [lo, hi];
}

/** The 2×2 table of paired outcomes: both failed, only the first, only the second, neither. */
export interface PairedCounts {
  readonly both: number;
  readonly onlyFirst: number;
  readonly onlySecond: number;
  readonly neither: number;
}

/**
 * Interval for the difference of two proportions measured on the same trials (rate of the first minus
 * rate of the second), by Newcombe's method 10 (hybrid score interval from the two Wilson intervals with
 * the phi correlation of the pairs): Newcombe, "Improved confidence intervals for the difference between
 * binomial proportions based on paired data", Statistics in Medicine 17, 1998.
 */
export function pairedDifferenceInterval(t: PairedCounts, z = Z95): { difference: number; interval: [number, number] } {
  const { both: a, onlyFirst: b, onlySecond: c, neither: d } = t;
  const n = a + b + c + d;
  if (n <= 0) return { difference: 0, interval: [-1, 1] };
  const p1 = (a + b) / n;
  const p2 = (a + c) / n;
  const [l1, u1] = wilsonInterval(a + b, n, z);
  const [l2, u2] = wilsonInterval(a + c, n, z);
  const den = (a + b) * (c + d) * (a + c) * (b + d);
  const phi = den > 0 ? (a * d - b * c) / Math.sqrt(den) : 0;
  const dl = Math.sqrt(Math.max(0, (p1 - l1) ** 2 - 2 * phi * (p1 - l1) * (u2 - p2) + (u2 - p2) ** 2));
  const du = Math.sqrt(Math.max(0, (u1 - p1) ** 2 - 2 * phi * (u1 - p1) * (p2 - l2) + (p2 - l2) ** 2));
  const diff = p1 - p2;
  return { difference: diff, interval: [Math.max(-1, diff - dl), Math.min(1, diff + du)] };
}

import type { CheckRule } from './check-rules.js';

/** How a belief-propagation decoder runs: shared by the binary and the quaternary decoder. */
export interface BpOptions {
  readonly rule: CheckRule;
  /** Factor on every check-to-variable message (1 = plain sum-product; min-sum is usually run below 1). */
  readonly scale: number;
  /** flooding: all checks, then all variables; serial: one check at a time, posteriors updated at once. */
  readonly schedule: 'flooding' | 'serial';
  /** Maximum number of iterations (one iteration = every check updated once). */
  readonly iterations: number;
  /** Stop as soon as the hard decision reproduces the syndrome (tested before the first iteration too). */
  readonly earlyStop: boolean;
}

export const DEFAULT_ITERATIONS = 32;
export const DEFAULT_MIN_SUM_SCALE = 0.75;

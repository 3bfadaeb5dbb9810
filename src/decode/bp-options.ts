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

/** What the iteration driver needs of a BP decoder (binary or quaternary). */
export interface IterativeDecoder {
  readonly options: BpOptions;
  iterations: number;
  matched: boolean;
  start(syndrome: Uint8Array): void;
  iterate(): void;
  /** Whether the current hard decision reproduces the syndrome. */
  matches(syndrome: Uint8Array): boolean;
}

/**
 * Run up to options.iterations iterations; with earlyStop, stop once the hard decision reproduces the
 * syndrome (tested before the first iteration too). Returns the number of iterations run.
 */
export function runIterations(d: IterativeDecoder, syndrome: Uint8Array): number {
  d.start(syndrome);
  const { iterations, earlyStop } = d.options;
  if (earlyStop) {
    d.matched = d.matches(syndrome);
    while (!d.matched && d.iterations < iterations) {
      d.iterate();
      d.matched = d.matches(syndrome);
    }
  } else {
    while (d.iterations < iterations) d.iterate();
    d.matched = d.matches(syndrome);
  }
  return d.iterations;
}

/**
 * Decoders keep messages as likelihood ratios (sum-product) or LLRs (min-sum). The posterior LLRs of the
 * beliefs, written into `llr` (returned).
 */
export function posteriorLlrOf(ratioDomain: boolean, belief: Float64Array, llr: Float64Array): Float64Array {
  if (ratioDomain) for (let v = 0; v < belief.length; v++) llr[v] = Math.log(belief[v]!);
  else llr.set(belief);
  return llr;
}

/** Defaults and limits of the distance audit (shared by the adaptive run, audit.ts, and the fixed plan, fixed-plan.ts). */

/** Combinations every non-exhaustive run spends on a first lower bound. */
export const FREE_ENUMERATION = 1 << 20;
/** auto enumerates all 2^K codewords up to this dimension. */
export const AUTO_EXHAUSTIVE_DIM = 22;
/** Largest dimension exhaustive enumeration accepts (2^32 codewords: tens of seconds). */
export const EXHAUSTIVE_MAX_DIM = 32;
export const DEFAULT_TARGET_MISS = 1e-6;
/** Information-set warm-up before an enumeration (which finds the minimum by itself anyway). */
export const WARMUP_TARGET_MISS = 1e-3;
export const DEFAULT_ENUMERATION_LIMIT = 1e9;
export const DEFAULT_MAX_WORDS = 200_000;
/** Stream offset of side z, so that `--side z` reproduces the z half of `--side both`. */
export const Z_STREAM_BASE = 2 ** 30;

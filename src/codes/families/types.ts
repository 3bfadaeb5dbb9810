import type { BitMatrix } from '../../gf2/bitmatrix.js';
import type { CssCode } from '../css.js';

/**
 * Column permutations that map a code's row spaces onto themselves: `generators[g][c]` is the image of
 * column c; `orders[g]` is the order of generator g. The group they generate is abelian (products of
 * cyclic shifts) for every family here, so its elements are the products g0^a0 · g1^a1 · ….
 */
export interface ShiftSymmetry {
  readonly generators: readonly Int32Array[];
  readonly orders: readonly number[];
}

export type BuiltFamily =
  | { readonly kind: 'css'; readonly code: CssCode; readonly name: string; readonly symmetry?: ShiftSymmetry }
  | { readonly kind: 'classical'; readonly h: BitMatrix; readonly name: string; readonly generator?: BitMatrix; readonly symmetry?: ShiftSymmetry };

/** Reads a matrix file named inside a spec (hgp:h1=FILE); given by the caller so the core does no I/O. */
export type MatrixLoader = (path: string) => BitMatrix;

import { hstack } from '../../gf2/bitmatrix.js';
import { transpose } from '../../gf2/transpose.js';
import { cssCode } from '../css.js';
import { parsePolynomial } from '../polynomial.js';
import { type FamilySpec, SpecReader } from '../spec.js';
import { blockShift, groupAlgebraMatrix } from './circulant.js';
import type { BuiltFamily } from './types.js';

/** HX = [A | B], HZ = [Bᵀ | Aᵀ]: commutes because A and B commute (both polynomials in commuting shifts). */
function bicycle(spec: FamilySpec, l: number, m: number, aKey: string, bKey: string, vars: 'x' | 'xy'): BuiltFamily {
  const pa = spec.params.get(aKey)!;
  const pb = spec.params.get(bKey)!;
  const a = groupAlgebraMatrix(parsePolynomial(pa.value, vars, spec.text, pa.offset), l, m);
  const b = groupAlgebraMatrix(parsePolynomial(pb.value, vars, spec.text, pb.offset), l, m);
  const code = cssCode(hstack(a, b), hstack(transpose(b), transpose(a)), spec.text);
  const generators = vars === 'x' ? [blockShift(l, 1, 1, 0, 2)] : [blockShift(l, m, 1, 0, 2), blockShift(l, m, 0, 1, 2)];
  const orders = vars === 'x' ? [l] : [l, m];
  return { kind: 'css', code, name: spec.text, symmetry: { generators, orders } };
}

/** Generalized bicycle code `gb:l=24,a=...,b=...`. */
export function generalizedBicycle(spec: FamilySpec): BuiltFamily {
  const r = new SpecReader(spec, ['l', 'a', 'b']);
  const l = r.int('l', 1, 100_000);
  r.raw('a');
  r.raw('b');
  return bicycle(spec, l, 1, 'a', 'b', 'x');
}

/** Bivariate bicycle code `bb:l=12,m=6,A=...,B=...`. */
export function bivariateBicycle(spec: FamilySpec): BuiltFamily {
  const r = new SpecReader(spec, ['l', 'm', 'A', 'B']);
  const l = r.int('l', 1, 10_000);
  const m = r.int('m', 1, 10_000);
  r.raw('A');
  r.raw('B');
  return bicycle(spec, l, m, 'A', 'B', 'xy');
}

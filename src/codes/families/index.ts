import { cssCode } from '../css.js';
import { parsePolynomial } from '../polynomial.js';
import { type FamilySpec, parseSpec, SpecError, SpecReader } from '../spec.js';
import { bivariateBicycle, generalizedBicycle } from './bicycle.js';
import { cyclicCode, regularLdpc } from './classical.js';
import { rotatedSurfaceCode, toricCode } from './lattice.js';
import { hypergraphProduct } from './product.js';
import type { BitMatrix } from '../../gf2/bitmatrix.js';
import type { BuiltFamily, MatrixLoader } from './types.js';

export type { BuiltFamily, MatrixLoader, ShiftSymmetry } from './types.js';
export { hypergraphProduct, kron } from './product.js';

export const FAMILY_NAMES = ['gb', 'bb', 'toric', 'surface', 'hgp', 'cyclic', 'regular'] as const;

const noFiles: MatrixLoader = (path) => {
  throw new SpecError(path, 0, 'this context cannot read matrix files');
};

/** Build a code or classical matrix from a spec string. `load` reads files named in hgp specs. */
export function buildFamily(text: string, load: MatrixLoader = noFiles): BuiltFamily {
  return buildParsed(parseSpec(text), load);
}

function classicalOperand(value: string, offset: number, spec: FamilySpec, load: MatrixLoader): BitMatrix {
  if (value.startsWith('(')) {
    if (!value.endsWith(')')) throw new SpecError(spec.text, offset + value.length, 'expected ")" closing the nested spec');
    let inner: BuiltFamily;
    try {
      inner = buildFamily(value.slice(1, -1), load);
    } catch (e) {
      if (e instanceof SpecError) throw new SpecError(spec.text, offset, `in the nested spec: ${e.message}`);
      throw e;
    }
    if (inner.kind !== 'classical') throw new SpecError(spec.text, offset, 'expected a classical family (cyclic, regular) inside the parentheses');
    return inner.h;
  }
  return load(value);
}

function buildParsed(spec: FamilySpec, load: MatrixLoader): BuiltFamily {
  switch (spec.family) {
    case 'gb':
      return generalizedBicycle(spec);
    case 'bb':
      return bivariateBicycle(spec);
    case 'toric': {
      const L = new SpecReader(spec, ['L']).int('L', 2, 2000);
      return { kind: 'css', name: spec.text, ...toricCode(L) };
    }
    case 'surface': {
      const d = new SpecReader(spec, ['d']).int('d', 2, 2000);
      return { kind: 'css', name: spec.text, code: rotatedSurfaceCode(d) };
    }
    case 'hgp': {
      const r = new SpecReader(spec, ['h1', 'h2']);
      const a = r.raw('h1');
      const h1 = classicalOperand(a.value, a.offset, spec, load);
      const b = r.has('h2') ? r.raw('h2') : a;
      const h2 = classicalOperand(b.value, b.offset, spec, load);
      return { kind: 'css', name: spec.text, code: hypergraphProduct(h1, h2, spec.text) };
    }
    case 'cyclic': {
      const r = new SpecReader(spec, ['n', 'g']);
      const n = r.int('n', 2, 100_000);
      const g = r.raw('g');
      const terms = parsePolynomial(g.value, 'x', spec.text, g.offset);
      if (terms.length === 0) throw new SpecError(spec.text, g.offset, 'expected a nonzero generator polynomial');
      const { generator, check } = cyclicCode(n, terms.map((t) => t.x));
      return { kind: 'classical', name: spec.text, h: check, generator };
    }
    case 'regular': {
      const r = new SpecReader(spec, ['n', 'col', 'row', 'seed']);
      const n = r.int('n', 2, 1_000_000);
      const col = r.int('col', 1, 100);
      const row = r.int('row', 2, 1000);
      const seed = r.intOr('seed', 1, 0, 2 ** 31);
      return { kind: 'classical', name: spec.text, h: regularLdpc(n, col, row, seed) };
    }
    default:
      throw new SpecError(spec.text, 0, `unknown family "${spec.family}" (expected one of ${FAMILY_NAMES.join(', ')})`);
  }
}

export { cssCode };

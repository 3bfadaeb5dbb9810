/**
 * What a distance run works on: a code C given by a basis, an optional filter that tells the words that
 * count (for the X side of a CSS code, C = ker HZ and the filter is LZ: w ∈ C is a nontrivial X logical
 * exactly when w·LZᵀ ≠ 0, because ker HX = rowspace HZ + span LZ is the dual of rowspace HX), known words
 * that give a first upper bound, and an independent verifier for the words the run reports.
 */
import { type BitMatrix, rowVector } from '../gf2/bitmatrix.js';
import { kernel } from '../gf2/kernel.js';
import { packedDot, packedWeight } from '../gf2/popcount.js';
import { multiplyVector } from '../gf2/product.js';
import { RowSpaceSolver } from '../gf2/solve.js';
import type { CssCode } from '../codes/css.js';
import type { LogicalBasis } from '../codes/logicals.js';
import { type AugmentedBasis, augmentedBasis } from './augmented.js';
import type { WordCollection } from './words.js';

export type Side = 'x' | 'z';

export type Verdict = { ok: true; partner: number | null } | { ok: false; reason: string };

export interface DistanceProblem {
  /** Result key: 'dx', 'dz', or 'd' for a classical code. */
  readonly key: 'dx' | 'dz' | 'd';
  readonly n: number;
  readonly basis: AugmentedBasis;
  /** The filter the basis carries syndromes for (LZ for dX, LX for dZ), as the search kernel takes it. */
  readonly filter?: { readonly rows: number; readonly data: Uint32Array };
  /** Words known to count (logical basis rows, generator rows): the starting upper bound. */
  readonly known: readonly Uint32Array[];
  /**
   * Re-check a reported word without using the filter: for a CSS side, membership of ker HZ by the
   * syndrome and non-membership of rowspace HX by elimination; then the index of a row of the partner
   * logical basis it anticommutes with. For a classical code: nonzero and in the code.
   */
  verify(word: Uint32Array): Verdict;
}

function rows(m: BitMatrix): Uint32Array[] {
  return Array.from({ length: m.rows }, (_, r) => rowVector(m, r));
}

/** Side x: X-type logicals, C = ker HZ, stabilizers rowspace HX, filter LZ. Side z: the roles swapped. */
export function cssSideProblem(code: CssCode, logicals: LogicalBasis, side: Side): DistanceProblem {
  const checks = side === 'x' ? code.hz : code.hx;
  const stabilizers = side === 'x' ? code.hx : code.hz;
  const own = side === 'x' ? logicals.lx : logicals.lz;
  const partner = side === 'x' ? logicals.lz : logicals.lx;
  const basis = augmentedBasis(kernel(checks), partner);
  const solver = new RowSpaceSolver(stabilizers);
  const words = basis.codeWords;
  const checkName = side === 'x' ? 'HZ' : 'HX';
  const stabName = side === 'x' ? 'HX' : 'HZ';
  return {
    key: side === 'x' ? 'dx' : 'dz',
    n: code.n,
    basis,
    filter: { rows: partner.rows, data: partner.data },
    known: rows(own),
    verify(word) {
      if (packedWeight(word, 0, words) === 0) return { ok: false, reason: 'the zero word' };
      const syndrome = multiplyVector(checks, word);
      if (syndrome.some((x) => x !== 0)) return { ok: false, reason: `not in ker ${checkName}` };
      if (solver.contains(word)) return { ok: false, reason: `in rowspace ${stabName} (a stabilizer)` };
      for (let j = 0; j < partner.rows; j++) if (packedDot(word, 0, partner.data, j * partner.stride, words)) return { ok: true, partner: j };
      return { ok: false, reason: 'commutes with every logical of the other type although it is not a stabilizer (inconsistent logical basis)' };
    },
  };
}

/** Classical code with parity-check matrix h: C = ker h. */
export function classicalCheckProblem(h: BitMatrix): DistanceProblem {
  const basis = augmentedBasis(kernel(h));
  return {
    key: 'd',
    n: h.cols,
    basis,
    known: knownRows(basis),
    verify(word) {
      if (packedWeight(word, 0, basis.codeWords) === 0) return { ok: false, reason: 'the zero word' };
      if (multiplyVector(h, word).some((x) => x !== 0)) return { ok: false, reason: 'not in the kernel of the check matrix' };
      return { ok: true, partner: null };
    },
  };
}

/** Classical code spanned by the rows of g. */
export function classicalGeneratorProblem(g: BitMatrix): DistanceProblem {
  const basis = augmentedBasis(g);
  const solver = new RowSpaceSolver(g);
  return {
    key: 'd',
    n: g.cols,
    basis,
    known: knownRows(basis),
    verify(word) {
      if (packedWeight(word, 0, basis.codeWords) === 0) return { ok: false, reason: 'the zero word' };
      if (!solver.contains(word)) return { ok: false, reason: 'not in the row space of the generator matrix' };
      return { ok: true, partner: null };
    },
  };
}

function knownRows(b: AugmentedBasis): Uint32Array[] {
  return Array.from({ length: b.dim }, (_, i) => b.rows.slice(i * b.rowWords, i * b.rowWords + b.codeWords));
}

/**
 * The lightest words of a collection, each re-verified against the problem independently of the filter that
 * found it (an internal error if one fails), and the logical the first one anticommutes with.
 */
export function verifiedMinimum(problem: DistanceProblem, collection: WordCollection): { upper: number; minimum: ReturnType<WordCollection['sorted']>; partner: number | null } {
  const upper = collection.lightest();
  const minimum = collection.sorted().filter((w) => w.weight === upper);
  let partner: number | null = null;
  minimum.forEach((w, i) => {
    const v = problem.verify(w.word);
    if (!v.ok) throw new Error(`${problem.key}: a reported word of weight ${upper} failed re-verification: ${v.reason}`);
    if (i === 0) partner = v.partner;
  });
  return { upper, minimum, partner };
}

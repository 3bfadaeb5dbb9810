/**
 * Exact enumeration of low-weight codewords by the Brouwer–Zimmermann method.
 *
 * The code (dimension K, length n) is brought into systematic form on several pairwise disjoint
 * information sets I_1, I_2, …: set j is found greedily among the columns not used by earlier sets and has
 * rank r_j ≤ K (the later sets are usually partial, r_j < K). In the form G_j, the r_j "pivot" rows are unit
 * vectors on I_j and the other K − r_j rows vanish on I_j. Enumerating all sums of ≤ t rows of G_j lists
 * every codeword c = x·G_j with wt(x) ≤ t. A codeword c never listed by set j at level t_j has
 * wt(x) ≥ t_j + 1, hence at least t_j + 1 − (K − r_j) pivot rows, hence weight ≥ t_j + 1 − (K − r_j) on I_j
 * (the partial-rank accounting of Grassl's and Zimmermann's refinements). The sets being disjoint, a
 * codeword listed by no set has weight at least
 *
 *     L = Σ_j max(0, t_j + 1 − (K − r_j)),
 *
 * and once some set has reached level K every codeword has been listed (L = n + 1 by convention).
 * Every nonzero codeword of weight < L has therefore been seen; when L > W the words of weight ≤ W that
 * were kept are all of them. A filter (e.g. the Z logical basis LZ for the X side of a CSS code) only
 * decides which listed words are kept: the bound is about all codewords, so light filtered-out words
 * (stabilizers) never stop the enumeration and never raise or lower the bound.
 *
 * The hot loop visits the combinations of one level in lexicographic order with a stack of prefix sums:
 * consecutive combinations share all but their last row, so each combination costs one XOR of the packed
 * non-information-set part plus a popcount; nothing is allocated inside.
 */
import { type BitMatrix, fromRowVectors, wordsFor } from '../gf2/bitmatrix.js';
import { packedWeight, popcount32 } from '../gf2/popcount.js';
import { streamRng } from '../parallel/seeds.js';
import { type AugmentedBasis, augmentedBasis } from './augmented.js';
import { WordCollection } from './words.js';

/** One information set of the plan: its columns (in pivot-row order), rank and deficit K − rank. */
export interface InformationSet {
  readonly columns: readonly number[];
  readonly rank: number;
  readonly deficit: number;
}

/**
 * The systematic form G_j of one information set, reduced to what the enumeration reads. Plain data.
 * rows: dim × rowWords; word k < restWords holds bits of the columns outside I_j (ascending, packed), then
 * filterWords words of filter syndrome. pivot[i] = 1 when row i is a unit vector on I_j. full: the rows in
 * original column order (dim × codeWords), used only to rebuild the rare words that are kept.
 */
export interface CombinationMatrix {
  readonly dim: number;
  readonly restWords: number;
  readonly rowWords: number;
  readonly codeWords: number;
  readonly rows: Uint32Array;
  readonly pivot: Uint8Array;
  readonly full: Uint32Array;
}

export interface EnumerationPlan {
  readonly n: number;
  readonly dim: number;
  readonly filterRows: number;
  readonly sets: readonly InformationSet[];
  readonly matrices: readonly CombinationMatrix[];
}

// ---------------------------------------------------------------------------------------------------------
// Binomial coefficients (exact as doubles below 2^53; larger values are reported as Infinity)

const binomCache = new Map<number, number>();
const LIMIT = 2n ** 53n;

/** C(n, k), exact when below 2^53, else Infinity. Exact integer arithmetic, cached; no table of size n². */
export function binomial(n: number, k: number): number {
  if (k < 0 || k > n) return 0;
  const r = Math.min(k, n - k);
  const key = n * 1048576 + r;
  const hit = binomCache.get(key);
  if (hit !== undefined) return hit;
  let c = 1n;
  let out = 1;
  for (let i = 1; i <= r; i++) {
    c = (c * BigInt(n - r + i)) / BigInt(i); // C(n − r + i, i), an integer at every step
    if (c >= LIMIT) {
      out = Infinity;
      break;
    }
  }
  if (out !== Infinity) out = Number(c);
  binomCache.set(key, out);
  return out;
}

/**
 * The combination of rank `rank` (lexicographic order) among the t-subsets of {0..K−1}, written to idx.
 * Precondition: 0 ≤ rank < C(K, t) < 2^53.
 */
export function unrankCombination(K: number, t: number, rank: number, idx: Int32Array): void {
  let r = rank;
  let c = 0;
  for (let l = 0; l < t; l++) {
    for (;;) {
      const below = binomial(K - 1 - c, t - 1 - l);
      if (r < below) break;
      r -= below;
      c++;
    }
    idx[l] = c;
    c++;
  }
}

// ---------------------------------------------------------------------------------------------------------
// Information sets

/**
 * Gauss–Jordan elimination on packed rows (dim × stride), choosing pivots only among `columns` in the given
 * order, at most `dim` of them. Pivot rows end up at the top, in the order found. Returns the pivot columns.
 */
function eliminateOn(work: Uint32Array, dim: number, stride: number, columns: readonly number[]): number[] {
  const pivots: number[] = [];
  let r = 0;
  for (let ci = 0; ci < columns.length && r < dim; ci++) {
    const c = columns[ci]!;
    const w = c >>> 5;
    const bit = 1 << (c & 31);
    let p = -1;
    for (let i = r; i < dim; i++) {
      if (work[i * stride + w]! & bit) {
        p = i;
        break;
      }
    }
    if (p < 0) continue;
    if (p !== r) {
      for (let k = 0; k < stride; k++) {
        const tmp = work[r * stride + k]!;
        work[r * stride + k] = work[p * stride + k]!;
        work[p * stride + k] = tmp;
      }
    }
    const ro = r * stride;
    for (let i = 0; i < dim; i++) {
      if (i !== r && work[i * stride + w]! & bit) {
        const io = i * stride;
        for (let k = 0; k < stride; k++) work[io + k] = work[io + k]! ^ work[ro + k]!;
      }
    }
    pivots.push(c);
    r++;
  }
  return pivots;
}

/** Greedy disjoint information sets for one column order; returns the sets and the reduced forms. */
function greedySets(b: AugmentedBasis, order: readonly number[]): { sets: InformationSet[]; forms: Uint32Array[] } {
  const sets: InformationSet[] = [];
  const forms: Uint32Array[] = [];
  let remaining = order.slice();
  while (remaining.length > 0) {
    const work = b.rows.slice();
    const pivots = eliminateOn(work, b.dim, b.rowWords, remaining);
    if (pivots.length === 0) break;
    sets.push({ columns: pivots, rank: pivots.length, deficit: b.dim - pivots.length });
    forms.push(work);
    const used = new Set(pivots);
    remaining = remaining.filter((c) => !used.has(c));
  }
  return { sets, forms };
}

/** Lexicographic comparison of rank profiles: more full-rank sets first, then higher partial ranks. */
function betterProfile(a: readonly InformationSet[], b: readonly InformationSet[]): boolean {
  const m = Math.max(a.length, b.length);
  for (let i = 0; i < m; i++) {
    const ra = a[i]?.rank ?? 0;
    const rb = b[i]?.rank ?? 0;
    if (ra !== rb) return ra > rb;
  }
  return false;
}

function combinationMatrix(b: AugmentedBasis, set: InformationSet, form: Uint32Array): CombinationMatrix {
  const inSet = new Uint8Array(b.n);
  for (const c of set.columns) inSet[c] = 1;
  const rest: number[] = [];
  for (let c = 0; c < b.n; c++) if (!inSet[c]) rest.push(c);
  const restWords = wordsFor(rest.length);
  const filterWords = b.rowWords - b.codeWords;
  const rowWords = restWords + filterWords;
  const rows = new Uint32Array(b.dim * rowWords);
  const full = new Uint32Array(b.dim * b.codeWords);
  const pivot = new Uint8Array(b.dim);
  for (let i = 0; i < b.dim; i++) {
    const src = i * b.rowWords;
    const dst = i * rowWords;
    for (let q = 0; q < rest.length; q++) {
      const c = rest[q]!;
      if ((form[src + (c >>> 5)]! >>> (c & 31)) & 1) rows[dst + (q >>> 5)] = rows[dst + (q >>> 5)]! | (1 << (q & 31));
    }
    for (let k = 0; k < filterWords; k++) rows[dst + restWords + k] = form[src + b.codeWords + k]!;
    full.set(form.subarray(src, src + b.codeWords), i * b.codeWords);
    pivot[i] = i < set.rank ? 1 : 0;
  }
  return { dim: b.dim, restWords, rowWords, codeWords: b.codeWords, rows, pivot, full };
}

/**
 * Choose disjoint information sets: the natural column order and up to `tries − 1` further column orders
 * drawn from a fixed stream (the plan never depends on the user's seed), keeping the best rank profile.
 * Large codes get fewer tries (about 10⁸ word operations of elimination in all), and none when the first
 * profile is already the best possible (each set as large as the columns left allow).
 */
export function planEnumeration(b: AugmentedBasis, tries = 8): EnumerationPlan {
  if (b.dim === 0) return { n: b.n, dim: 0, filterRows: b.filterRows, sets: [], matrices: [] };
  const natural = Array.from({ length: b.n }, (_, i) => i);
  let best = greedySets(b, natural);
  const workPerTry = b.dim * b.dim * b.rowWords * best.sets.length;
  const allowed = Math.max(1, Math.min(tries, Math.floor(1e8 / Math.max(1, workPerTry))));
  const ideal = (sets: readonly InformationSet[]) => {
    let left = b.n;
    for (const x of sets) {
      if (x.rank < Math.min(b.dim, left)) return false;
      left -= x.rank;
    }
    return true;
  };
  for (let t = 1; t < allowed && !ideal(best.sets); t++) {
    const rng = streamRng('information-sets', t);
    const order = natural.slice();
    for (let i = order.length - 1; i > 0; i--) {
      const j = rng.below(i + 1);
      const tmp = order[i]!;
      order[i] = order[j]!;
      order[j] = tmp;
    }
    const cand = greedySets(b, order);
    if (betterProfile(cand.sets, best.sets)) best = cand;
  }
  const matrices = best.sets.map((s, j) => combinationMatrix(b, s, best.forms[j]!));
  return { n: b.n, dim: b.dim, filterRows: b.filterRows, sets: best.sets, matrices };
}

// ---------------------------------------------------------------------------------------------------------
// Bound and schedule

/** The proven bound for completed levels (levels[j] = highest level fully enumerated for set j). */
export function boundForLevels(plan: EnumerationPlan, levels: readonly number[]): number {
  if (plan.dim === 0) return plan.n + 1;
  let L = 0;
  for (let j = 0; j < plan.sets.length; j++) {
    const t = levels[j] ?? 0;
    if (t >= plan.dim) return plan.n + 1;
    L += Math.max(0, t + 1 - plan.sets[j]!.deficit);
  }
  return Math.min(L, plan.n + 1);
}

/** One unit of work: enumerate level `level` of set `set` (size = number of combinations). */
export interface EnumerationUnit {
  readonly set: number;
  readonly level: number;
  readonly size: number;
}

/**
 * Which (set, level) to enumerate next: levels are enumerated in increasing order per set, and among the
 * sets the one whose next bound increment is cheapest goes first (ties: lower set index). A set whose
 * deficit is d contributes nothing below level d, so partial sets are deferred until their whole prefix
 * of levels is cheaper than the next level of the others; for equal full-rank sets this is the usual
 * level-by-level round robin.
 */
export class EnumerationSchedule {
  readonly levels: number[];

  constructor(readonly plan: EnumerationPlan) {
    this.levels = plan.sets.map(() => 0);
  }

  bound(): number {
    return boundForLevels(this.plan, this.levels);
  }

  next(): EnumerationUnit | null {
    const K = this.plan.dim;
    let bestSet = -1;
    let bestCost = Infinity;
    for (let j = 0; j < this.plan.sets.length; j++) {
      const t = this.levels[j]!;
      if (t >= K) continue;
      const target = Math.max(t + 1, this.plan.sets[j]!.deficit);
      let cost = 0;
      for (let s = t + 1; s <= Math.min(target, K); s++) cost += binomial(K, s);
      if (cost < bestCost) {
        bestCost = cost;
        bestSet = j;
      }
    }
    if (bestSet < 0 || !Number.isFinite(bestCost)) return null;
    const level = this.levels[bestSet]! + 1;
    return { set: bestSet, level, size: binomial(K, level) };
  }

  complete(unit: EnumerationUnit): void {
    if (this.levels[unit.set] !== unit.level - 1) throw new Error(`level ${unit.level} of set ${unit.set} completed out of order`);
    this.levels[unit.set] = unit.level;
  }
}

export type EnumerationGoal = 'exceed' | 'reach';

/**
 * Whether the bound settles the question for codes of length n: all words ≤ W listed (exceed), or none
 * below W missed (reach). W is capped at n (bound n + 1 means every codeword was listed).
 */
export function goalMet(bound: number, maxWeight: number, goal: EnumerationGoal, n: number): boolean {
  const w = Math.min(maxWeight, n);
  return goal === 'exceed' ? bound > w : bound >= w;
}

/**
 * Combinations still to enumerate, following the schedule from `levels`, until the goal is met for W
 * (Infinity when a needed level is beyond 2^53 combinations).
 */
export function remainingCost(plan: EnumerationPlan, levels: readonly number[], maxWeight: number, goal: EnumerationGoal): number {
  const s = new EnumerationSchedule(plan);
  levels.forEach((t, j) => (s.levels[j] = t));
  let cost = 0;
  while (!goalMet(s.bound(), maxWeight, goal, plan.n)) {
    const u = s.next();
    if (!u || !Number.isFinite(u.size)) return Infinity;
    cost += u.size;
    s.complete(u);
  }
  return cost;
}

// ---------------------------------------------------------------------------------------------------------
// The hot loop

/**
 * Visit `count` combinations of `t` rows of m, starting at lexicographic rank `start`, and append to `hits`
 * the t row indices of each combination whose word has weight ≤ maxWeight and passes the filter
 * (syndrome part nonzero; every word passes when m has no filter words). Returns the number visited
 * (less than count only when the level ends). Preconditions: 1 ≤ t ≤ m.dim, start + count ≤ C(dim, t) < 2^53.
 */
export function scanLevel(m: CombinationMatrix, t: number, start: number, count: number, maxWeight: number, hits: number[]): number {
  const K = m.dim;
  const S = m.rowWords;
  const R = m.restWords;
  const rows = m.rows;
  const piv = m.pivot;
  if (t < 1 || t > K || count <= 0) return 0;
  const idx = new Int32Array(t);
  unrankCombination(K, t, start, idx);
  // pre row l (0 ≤ l < t) = XOR of rows idx[0..l−1]; pw[l] = number of pivot rows among them
  const pre = new Uint32Array(t * S);
  const pw = new Int32Array(t);
  for (let l = 1; l < t; l++) {
    const r = idx[l - 1]! * S;
    for (let k = 0; k < S; k++) pre[l * S + k] = pre[(l - 1) * S + k]! ^ rows[r + k]!;
    pw[l] = pw[l - 1]! + piv[idx[l - 1]!]!;
  }
  const filtered = S > R;
  let remaining = count;
  for (;;) {
    const b = (t - 1) * S;
    const bw = pw[t - 1]!;
    const first = idx[t - 1]!;
    const end = K - first > remaining ? first + remaining : K;
    const p0 = pre[b]!;
    const p1 = R > 1 ? pre[b + 1]! : 0;
    const p2 = R > 2 ? pre[b + 2]! : 0;
    const p3 = R > 3 ? pre[b + 3]! : 0;
    for (let i = first; i < end; i++) {
      i = R >= 1 && R <= 4 ? nextLight4(rows, piv, S, R, i, end, p0, p1, p2, p3, bw, maxWeight) : nextLight(rows, piv, S, R, pre, b, i, end, bw, maxWeight);
      if (i >= end) break;
      if (filtered) {
        const o = i * S;
        let nz = 0;
        for (let k = R; k < S; k++) nz |= pre[b + k]! ^ rows[o + k]!;
        if (nz === 0) continue;
      }
      for (let l = 0; l < t - 1; l++) hits.push(idx[l]!);
      hits.push(i);
    }
    remaining -= end - first;
    if (remaining <= 0) break;
    // the last position ran off the end: advance the rightmost earlier position that can move
    let l = t - 2;
    while (l >= 0 && idx[l]! >= K - t + l) l--;
    if (l < 0) break;
    idx[l] = idx[l]! + 1;
    for (let q = l + 1; q < t; q++) idx[q] = idx[q - 1]! + 1;
    for (let q = l + 1; q < t; q++) {
      const r = idx[q - 1]! * S;
      for (let k = 0; k < S; k++) pre[q * S + k] = pre[(q - 1) * S + k]! ^ rows[r + k]!;
      pw[q] = pw[q - 1]! + piv[idx[q - 1]!]!;
    }
  }
  return count - Math.max(0, remaining);
}

/**
 * The first i in [from, end) whose word (prefix ⊕ row i, prefix given as up to four words p0..p3 and bw
 * pivot rows) has weight ≤ W, or end. Precondition: 1 ≤ R ≤ 4 (R = 0 goes to nextLight). Small on purpose, so that the engine
 * optimises it as one tight loop; each word's popcount is followed by an early exit.
 */
function nextLight4(rows: Uint32Array, piv: Uint8Array, S: number, R: number, from: number, end: number, p0: number, p1: number, p2: number, p3: number, bw: number, W: number): number {
  for (let i = from; i < end; i++) {
    const o = i * S;
    let w = bw + piv[i]! + popcount32(p0 ^ rows[o]!);
    if (w > W) continue;
    if (R > 1) {
      w += popcount32(p1 ^ rows[o + 1]!);
      if (w > W) continue;
      if (R > 2) {
        w += popcount32(p2 ^ rows[o + 2]!);
        if (w > W) continue;
        if (R > 3) {
          w += popcount32(p3 ^ rows[o + 3]!);
          if (w > W) continue;
        }
      }
    }
    return i;
  }
  return end;
}

/** As nextLight4 for any number of words R, the prefix read from pre[b..b+R−1]. */
function nextLight(rows: Uint32Array, piv: Uint8Array, S: number, R: number, pre: Uint32Array, b: number, from: number, end: number, bw: number, W: number): number {
  for (let i = from; i < end; i++) {
    const o = i * S;
    let w = bw + piv[i]!;
    for (let k = 0; k < R && w <= W; k++) w += popcount32(pre[b + k]! ^ rows[o + k]!);
    if (w <= W) return i;
  }
  return end;
}

/** Rebuild the packed n-bit word of a hit (t row indices at hits[at..at+t−1]) into out (codeWords words). */
export function rebuildWord(m: CombinationMatrix, hits: ArrayLike<number>, at: number, t: number, out: Uint32Array): void {
  out.fill(0);
  for (let l = 0; l < t; l++) {
    const o = hits[at + l]! * m.codeWords;
    for (let k = 0; k < m.codeWords; k++) out[k] = out[k]! ^ m.full[o + k]!;
  }
}

/** Merge one chunk's hits into a collection; returns how many words were new. */
export function collectHits(m: CombinationMatrix, t: number, hits: ArrayLike<number>, into: WordCollection): number {
  const w = new Uint32Array(m.codeWords);
  let added = 0;
  for (let at = 0; at + t <= hits.length; at += t) {
    rebuildWord(m, hits, at, t, w);
    if (into.add(w, packedWeight(w, 0, m.codeWords))) added++;
  }
  return added;
}

// ---------------------------------------------------------------------------------------------------------
// Synchronous driver: the reusable exact kernel

/** What the enumeration proved, in a form a report can print. */
export interface EnumerationProof {
  readonly sets: readonly { size: number; rank: number; level: number }[];
  /** Every nonzero codeword that was not listed has weight ≥ bound (n + 1: every codeword was listed). */
  readonly bound: number;
  readonly combinations: number;
}

export interface ExactEnumeration {
  /** Kept words (weight ≤ maxWeight, passing the filter), sorted by weight then support. */
  readonly words: BitMatrix;
  readonly weights: readonly number[];
  /** The final weight limit W (lowered to the lightest kept word in adaptive mode). */
  readonly maxWeight: number;
  /**
   * True when bound > min(W, n) and no word was dropped for capacity: `words` is exactly the set of filtered
   * codewords of weight ≤ W.
   */
  readonly complete: boolean;
  /** Words within the limit were dropped because `maxWords` was reached. */
  readonly truncated: boolean;
  readonly proof: EnumerationProof;
}

export interface EnumerationOptions {
  /** Lower W to the weight of the lightest kept word as the run goes (minimum-distance mode). */
  readonly adaptive?: boolean;
  /** Combinations per call of the hot loop between stop checks (default 2^20). */
  readonly chunkSize?: number;
  /** Do not start a level whose combinations would take the total beyond this (default: no limit). */
  readonly budget?: number;
  /** Asked between chunks; a true answer ends the run with the bound of the completed levels. */
  readonly shouldStop?: () => boolean;
  /** Stop as soon as bound ≥ W ('reach', enough to certify a minimum) instead of bound > W ('exceed'). */
  readonly goal?: EnumerationGoal;
  /** Words to seed the collection with (e.g. an upper-bound witness in adaptive mode). */
  readonly seedWords?: readonly Uint32Array[];
  /** Most words kept (default: no limit); beyond it the result is marked truncated and incomplete. */
  readonly maxWords?: number;
}

/**
 * All codewords of rowspace(generator) of weight ≤ maxWeight (and, with a filter, only those w with
 * w·filterᵀ ≠ 0), with a proof of exactness: `complete` is true exactly when the Brouwer–Zimmermann bound
 * exceeds W, i.e. no such word can have been missed. Runs on the calling thread; see certify.ts for the
 * parallel driver over the same plan and hot loop.
 */
export function enumerateUpTo(generator: BitMatrix, maxWeight: number, filter?: BitMatrix, options: EnumerationOptions = {}): ExactEnumeration {
  const basis = augmentedBasis(generator, filter);
  const plan = planEnumeration(basis);
  const goal = options.goal ?? 'exceed';
  const chunk = options.chunkSize ?? 1 << 20;
  const budget = options.budget ?? Infinity;
  const collection = new WordCollection(basis.codeWords, maxWeight, options.adaptive ?? false, options.maxWords ?? Infinity);
  for (const w of options.seedWords ?? []) collection.add(w);
  const schedule = new EnumerationSchedule(plan);
  let combinations = 0;
  let stopped = false;
  const hits: number[] = [];
  while (!stopped && !goalMet(schedule.bound(), collection.limit, goal, plan.n)) {
    const unit = schedule.next();
    if (!unit || combinations + unit.size > budget) break;
    const m = plan.matrices[unit.set]!;
    for (let start = 0; start < unit.size; start += chunk) {
      if (options.shouldStop?.()) {
        stopped = true;
        break;
      }
      hits.length = 0;
      const visited = scanLevel(m, unit.level, start, Math.min(chunk, unit.size - start), collection.limit, hits);
      combinations += visited;
      collectHits(m, unit.level, hits, collection);
    }
    if (!stopped) schedule.complete(unit);
  }
  return finishEnumeration(plan, schedule, collection, combinations);
}

/** Package a run's collection and bound. */
export function finishEnumeration(plan: EnumerationPlan, schedule: EnumerationSchedule, collection: WordCollection, combinations: number): ExactEnumeration {
  const sorted = collection.sorted();
  const bound = schedule.bound();
  return {
    words: fromRowVectors(plan.n, sorted.map((s) => s.word)),
    weights: sorted.map((s) => s.weight),
    maxWeight: collection.limit,
    complete: goalMet(bound, collection.limit, 'exceed', plan.n) && !collection.truncated,
    truncated: collection.truncated,
    proof: {
      sets: plan.sets.map((s, j) => ({ size: s.columns.length, rank: s.rank, level: schedule.levels[j]! })),
      bound,
      combinations,
    },
  };
}

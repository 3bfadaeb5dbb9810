import type { BitMatrix } from '../gf2/bitmatrix.js';
import type { ShiftSymmetry } from '../codes/families/types.js';
import { groupElements, permuteWord } from '../search/orbits.js';
import { WordStore } from '../search/store.js';
import { streamRng } from '../parallel/seeds.js';
import type { Budget } from './budget.js';
import type { MatrixState } from './state.js';
import type { ShortCycleDelta } from './cycle-delta.js';

export type Strategy = 'lightest' | 'balanced' | 'fewest-cycles' | 'orbits' | 'trial';
export const STRATEGIES: readonly Strategy[] = ['lightest', 'balanced', 'fewest-cycles', 'orbits', 'trial'];

/** Candidates as the selection sees them. */
export interface Pool {
  readonly words: readonly Uint32Array[];
  readonly weights: readonly number[];
}

/** A seeded random rank per candidate: the last tie-break, so equal candidates are taken in a seeded order. */
export function tieRanks(count: number, seed: string | number): Float64Array {
  const rng = streamRng(seed, 7001);
  const r = new Float64Array(count);
  for (let i = 0; i < count; i++) r[i] = rng.nextDouble();
  return r;
}

function lexLess(a: readonly number[], b: readonly number[]): boolean {
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return a[i]! < b[i]!;
  return false;
}

/**
 * Greedy selection: repeatedly add the candidate with the smallest key (compared lexicographically, every
 * key recomputed each round) that still fits the budget. A candidate that stops fitting is dropped for
 * good: every budget only tightens as rows are added.
 */
export function greedySelect(
  pool: Pool, state: MatrixState, budget: Budget, key: (i: number) => number[], onAdd: (i: number) => void, alreadyAdded = 0,
): number[] {
  const n = pool.words.length;
  const alive = new Uint8Array(n).fill(1);
  const chosen: number[] = [];
  for (;;) {
    let best = -1;
    let bestKey: number[] = [];
    for (let i = 0; i < n; i++) {
      if (!alive[i]) continue;
      if (!state.fits([pool.words[i]!], [pool.weights[i]!], alreadyAdded + chosen.length, budget)) {
        alive[i] = 0; // budgets only tighten as rows are added
        continue;
      }
      const k = key(i);
      if (best < 0 || lexLess(k, bestKey)) {
        best = i;
        bestKey = k;
      }
    }
    if (best < 0) return chosen;
    alive[best] = 0;
    state.add(pool.words[best]!);
    onAdd(best);
    chosen.push(best);
  }
}

/** Lightest first; among equal weights prefer rows on low-degree columns (keeps column degrees even). */
export function selectLightest(pool: Pool, state: MatrixState, budget: Budget, seed: string | number): number[] {
  const tie = tieRanks(pool.words.length, seed);
  return greedySelect(pool, state, budget, (i) => [pool.weights[i]!, degreeLoad(state, pool.words[i]!), tie[i]!], () => {});
}

/** Balanced: minimise the spread (max − min) of column degrees, then their sum of squares, then weight. */
export function selectBalanced(pool: Pool, state: MatrixState, budget: Budget, seed: string | number): number[] {
  const tie = tieRanks(pool.words.length, seed);
  return greedySelect(pool, state, budget, (i) => {
    const v = pool.words[i]!;
    let max = 0;
    let min = Infinity;
    let sq = 0;
    for (let c = 0; c < state.cols; c++) {
      const d = state.colDegree[c]! + ((v[c >>> 5]! >>> (c & 31)) & 1);
      if (d > max) max = d;
      if (d < min) min = d;
      sq += d * d;
    }
    return [max - min, sq, pool.weights[i]!, tie[i]!];
  }, () => {});
}

/** Sum of the current degrees of the columns a word touches. */
export function degreeLoad(state: MatrixState, v: Uint32Array): number {
  let t = 0;
  for (let x = 0; x < state.stride; x++) {
    let y = v[x]!;
    while (y !== 0) {
      const low = y & -y;
      t += state.colDegree[(x << 5) + (31 - Math.clz32(low))]!;
      y ^= low;
    }
  }
  return t;
}

/**
 * Fewest new short cycles: key (new 4-cycles, new 6-cycles, weight) if the candidate were added now,
 * from the incremental counter (exact; see cycle-delta.ts).
 */
export function selectFewestCycles(pool: Pool, state: MatrixState, budget: Budget, seed: string | number, cycles: ShortCycleDelta): number[] {
  const tie = tieRanks(pool.words.length, seed);
  return greedySelect(pool, state, budget, (i) => {
    const d = cycles.delta(pool.words[i]!);
    return [d.d4, d.d6, pool.weights[i]!, tie[i]!];
  }, (i) => cycles.add(pool.words[i]!));
}

/** Split candidates into orbits under the shift group (orbits missing a member in the pool are incomplete). */
export function candidateOrbits(pool: Pool, sym: ShiftSymmetry, cols: number): { members: number[]; complete: boolean }[] {
  const elements = groupElements(sym, cols);
  const stride = (cols + 31) >>> 5;
  const index = new WordStore(cols, pool.words.length + 16);
  pool.words.forEach((w) => index.add(w));
  const done = new Uint8Array(pool.words.length);
  const out: { members: number[]; complete: boolean }[] = [];
  const img = new Uint32Array(stride);
  for (let i = 0; i < pool.words.length; i++) {
    if (done[i]) continue;
    const members = new Set<number>();
    let complete = true;
    for (const e of elements) {
      permuteWord(e, pool.words[i]!, img, stride);
      const j = index.indexOf(img);
      if (j < 0) complete = false;
      else members.add(j);
    }
    for (const j of members) done[j] = 1;
    out.push({ members: [...members].sort((a, b) => a - b), complete });
  }
  return out;
}

/** Whole orbits only, lightest orbit first (ties: smaller orbits, then seeded order); a quasi-cyclic matrix stays so. */
export function selectOrbits(pool: Pool, state: MatrixState, budget: Budget, seed: string | number, sym: ShiftSymmetry): number[] {
  const orbits = candidateOrbits(pool, sym, state.cols).filter((o) => o.complete);
  const tie = tieRanks(orbits.length, seed);
  const order = orbits.map((o, i) => i).sort((a, b) => {
    const oa = orbits[a]!;
    const ob = orbits[b]!;
    return pool.weights[oa.members[0]!]! - pool.weights[ob.members[0]!]! || oa.members.length - ob.members.length || tie[a]! - tie[b]!;
  });
  const chosen: number[] = [];
  for (const oi of order) {
    const m = orbits[oi]!.members;
    const vs = m.map((i) => pool.words[i]!);
    if (!state.fits(vs, m.map((i) => pool.weights[i]!), chosen.length, budget)) continue;
    for (const v of vs) state.add(v);
    chosen.push(...m);
  }
  return chosen;
}

export type { BitMatrix };

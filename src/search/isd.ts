import { popcount32 } from '../gf2/popcount.js';
import { streamRng, type Xoshiro128 } from '../parallel/seeds.js';
import { WordStore } from './store.js';

/**
 * Information-set search for low-weight words of a binary linear code given by a full-rank generator
 * matrix (k × n, packed). Each iteration visits one information set I (k columns on which the generator
 * is invertible) and brings the generator to systematic form on I: every row then has exactly one 1 on I
 * (its pivot), so the weight of a sum of rows is plain popcount and its weight on I is the number of rows.
 *
 * - A chunk starts from a fresh random information set (random column order, Gauss–Jordan elimination);
 *   with `segment` > 1 the following segment − 1 iterations each swap one column of I for one outside it
 *   (Canteaut & Chabaud, IEEE Trans. Inf. Theory 44(1), 1998), one pivot step instead of an elimination.
 * - Lee–Brickell (p = 1 or 2): every sum of at most p systematic rows is checked.
 * - Stern (Stern, 1989; Leon, IEEE Trans. Inf. Theory 34(5), 1988): I is split in halves X, Y and a window
 *   of `window` columns outside I is drawn; sums of ≤ p rows of X and ≤ p rows of Y that agree on the window
 *   are combined and checked. Finds a word when it has ≤ p ones on each half and none on the window.
 */
export interface IsdSettings {
  readonly variant: 'lee-brickell' | 'stern';
  readonly p: number;
  readonly window: number;
  /** Information sets visited per fresh start (1: always fresh; >1: swap steps in between). */
  readonly segment: number;
}

export interface IsdChunkTask {
  readonly rows: number;
  readonly cols: number;
  readonly generator: Uint32Array;
  /** Keep only words with odd overlap with at least one filter row (e.g. LZ: nontrivial X logicals). */
  readonly filter?: { readonly rows: number; readonly data: Uint32Array };
  readonly maxWeight: number;
  readonly settings: IsdSettings;
  readonly seed: string | number;
  readonly stream: number;
  /** Information sets visited in this chunk (a multiple of settings.segment keeps the analysis exact). */
  readonly iterations: number;
  /** Stop collecting after this many distinct words (the chunk reports overflow). */
  readonly maxWords: number;
}

export interface IsdChunkResult {
  /** Distinct words found, packed back to back (count × stride). */
  readonly words: Uint32Array;
  readonly count: number;
  readonly iterations: number;
  readonly overflow: boolean;
}

/** Working state of one chunk; all buffers preallocated. */
class IsdState {
  readonly k: number;
  readonly n: number;
  readonly s: number;
  readonly m: Uint32Array;
  readonly piv: Int32Array;
  readonly isInfo: Uint8Array;
  readonly order: Int32Array;
  readonly tmp: Uint32Array;
  readonly candRows: Int32Array;

  constructor(readonly task: IsdChunkTask, readonly rng: Xoshiro128) {
    this.k = task.rows;
    this.n = task.cols;
    this.s = (task.cols + 31) >>> 5;
    this.m = new Uint32Array(this.k * this.s);
    this.piv = new Int32Array(this.k);
    this.isInfo = new Uint8Array(this.n);
    this.order = new Int32Array(this.n);
    this.tmp = new Uint32Array(this.s);
    this.candRows = new Int32Array(this.k);
  }

  /** Fresh information set: random column order, Gauss–Jordan pivoting in that order. */
  fresh(): void {
    const { k, n, s, m, piv, isInfo, order, rng } = this;
    m.set(this.task.generator.subarray(0, k * s));
    isInfo.fill(0);
    for (let i = 0; i < n; i++) order[i] = i;
    for (let i = n - 1; i > 0; i--) {
      const j = rng.below(i + 1);
      const t = order[i]!;
      order[i] = order[j]!;
      order[j] = t;
    }
    let r = 0;
    for (let oi = 0; oi < n && r < k; oi++) {
      const c = order[oi]!;
      const w = c >>> 5;
      const bit = 1 << (c & 31);
      let p = -1;
      for (let i = r; i < k; i++) if (m[i * s + w]! & bit) { p = i; break; }
      if (p < 0) continue;
      if (p !== r) for (let x = 0; x < s; x++) { const t = m[r * s + x]!; m[r * s + x] = m[p * s + x]!; m[p * s + x] = t; }
      this.pivotOn(r, c);
      r++;
    }
    if (r < k) throw new Error('information-set search: generator matrix is not of full rank');
  }

  /** Clear column c from every row but r (row r has a 1 there), and make c the pivot of row r. */
  private pivotOn(r: number, c: number): void {
    const { k, s, m, piv, isInfo } = this;
    const w = c >>> 5;
    const bit = 1 << (c & 31);
    const ro = r * s;
    for (let i = 0; i < k; i++) {
      if (i !== r && m[i * s + w]! & bit) {
        const io = i * s;
        for (let x = 0; x < s; x++) m[io + x] = m[io + x]! ^ m[ro + x]!;
      }
    }
    piv[r] = c;
    isInfo[c] = 1;
  }

  /** One Canteaut–Chabaud step: a random column outside I replaces the pivot of a random row covering it. */
  swap(): void {
    const { k, n, s, m, isInfo, piv, candRows, rng } = this;
    for (let attempt = 0; attempt < 64; attempt++) {
      const c = rng.below(n);
      if (isInfo[c]) continue;
      const w = c >>> 5;
      const bit = 1 << (c & 31);
      let cnt = 0;
      for (let i = 0; i < k; i++) if (m[i * s + w]! & bit) candRows[cnt++] = i;
      if (cnt === 0) continue;
      const r = candRows[rng.below(cnt)]!;
      isInfo[piv[r]!] = 0;
      this.pivotOn(r, c);
      return;
    }
    this.fresh();
  }
}

function passesFilter(filter: IsdChunkTask['filter'], v: Uint32Array, s: number): boolean {
  if (!filter) return true;
  for (let r = 0; r < filter.rows; r++) {
    let x = 0;
    const o = r * s;
    for (let i = 0; i < s; i++) x ^= filter.data[o + i]! & v[i]!;
    if (popcount32(x >>> 0) & 1) return true;
  }
  return false;
}

/** Run one chunk of information-set search. Pure: the result depends only on the task. */
export function isdChunk(task: IsdChunkTask): IsdChunkResult {
  const st = new IsdState(task, streamRng(task.seed, task.stream));
  const { k, n, s, m, tmp } = st;
  const W = task.maxWeight;
  const found = new WordStore(n, 256);
  let overflow = false;
  const take = (): void => {
    if (!passesFilter(task.filter, tmp, s)) return;
    if (found.size >= task.maxWords) {
      if (!found.has(tmp)) overflow = true;
      return;
    }
    found.add(tmp);
  };
  const { variant, p, window, segment } = task.settings;
  const winCols = new Int32Array(Math.max(0, window));
  const sternBuf = variant === 'stern' ? new SternBuffers(n, k, p, window) : null;
  const proj = new Int32Array(k);
  const first = new Uint32Array(2 * k);
  const half = new Int32Array(k);
  let it = 0;
  for (; it < task.iterations && !overflow; it++) {
    if (it % segment === 0) st.fresh();
    else st.swap();
    if (variant === 'lee-brickell') {
      // words 0 and 1 of every row, contiguous: most pairs are rejected on them alone (inline popcount, no calls)
      for (let a = 0; a < k; a++) {
        first[2 * a] = m[a * s]!;
        first[2 * a + 1] = s > 1 ? m[a * s + 1]! : 0;
      }
      for (let a = 0; a < k; a++) {
        const ao = a * s;
        let wt = 0;
        for (let x = 0; x < s && wt <= W; x++) wt += popcount32(m[ao + x]!);
        if (wt <= W) {
          for (let x = 0; x < s; x++) tmp[x] = m[ao + x]!;
          take();
        }
        if (p < 2) continue;
        const a0 = first[2 * a]!;
        const a1 = first[2 * a + 1]!;
        for (let b = a + 1; b < k; b++) {
          let y = a0 ^ first[2 * b]!;
          let z = a1 ^ first[2 * b + 1]!;
          y = y - ((y >>> 1) & 0x55555555);
          z = z - ((z >>> 1) & 0x55555555);
          y = (y & 0x33333333) + ((y >>> 2) & 0x33333333);
          z = (z & 0x33333333) + ((z >>> 2) & 0x33333333);
          y = (y + (y >>> 4)) & 0x0f0f0f0f;
          z = (z + (z >>> 4)) & 0x0f0f0f0f;
          let w2 = (Math.imul(y, 0x01010101) >>> 24) + (Math.imul(z, 0x01010101) >>> 24);
          if (w2 > W) continue;
          const bo = b * s;
          for (let x = 2; x < s && w2 <= W; x++) w2 += popcount32(m[ao + x]! ^ m[bo + x]!);
          if (w2 <= W) {
            for (let x = 0; x < s; x++) tmp[x] = m[ao + x]! ^ m[bo + x]!;
            take();
          }
        }
      }
    } else {
      sternStep(st, W, p, window, winCols, proj, half, take, sternBuf!);
    }
  }
  return { words: found.packed(), count: found.size, iterations: it, overflow };
}

/** Preallocated buffers of the Stern step (sized once per chunk). */
class SternBuffers {
  readonly chosen: Uint8Array;
  readonly xa: Int32Array;
  readonly xb: Int32Array;
  readonly next: Int32Array;
  readonly head: Int32Array;
  /** head[key] is valid only when stamp[key] equals the current step (lazy reset of the bucket table). */
  readonly stamp: Int32Array;
  step = 0;

  constructor(n: number, k: number, p: number, l: number) {
    const k1 = k >>> 1;
    const subsets = 1 + k1 + (p >= 2 ? (k1 * (k1 - 1)) / 2 : 0);
    this.chosen = new Uint8Array(n);
    this.xa = new Int32Array(subsets);
    this.xb = new Int32Array(subsets);
    this.next = new Int32Array(subsets);
    this.head = new Int32Array(1 << l);
    this.stamp = new Int32Array(1 << l).fill(-1);
  }
}

/** XOR of up to four rows (−1 = absent) into tmp, with the weight; stops counting once above W. */
function combineWeight(m: Uint32Array, s: number, a: number, b: number, c: number, d: number, tmp: Uint32Array, W: number): number {
  let wt = 0;
  for (let x = 0; x < s; x++) {
    let v = 0;
    if (a >= 0) v ^= m[a * s + x]!;
    if (b >= 0) v ^= m[b * s + x]!;
    if (c >= 0) v ^= m[c * s + x]!;
    if (d >= 0) v ^= m[d * s + x]!;
    tmp[x] = v;
    wt += popcount32(v);
    if (wt > W) return wt;
  }
  return wt;
}

/**
 * One Stern step on the current systematic form: random halves of the pivot rows, a random window of
 * columns outside I, sums of ≤ p rows per half bucketed by their window projection.
 */
function sternStep(
  st: IsdState, W: number, p: number, l: number, winCols: Int32Array, proj: Int32Array, half: Int32Array, take: () => void, buf: SternBuffers,
  onCollision?: (a: number, b: number, c: number, d: number) => void,
): void {
  const { k, n, s, m, isInfo, rng, tmp } = st;
  const { chosen, xa, xb, next, head, stamp } = buf;
  const step = ++buf.step;
  let got = 0;
  chosen.fill(0);
  while (got < l) {
    const c = rng.below(n);
    if (isInfo[c] || chosen[c]) continue;
    chosen[c] = 1;
    winCols[got++] = c;
  }
  for (let i = 0; i < k; i++) {
    let key = 0;
    for (let j = 0; j < l; j++) {
      const c = winCols[j]!;
      key |= ((m[i * s + (c >>> 5)]! >>> (c & 31)) & 1) << j;
    }
    proj[i] = key;
    half[i] = i;
  }
  for (let i = k - 1; i > 0; i--) {
    const j = rng.below(i + 1);
    const t = half[i]!;
    half[i] = half[j]!;
    half[j] = t;
  }
  const k1 = k >>> 1;
  // subsets of X = half[0..k1) of size 0..p (p ≤ 2) as (a, b), −1 for absent, chained by window key
  let count = 0;
  const push = (a: number, b: number) => {
    const key = (a >= 0 ? proj[a]! : 0) ^ (b >= 0 ? proj[b]! : 0);
    xa[count] = a;
    xb[count] = b;
    if (stamp[key] !== step) {
      stamp[key] = step;
      head[key] = -1;
    }
    next[count] = head[key]!;
    head[key] = count;
    count++;
  };
  push(-1, -1);
  for (let i = 0; i < k1; i++) {
    push(half[i]!, -1);
    if (p >= 2) for (let j = i + 1; j < k1; j++) push(half[i]!, half[j]!);
  }
  // subsets of Y = half[k1..k) of size 0..p, each checked against its bucket
  for (let i = k1 - 1; i < k; i++) {
    const c = i < k1 ? -1 : half[i]!;
    const jEnd = c < 0 || p < 2 ? i + 1 : k;
    for (let j = i; j < jEnd; j++) {
      const d = j === i ? -1 : half[j]!;
      const key = (c >= 0 ? proj[c]! : 0) ^ (d >= 0 ? proj[d]! : 0);
      if (stamp[key] !== step) continue;
      for (let t = head[key]!; t >= 0; t = next[t]!) {
        const a = xa[t]!;
        if (a < 0 && c < 0) continue; // the zero word
        if (onCollision) onCollision(a, xb[t]!, c, d);
        if (combineWeight(m, s, a, xb[t]!, c, d, tmp, W) <= W) take();
      }
    }
  }
}

/** The probe information set: one fresh elimination with stream 0 of the seed "probe". */
function probeState(rows: number, cols: number, generator: Uint32Array, settings: IsdSettings): IsdState {
  const task: IsdChunkTask = { rows, cols, generator, maxWeight: -1, settings, seed: 'probe', stream: 0, iterations: 0, maxWords: 0 };
  const st = new IsdState(task, streamRng('probe', 0));
  st.fresh();
  return st;
}

/**
 * Density of the systematic rows outside the information set after one fresh elimination with stream 0 of
 * the seed "probe": the mean, and the fraction of rows sparser than a tenth of it. Sparse codes keep sparse
 * systematic rows, which the planner's cost model needs: popcounts stop later, and sparse rows collide on
 * Stern's window far more often than random ones (all of them project to zero).
 */
export function systematicDensity(rows: number, cols: number, generator: Uint32Array): { mean: number; sparseRows: number } {
  if (rows === 0 || cols <= rows) return { mean: 0.5, sparseRows: 0 };
  const st = probeState(rows, cols, generator, { variant: 'lee-brickell', p: 1, window: 0, segment: 1 });
  const weights: number[] = [];
  for (let r = 0; r < rows; r++) {
    let w = -1;
    for (let x = 0; x < st.s; x++) w += popcount32(st.m[r * st.s + x]!);
    weights.push(w);
  }
  const mean = weights.reduce((a, b) => a + b, 0) / (rows * (cols - rows));
  const sparse = weights.filter((w) => w / (cols - rows) < mean / 10).length;
  return { mean, sparseRows: sparse / rows };
}

/** What the Lee–Brickell loop does on one information set (measured on the probe set by pairProbe). */
export interface PairCounts {
  /** Row pairs whose first two words pass the early weight test, plus the further words read for them. */
  readonly words: number;
  /** Rows, and sums of two rows, of weight ≤ W: each one goes to the word store. */
  readonly keptRows: number;
  readonly keptPairs: number;
}

/** What one Stern step does (measured on the probe set by sternProbe). */
export interface SternCounts {
  /** Pairs of half-sums agreeing on the window, the zero word excluded. */
  readonly collisions: number;
  /** Words combined for them before the weight passes W. */
  readonly words: number;
  /** Sums of weight ≤ W among them (each one goes to the word store). */
  readonly kept: number;
}


/**
 * The work of the Lee–Brickell loop with weight bound W on the probe information set (stream 0 of seed
 * "probe"): the same early test on the first two words of each pair, counted instead of kept. Sparse codes
 * keep sparse systematic rows, whose pairs pass that test far more often than random ones. Deterministic.
 */
export function pairProbe(rows: number, cols: number, generator: Uint32Array, W: number): PairCounts {
  if (rows === 0 || cols <= rows) return { words: 0, keptRows: 0, keptPairs: 0 };
  const st = probeState(rows, cols, generator, { variant: 'lee-brickell', p: 2, window: 0, segment: 1 });
  const { k, s, m } = st;
  let words = 0;
  let keptRows = 0;
  let keptPairs = 0;
  for (let a = 0; a < k; a++) {
    const ao = a * s;
    let wt = 0;
    for (let x = 0; x < s && wt <= W; x++) wt += popcount32(m[ao + x]!);
    if (wt <= W) keptRows++;
    for (let b = a + 1; b < k; b++) {
      const bo = b * s;
      let w2 = popcount32(m[ao]! ^ m[bo]!) + (s > 1 ? popcount32(m[ao + 1]! ^ m[bo + 1]!) : 0);
      if (w2 > W) continue;
      words++;
      for (let x = 2; x < s && w2 <= W; x++) {
        w2 += popcount32(m[ao + x]! ^ m[bo + x]!);
        words++;
      }
      if (w2 <= W) keptPairs++;
    }
  }
  return { words, keptRows, keptPairs };
}

/** Stern steps the probe averages over (fewer once it has counted PROBE_COLLISIONS collisions). */
const PROBE_STEPS = 4;
const PROBE_COLLISIONS = 1e5;

/**
 * The work of one Stern step with parameters p, window l and weight bound W, averaged over up to four
 * steps (random halves and windows) on the probe information set (stream 0 of seed "probe"): window
 * collisions, the words combined for them (the kernel stops once the weight passes W) and the sums kept.
 * The planner's measured stand-in for the random-code model, which badly underestimates sparse systematic
 * forms. Deterministic.
 */
export function sternProbe(rows: number, cols: number, generator: Uint32Array, W: number, p: number, l: number): SternCounts {
  if (rows < 2 || cols - rows < l) return { collisions: Infinity, words: Infinity, kept: 0 };
  const st = probeState(rows, cols, generator, { variant: 'stern', p, window: l, segment: 1 });
  const { s, m } = st;
  let collisions = 0;
  let words = 0;
  let kept = 0;
  const count = (a: number, b: number, c: number, d: number): void => {
    collisions++;
    let wt = 0;
    for (let x = 0; x < s && wt <= W; x++) {
      let v = 0;
      if (a >= 0) v ^= m[a * s + x]!;
      if (b >= 0) v ^= m[b * s + x]!;
      if (c >= 0) v ^= m[c * s + x]!;
      if (d >= 0) v ^= m[d * s + x]!;
      wt += popcount32(v);
      words++;
    }
    if (wt <= W) kept++;
  };
  const buf = new SternBuffers(cols, rows, p, l);
  const winCols = new Int32Array(l);
  const proj = new Int32Array(rows);
  const half = new Int32Array(rows);
  let steps = 0;
  // maxWeight −1 for the step itself: nothing is taken, the count above weighs each collision with W
  while (steps < PROBE_STEPS && collisions < PROBE_COLLISIONS) {
    sternStep(st, -1, p, l, winCols, proj, half, () => {}, buf, count);
    steps++;
  }
  return { collisions: collisions / steps, words: words / steps, kept: kept / steps };
}

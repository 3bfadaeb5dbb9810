import type { PatternGraph } from './canonical.js';
import type { SidedGraph } from './tanner.js';
import { chineseRemainder, modulusPrime, primesForBound } from './modular.js';
import { WideSum } from './widesum.js';

/**
 * Homomorphism counts hom(F, G) of a small bipartite pattern F into a Tanner graph G, sides kept
 * (F's S-nodes go to G's S-side, T-nodes to the T-side), by variable elimination over dense factors
 * (a sum–product over the pattern's nodes, one factor per edge to start with).
 *
 * - A node whose neighbours are all still present and number at most three is summed out into a shared
 *   table of the other side: degrees, the overlap matrix (M·Mᵀ on S, Mᵀ·M on T) or the triple-overlap
 *   tensor, built once per graph when it fits (TABLE_LIMIT, TRIPLE_LIMIT). This step is free.
 * - Any other node v is summed out of the product of the factors containing it, creating a factor over
 *   the nodes reachable from v through nodes already gone. When v still has an edge to a node u of that
 *   scope, v only runs over the adjacency list of u's value.
 * - The order minimizes the summed work (Π of the scope's domain sizes × v's range) by dynamic
 *   programming over the subsets of nodes (≤ 12 nodes, 4096 subsets), refusing factors above
 *   FACTOR_LIMIT entries.
 * Arithmetic is exact: doubles while every intermediate stays below 2^53 (all terms are non-negative, so
 * checking each step's results suffices), else residues modulo as many primes below 2^26 as the float
 * estimate requires, recombined by the Chinese remainder theorem.
 */
/** The shared tensors of one side: c_X(a, …) = number of common neighbours of the nodes X, |X| ≤ 3. */
export interface SideTensors {
  readonly size: number;
  readonly degree: Float64Array;
  /** c[a·n + b], diagonal = degrees; null when n² > TABLE_LIMIT. */
  readonly overlap: Float64Array | null;
  /** c[(a·n + b)·n + c]; null when n³ > TRIPLE_LIMIT. */
  readonly triple: Float64Array | null;
}

export interface HomTarget {
  readonly s: number;
  readonly t: number;
  readonly graph: SidedGraph;
  readonly S: SideTensors;
  readonly T: SideTensors;
  /** Incidence M[a·t + x] (0/1), built on first use. */
  incidence(): Float64Array;
}

/** Largest shared overlap table (entries, 64 MB) and triple table (32 MB). */
export const TABLE_LIMIT = 1 << 23;
export const TRIPLE_LIMIT = 1 << 22;
/** Largest factor (entries) a step may create. */
export const FACTOR_LIMIT = 1 << 23;

function sideTensors(n: number, ptr: Int32Array, otherPtr: Int32Array, otherAdj: Int32Array, otherCount: number): SideTensors {
  const degree = new Float64Array(n);
  for (let a = 0; a < n; a++) degree[a] = ptr[a + 1]! - ptr[a]!;
  const overlap = n * n <= TABLE_LIMIT ? new Float64Array(n * n) : null;
  const triple = n * n * n <= TRIPLE_LIMIT ? new Float64Array(n * n * n) : null;
  if (overlap) {
    for (let x = 0; x < otherCount; x++) {
      const lo = otherPtr[x]!;
      const hi = otherPtr[x + 1]!;
      for (let i = lo; i < hi; i++) {
        const a = otherAdj[i]!;
        for (let j = lo; j < hi; j++) {
          const b = otherAdj[j]!;
          overlap[a * n + b]! += 1;
          if (triple) {
            const base = (a * n + b) * n;
            for (let k = lo; k < hi; k++) triple[base + otherAdj[k]!]! += 1;
          }
        }
      }
    }
  }
  return { size: n, degree, overlap, triple };
}

export function homTarget(g: SidedGraph): HomTarget {
  const { s, t, sPtr, sAdj, tPtr, tAdj } = g;
  const S = sideTensors(s, sPtr, tPtr, tAdj, t);
  const T = sideTensors(t, tPtr, sPtr, sAdj, s);
  let m: Float64Array | null = null;
  return {
    s,
    t,
    graph: g,
    S,
    T,
    incidence() {
      if (m === null) {
        m = new Float64Array(s * t);
        for (let a = 0; a < s; a++) for (let i = sPtr[a]!; i < sPtr[a + 1]!; i++) m[a * t + sAdj[i]!] = 1;
      }
      return m;
    },
  };
}

interface Factor {
  /** Variable ids, in the order of the row-major layout of `data`. */
  vars: number[];
  data: Float64Array;
  /** An untouched edge factor (vars [S-node, T-node]): its nonzeros are the target's adjacency lists. */
  edge: boolean;
}

type Source = 'S1' | 'S2' | 'S3' | 'T1' | 'T2' | 'T3';

/**
 * A pattern prepared for elimination. Variables are the pattern's nodes: S-nodes 0..sCount−1 (domain s),
 * then T-nodes (domain t); the factors start as one incidence factor per edge. A step either sums a node
 * out of the product of its factors, or, when none of its neighbours is gone yet and it has at most three
 * of them, replaces its edges by the shared tensor of the other side (`cached`).
 */
export interface HomPlan {
  /** Nodes 0..sCount−1 are S-nodes, the others T-nodes (domains s and t of the target). */
  readonly sCount: number;
  readonly nodes: number;
  readonly edges: readonly (readonly [number, number])[];
  readonly steps: readonly { v: number; cached: Source | null }[];
  /** Σ over the steps of Π(domain sizes), the work of one run. */
  readonly work: number;
}

export interface TableAvailability {
  readonly S: readonly boolean[];
  readonly T: readonly boolean[];
}

export function tableAvailability(target: HomTarget): TableAvailability {
  return {
    S: [false, true, target.S.overlap !== null, target.S.triple !== null],
    T: [false, true, target.T.overlap !== null, target.T.triple !== null],
  };
}

/**
 * `sDeg`/`tDeg`: mean degree of the S-/T-nodes of the target. Summing out a node that still has an edge
 * to a node of the new factor's scope runs over that node's adjacency list instead of its whole domain.
 * Returns work = Infinity when some factor would exceed FACTOR_LIMIT whatever the order.
 */
export function planHomomorphism(p: PatternGraph, s: number, t: number, tables: TableAvailability, sDeg = s, tDeg = t): HomPlan {
  const n = p.sCount + p.tCount;
  const dims: number[] = [];
  for (let v = 0; v < n; v++) dims.push(v < p.sCount ? s : t);
  const edges = p.edges.map(([a, x]) => [a, p.sCount + x] as const);
  const pattern = new Array<number>(n).fill(0);
  for (const [a, x] of edges) {
    pattern[a] = pattern[a]! | (1 << x);
    pattern[x] = pattern[x]! | (1 << a);
  }
  // Which tensor replaces node v's edges: T-nodes sum into tensors over S-nodes (the S side's), and back.
  const cachedSource = (v: number): Source | null => {
    const deg = popcount(pattern[v]!);
    if (deg > 3) return null;
    if (v >= p.sCount) return tables.S[deg] ? (`S${deg}` as Source) : null;
    return tables.T[deg] ? (`T${deg}` as Source) : null;
  };
  const cachedOk = new Uint8Array(n);
  for (let v = 0; v < n; v++) cachedOk[v] = cachedSource(v) !== null ? 1 : 0;
  const sMask = (1 << p.sCount) - 1;
  // domain products s^i·t^j by counts of S- and T-nodes in the scope
  const sPow = [1];
  const tPow = [1];
  for (let i = 1; i <= n; i++) {
    sPow.push(sPow[i - 1]! * s);
    tPow.push(tPow[i - 1]! * t);
  }
  /** Work of summing out v after the set `prev`, Infinity when its factor would be too large. */
  const stepCost = (prev: number, v: number): number => {
    const nv = pattern[v]!;
    if ((nv & prev) === 0 && cachedOk[v]) return 0;
    let seen = 1 << v;
    let frontier = nv & prev;
    let reach = nv;
    seen |= frontier;
    while (frontier !== 0) {
      const low = frontier & -frontier;
      frontier ^= low;
      const nu = pattern[31 - Math.clz32(low)]!;
      reach |= nu;
      const next = nu & prev & ~seen;
      seen |= next;
      frontier |= next;
    }
    const scope = reach & ~prev & ~(1 << v);
    const size = sPow[popcount(scope & sMask)]! * tPow[popcount(scope & ~sMask)]!;
    if (size > FACTOR_LIMIT) return Infinity;
    // a live edge (v, u) with u in the scope: v ranges over the neighbours of u's value
    const span = (nv & ~prev) !== 0 ? (v < p.sCount ? tDeg : sDeg) : dims[v]!;
    return size * span;
  };
  const full = (1 << n) - 1;
  const best = new Float64Array(1 << n).fill(Infinity);
  const choice = new Int8Array(1 << n);
  best[0] = 0;
  for (let E = 1; E <= full; E++) {
    for (let v = 0; v < n; v++) {
      if (!(E & (1 << v))) continue;
      const prev = E & ~(1 << v);
      if (best[prev] === Infinity) continue;
      const total = best[prev]! + stepCost(prev, v);
      if (total < best[E]!) {
        best[E] = total;
        choice[E] = v;
      }
    }
  }
  if (best[full] === Infinity) return { sCount: p.sCount, nodes: n, edges, steps: [], work: Infinity };
  const order: number[] = [];
  for (let E = full; E !== 0; E &= ~(1 << choice[E]!)) order.push(choice[E]!);
  order.reverse();
  let gone = 0;
  const steps = order.map((v) => {
    const cached = (pattern[v]! & gone) === 0 ? cachedSource(v) : null;
    gone |= 1 << v;
    return { v, cached };
  });
  return { sCount: p.sCount, nodes: n, edges, steps, work: best[full]! };
}

function popcount(x: number): number {
  x = x - ((x >>> 1) & 0x55555555);
  x = (x & 0x33333333) + ((x >>> 2) & 0x33333333);
  return (Math.imul((x + (x >>> 4)) & 0x0f0f0f0f, 0x01010101) >>> 24);
}

/** hom(F, G) exactly. */
export function homomorphismCount(target: HomTarget, plan: HomPlan): bigint {
  if (plan.work === Infinity) throw new Error('homomorphism plan exceeds the factor size limit');
  const approx = runPlan(target, plan, 0);
  if (approx.exact !== null) return approx.exact;
  const k = primesForBound(approx.value * (1 + 1e-6) + 2);
  const residues: number[] = [];
  for (let i = 0; i < k; i++) residues.push(runPlan(target, plan, modulusPrime(i)).value);
  return chineseRemainder(residues);
}

const SAFE = 2 ** 53;

/**
 * One run: mod = 0 for plain doubles, else residues modulo the prime `mod`. In double mode `exact` is the
 * result when every factor stayed below 2^53 (the last sum, a scalar, is accumulated exactly, so only
 * the intermediate factors have to fit), else null and `value` is a close estimate.
 */
function runPlan(target: HomTarget, plan: HomPlan, mod: number): { value: number; exact: bigint | null } {
  const dims: number[] = [];
  for (let v = 0; v < plan.nodes; v++) dims.push(v < plan.sCount ? target.s : target.t);
  const m = reduced(target.incidence(), mod);
  let factors: Factor[] = plan.edges.map(([a, x]) => ({ vars: [a, x], data: m, edge: true }));
  let overflow = false;
  let last: bigint | null = null;
  plan.steps.forEach(({ v, cached }, step) => {
    const touching: Factor[] = [];
    const rest: Factor[] = [];
    for (const f of factors) (f.vars.includes(v) ? touching : rest).push(f);
    if (cached !== null) {
      const vars = touching.map((f) => (f.vars[0] === v ? f.vars[1]! : f.vars[0]!)).sort((a, b) => a - b);
      rest.push({ vars, data: reduced(tableData(target, cached), mod), edge: false });
    } else {
      const merged = mergeSameScope(touching, mod);
      const final = step === plan.steps.length - 1 && rest.length === 0;
      if (final && !mod && !overflow) last = exactScalar(merged, v, dims);
      const r = eliminate(merged, v, dims, mod, target.graph);
      overflow ||= r.overflow;
      rest.push(r.factor);
    }
    factors = rest;
  });
  let value = 1;
  for (const f of factors) {
    value = mod ? (value * f.data[0]!) % mod : value * f.data[0]!;
  }
  return { value, exact: mod || overflow ? null : last };
}

/**
 * The last step (all other nodes gone): Σ_v Π factors as an exact BigInt, or null when a single product
 * leaves the exact range of doubles. Inputs are exact (below 2^53).
 */
function exactScalar(touching: Factor[], v: number, dims: number[]): bigint | null {
  const driver = touching.find((f) => f.edge);
  if (driver) return null; // the pattern is connected: a last node with a live edge cannot occur
  const datas = touching.map((f) => f.data);
  const sum = new WideSum();
  let local = 0;
  for (let xv = 0; xv < dims[v]!; xv++) {
    let prod = 1;
    for (let k = 0; k < datas.length; k++) prod *= datas[k]![xv]!;
    if (prod >= SAFE) return null;
    local += prod;
    if (local >= 2 ** 52) {
      sum.add(local);
      local = 0;
    }
  }
  sum.add(local);
  return sum.value();
}

function tableData(target: HomTarget, source: Source): Float64Array {
  const side = source[0] === 'S' ? target.S : target.T;
  const d = source[1] === '1' ? side.degree : source[1] === '2' ? side.overlap : side.triple;
  if (!d) throw new Error(`table ${source} missing`);
  return d;
}

const reducedCache = new WeakMap<Float64Array, Map<number, Float64Array>>();

function reduced(d: Float64Array, mod: number): Float64Array {
  if (!mod) return d;
  let byMod = reducedCache.get(d);
  if (!byMod) reducedCache.set(d, (byMod = new Map()));
  let r = byMod.get(mod);
  if (!r) {
    let needs = false;
    for (let i = 0; i < d.length; i++) if (d[i]! >= mod) needs = true;
    r = needs ? d.map((x) => x % mod) : d;
    byMod.set(mod, r);
  }
  return r;
}

/** Multiply together factors over the same variables (in the same order), so inner loops read fewer arrays. */
function mergeSameScope(fs: Factor[], mod: number): Factor[] {
  const out: Factor[] = [];
  for (const f of fs) {
    const twin = f.edge ? undefined : out.find((g) => !g.edge && g.vars.length === f.vars.length && g.vars.every((u, i) => u === f.vars[i]));
    if (!twin) {
      out.push(f);
      continue;
    }
    const d = new Float64Array(f.data.length);
    const a = twin.data;
    const b = f.data;
    if (mod) for (let i = 0; i < d.length; i++) d[i] = mulMod(a[i]!, b[i]!, mod);
    else for (let i = 0; i < d.length; i++) d[i] = a[i]! * b[i]!;
    out[out.indexOf(twin)] = { vars: twin.vars, data: d, edge: false };
  }
  return out;
}

/** a·b mod p for 0 ≤ a, b < p < 2^26 (the product is exact in a double; the quotient estimate is off by ≤ 1). */
function mulMod(a: number, b: number, p: number): number {
  const x = a * b;
  let r = x - Math.floor(x / p) * p;
  if (r < 0) r += p;
  else if (r >= p) r -= p;
  return r;
}

/**
 * Sum out variable v from the product of the touching factors, producing a factor over the union of their
 * other variables. With an untouched edge factor (v, u) among them, v runs over the adjacency list of u's
 * current value only; the other factors are read at v's position.
 */
function eliminate(touching: Factor[], v: number, dims: number[], mod: number, g: SidedGraph): { factor: Factor; overflow: boolean } {
  const scopeSet = new Set<number>();
  for (const f of touching) for (const u of f.vars) if (u !== v) scopeSet.add(u);
  const scope = [...scopeSet].sort((a, b) => a - b);
  const driverAt = touching.findIndex((f) => f.edge);
  const driver = driverAt >= 0 ? touching[driverAt]! : null;
  const others = touching.filter((_, i) => i !== driverAt);
  const nf = others.length;
  const datas = others.map((f) => f.data);
  const strideOf = (f: Factor, u: number): number => {
    const i = f.vars.indexOf(u);
    if (i < 0) return 0;
    let st = 1;
    for (let j = i + 1; j < f.vars.length; j++) st *= dims[f.vars[j]!]!;
    return st;
  };
  const ns = scope.length;
  const sStr = new Int32Array(nf * ns);
  const vStr = new Int32Array(nf);
  for (let k = 0; k < nf; k++) {
    vStr[k] = strideOf(others[k]!, v);
    for (let i = 0; i < ns; i++) sStr[k * ns + i] = strideOf(others[k]!, scope[i]!);
  }
  const sDim = new Int32Array(scope.map((u) => dims[u]!));
  let outSize = 1;
  for (const d of sDim) outSize *= d;
  const out = new Float64Array(outSize);
  const dv = dims[v]!;
  const offs = new Int32Array(nf);
  const idx = new Int32Array(ns);
  // driver: v ranges over adj[ptr[w] .. ptr[w+1]) where w is the current value of the edge's other node
  let drvPos = -1;
  let ptr: Int32Array = g.sPtr;
  let adj: Int32Array = g.sAdj;
  if (driver) {
    const u = driver.vars[0] === v ? driver.vars[1]! : driver.vars[0]!;
    drvPos = scope.indexOf(u);
    const vIsS = driver.vars[0] === v;
    ptr = vIsS ? g.tPtr : g.sPtr;
    adj = vIsS ? g.tAdj : g.sAdj;
  }
  let overflow = false;
  const d0 = datas[0];
  const s0 = vStr[0]!;
  const d1 = datas[1];
  const s1 = nf > 1 ? vStr[1]! : 0;
  for (let o = 0; o < outSize; o++) {
    let lo = 0;
    let hi = dv;
    if (drvPos >= 0) {
      const w = idx[drvPos]!;
      lo = ptr[w]!;
      hi = ptr[w + 1]!;
    }
    let sum = 0;
    if (mod && nf === 2) {
      // residues below 2^26: a product is exact, and the sum is reduced before it can pass 2^53
      const off0 = offs[0]!;
      const off1 = offs[1]!;
      for (let j = lo; j < hi; j++) {
        const xv = drvPos >= 0 ? adj[j]! : j;
        sum += d0![off0 + xv * s0]! * d1![off1 + xv * s1]!;
        if (sum >= 4503599627370496) sum %= mod;
      }
      sum %= mod;
    } else if (mod) {
      for (let j = lo; j < hi; j++) {
        const xv = drvPos >= 0 ? adj[j]! : j;
        let prod = 1;
        for (let k = 0; k < nf; k++) {
          const val = datas[k]![offs[k]! + xv * vStr[k]!]!;
          if (val === 0) {
            prod = 0;
            break;
          }
          prod = k === 0 ? val : mulMod(prod, val, mod);
        }
        sum += prod;
        if (sum >= 4503599627370496) sum %= mod;
      }
      sum %= mod;
    } else if (nf === 1) {
      const off0 = offs[0]!;
      for (let j = lo; j < hi; j++) sum += d0![off0 + (drvPos >= 0 ? adj[j]! : j) * s0]!;
      if (sum >= SAFE) overflow = true;
    } else if (nf === 2) {
      const off0 = offs[0]!;
      const off1 = offs[1]!;
      if (drvPos >= 0) {
        for (let j = lo; j < hi; j++) {
          const xv = adj[j]!;
          sum += d0![off0 + xv * s0]! * d1![off1 + xv * s1]!;
        }
      } else {
        for (let xv = 0; xv < dv; xv++) sum += d0![off0 + xv * s0]! * d1![off1 + xv * s1]!;
      }
      if (sum >= SAFE) overflow = true;
    } else {
      for (let j = lo; j < hi; j++) {
        const xv = drvPos >= 0 ? adj[j]! : j;
        let prod = 1;
        for (let k = 0; k < nf; k++) {
          const val = datas[k]![offs[k]! + xv * vStr[k]!]!;
          if (val === 0) {
            prod = 0;
            break;
          }
          prod *= val;
        }
        sum += prod;
      }
      if (sum >= SAFE) overflow = true;
    }
    out[o] = sum;
    // advance the odometer over the scope (last variable fastest, matching the row-major layout)
    for (let i = ns - 1; i >= 0; i--) {
      idx[i]! += 1;
      for (let k = 0; k < nf; k++) offs[k]! += sStr[k * ns + i]!;
      if (idx[i]! < sDim[i]!) break;
      for (let k = 0; k < nf; k++) offs[k]! -= sStr[k * ns + i]! * sDim[i]!;
      idx[i] = 0;
    }
  }
  return { factor: { vars: scope, data: out, edge: false }, overflow };
}

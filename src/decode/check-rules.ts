import type { TannerEdges } from './tanner-edges.js';

/**
 * Check-node update rules and the passes over the checks that the binary and the quaternary decoders share.
 *
 * A check with syndrome bit s and incoming messages x_1..x_d (LLRs, ln P(0)/P(1)) sends to its k-th neighbour
 *   sum-product: (−1)^s · 2 atanh( ∏_{j≠k} tanh(x_j / 2) )
 *   min-sum:     (−1)^s · scale · ∏_{j≠k} sign(x_j) · min_{j≠k} |x_j|
 * (sum-product results are multiplied by `scale` too; 1 leaves the rule exact).
 *
 * Two number domains, chosen for speed:
 * - min-sum works on LLRs (additions and comparisons only);
 * - sum-product works on likelihood ratios R = e^LLR. Then tanh(x/2) = (R − 1)/(R + 1), so the message
 *   from a variable with posterior ratio P into an edge whose last check message was C has
 *   tanh = (P − C)/(P + C), and the reply is R = (1 + y)/(1 − y) with y the leave-one-out product: the whole
 *   rule costs two divisions per edge and no exp, log or tanh. Variables combine messages by products.
 * Messages are clamped to |LLR| ≤ maxLlr (see messageLimit), which also keeps every product of ratios finite.
 *
 * Layout: a decoder keeps all its numbers in one Float64Array `state`: the check-to-variable message of edge
 * e at state[e], the posterior (belief) of variable v at state[B + v], the accumulated product or sum of its
 * messages at state[A + v]. One array instead of three makes V8's inner loops markedly faster (it re-checks
 * each typed array at every turn of a loop); the gather loop of sum-product also takes two edges per turn.
 *
 * V8 notes (see DEVELOPERS.md, "Trial decoding" → "Speed"): numeric parameters are copied into locals
 * (`x * 1`, `x | 0`) before the loops. A parameter that meets a computed double in a conditional (a clamp,
 * `den > 0 ? … : maxRatio`) otherwise makes V8 keep that value boxed, allocating a heap number per edge,
 * and re-read and re-check the parameter at every turn.
 */
export type CheckRule = 'sum-product' | 'min-sum';

/** The largest |LLR| a check message may carry. */
export const MAX_LLR = 50;

/**
 * Message clamp for a graph whose variables have at most `maxVarDegree` checks: 50, or less when needed so
 * that a variable's product of ratios (degree × clamp, plus its prior) stays far from overflow (e^709).
 */
export function messageLimit(maxVarDegree: number): number {
  return Math.min(MAX_LLR, 600 / Math.max(1, maxVarDegree));
}

/** Scratch space for one check: arrays of at least the largest check degree. */
export interface CheckScratch {
  readonly x: Float64Array;
  readonly t: Float64Array;
  readonly old: Float64Array;
}

export function checkScratch(maxDegree: number): CheckScratch {
  const d = Math.max(1, maxDegree);
  return { x: new Float64Array(d), t: new Float64Array(d), old: new Float64Array(d) };
}

/**
 * One flooding pass of sum-product over all checks, in the ratio domain. Reads beliefs at state[B + v] and the
 * last messages at state[e] (overwritten with the new ones); multiplies each new ratio into state[A + v]
 * (which the caller sets to 1 first). Allocation-free.
 */
export function sumProductPass(
  g: TannerEdges,
  state: Float64Array,
  B: number,
  A: number,
  syndrome: Uint8Array,
  scale: number,
  maxRatio: number,
  s: CheckScratch,
): void {
  const { checks, checkStart, edgeVar } = g;
  const bOff = B | 0;
  const aOff = A | 0;
  const maxR = maxRatio * 1;
  const minR = 1 / maxR;
  const scaled = scale !== 1;
  let e0 = 0;
  for (let c = 0; c < checks; c++) {
    const e1 = checkStart[c + 1]!;
    // t_k = (P − C)/(P + C) is parked in state[e]. With T = (−1)^s ∏ t_k the leave-one-out product is
    // y = T/t_k, so the reply (1 + y)/(1 − y) is (|t_k| + y|t_k|)/(|t_k| − y|t_k|): one division per edge.
    // T = 0 (an exactly neutral message, or underflow) needs the leave-one-out products themselves.
    let total = syndrome[c] !== 0 ? -1 : 1;
    let e = e0;
    for (; e + 1 < e1; e += 2) {
      const p0 = state[bOff + edgeVar[e]!]!;
      const m0 = state[e]!;
      const p1 = state[bOff + edgeVar[e + 1]!]!;
      const m1 = state[e + 1]!;
      const t0 = (p0 - m0) / (p0 + m0);
      const t1 = (p1 - m1) / (p1 + m1);
      state[e] = t0;
      state[e + 1] = t1;
      total *= t0 * t1;
    }
    if (e < e1) {
      const p0 = state[bOff + edgeVar[e]!]!;
      const m0 = state[e]!;
      const t0 = (p0 - m0) / (p0 + m0);
      state[e] = t0;
      total *= t0;
    }
    if (total === 0 || scaled) {
      leaveOneOut(state, e0, e1 - e0, syndrome[c]!, s.t);
      for (e = e0; e < e1; e++) {
        let r = state[e]!;
        if (scaled) r = Math.pow(r, scale);
        r = r > maxR ? maxR : r < minR ? minR : r;
        state[e] = r;
        const v = aOff + edgeVar[e]!;
        state[v] = state[v]! * r;
      }
    } else {
      // With a = |t_k| and u = T·sign(t_k) = y·|t_k| the reply is (a + u)/(a − u). Every |t| ≤ 1 and a
      // rounded product never exceeds its factors, so |T| ≤ |t_k| and a − u ≥ 0 exactly; negating numerator
      // and denominator is exact, so (t_k + T)/(t_k − T) is the same number without branching on the sign
      // of t_k. A zero denominator (y = 1 to working precision) is a saturated reply.
      for (e = e0; e < e1; e++) {
        const tk = state[e]!;
        const den = tk - total;
        let r = den !== 0 ? (tk + total) / den : maxR;
        r = r > maxR ? maxR : r < minR ? minR : r;
        state[e] = r;
        const v = aOff + edgeVar[e]!;
        state[v] = state[v]! * r;
      }
    }
    e0 = e1;
  }
}

/**
 * In place: a[at+k] holds t_k on entry and (1 + y_k)/(1 − y_k) on exit, y_k = (−1)^flip ∏_{j≠k} t_j, by
 * forward and backward sweeps (exact even when some t_k is 0). tmp: scratch of at least d.
 */
function leaveOneOut(a: Float64Array, at: number, d: number, flip: number, tmp: Float64Array): void {
  let forward = flip !== 0 ? -1 : 1;
  for (let k = 0; k < d; k++) {
    const tk = a[at + k]!;
    tmp[k] = tk;
    a[at + k] = forward;
    forward *= tk;
  }
  let backward = 1;
  for (let k = d - 1; k >= 0; k--) {
    const y = a[at + k]! * backward;
    a[at + k] = (1 + y) / (1 - y);
    backward *= tmp[k]!;
  }
}

/**
 * One flooding pass of scaled min-sum over all checks, on LLRs: the message from v into edge e is
 * state[B + v] − state[e]; new messages overwrite state[e] and are added into state[A + v] (which the caller
 * zeroes first).
 */
export function minSumPass(
  g: TannerEdges,
  state: Float64Array,
  B: number,
  A: number,
  syndrome: Uint8Array,
  scale: number,
  maxLlr: number,
  _s: CheckScratch,
): void {
  const { checks, checkStart, edgeVar } = g;
  const bOff = B | 0;
  const aOff = A | 0;
  const sc = scale * 1;
  const maxM = maxLlr * 1;
  let e0 = 0;
  for (let c = 0; c < checks; c++) {
    const e1 = checkStart[c + 1]!;
    let min1 = Infinity;
    let min2 = Infinity;
    let arg = -1;
    let sign = syndrome[c]!;
    // the incoming message is parked in state[e] until the reply replaces it
    for (let e = e0; e < e1; e++) {
      const v = state[bOff + edgeVar[e]!]! - state[e]!;
      state[e] = v;
      let a = v;
      if (v < 0) {
        sign ^= 1;
        a = -v;
      }
      if (a < min1) {
        min2 = min1;
        min1 = a;
        arg = e;
      } else if (a < min2) min2 = a;
    }
    let m1 = sc * min1;
    if (m1 > maxM) m1 = maxM;
    let m2 = sc * min2;
    if (m2 > maxM) m2 = maxM;
    for (let e = e0; e < e1; e++) {
      const mag = e === arg ? m2 : m1;
      const m = (sign ^ (state[e]! < 0 ? 1 : 0)) !== 0 ? -mag : mag;
      state[e] = m;
      const v = aOff + edgeVar[e]!;
      state[v] = state[v]! + m;
    }
    e0 = e1;
  }
}

/**
 * Serial (layered) sum-product update of check c alone, ratio domain: incoming ratios from the current
 * beliefs, new ratios into state[e], each neighbour's belief set to incoming × new (so later checks see it)
 * and its accumulated product multiplied by new/old.
 */
export function sumProductSerial(
  g: TannerEdges,
  c: number,
  state: Float64Array,
  B: number,
  A: number,
  syndromeBit: number,
  scale: number,
  maxRatio: number,
  s: CheckScratch,
): void {
  const { checkStart, edgeVar } = g;
  const { x, old } = s;
  const maxR = maxRatio * 1;
  const minR = 1 / maxR;
  const e0 = checkStart[c]!;
  const d = checkStart[c + 1]! - e0;
  let total = syndromeBit !== 0 ? -1 : 1;
  for (let k = 0; k < d; k++) {
    const pv = state[B + edgeVar[e0 + k]!]!;
    const m = state[e0 + k]!;
    old[k] = m;
    x[k] = pv / m;
    const tk = (pv - m) / (pv + m);
    state[e0 + k] = tk;
    total *= tk;
  }
  const exact = total === 0 || scale !== 1;
  if (exact) leaveOneOut(state, e0, d, syndromeBit, s.t);
  for (let k = 0; k < d; k++) {
    const tk = state[e0 + k]!;
    let r = tk;
    if (!exact) {
      const a = tk < 0 ? -tk : tk;
      const u = tk < 0 ? -total : total;
      const den = a - u;
      r = den > 0 ? (a + u) / den : maxR;
    }
    if (scale !== 1) r = Math.pow(r, scale);
    r = r > maxR ? maxR : r < minR ? minR : r;
    state[e0 + k] = r;
    const v = edgeVar[e0 + k]!;
    state[B + v] = x[k]! * r;
    state[A + v] = (state[A + v]! * r) / old[k]!;
  }
}

/**
 * Serial (layered) min-sum update of check c alone, on LLRs: beliefs set to incoming + new, sums moved by
 * new − old.
 */
export function minSumSerial(
  g: TannerEdges,
  c: number,
  state: Float64Array,
  B: number,
  A: number,
  syndromeBit: number,
  scale: number,
  maxLlr: number,
  s: CheckScratch,
): void {
  const { checkStart, edgeVar } = g;
  const { x, old } = s;
  const e0 = checkStart[c]!;
  const d = checkStart[c + 1]! - e0;
  let min1 = Infinity;
  let min2 = Infinity;
  let arg = -1;
  let sign = syndromeBit;
  for (let k = 0; k < d; k++) {
    const m = state[e0 + k]!;
    old[k] = m;
    const v = state[B + edgeVar[e0 + k]!]! - m;
    x[k] = v;
    let a = v;
    if (v < 0) {
      sign ^= 1;
      a = -v;
    }
    if (a < min1) {
      min2 = min1;
      min1 = a;
      arg = k;
    } else if (a < min2) min2 = a;
  }
  const maxM = maxLlr * 1;
  let m1 = scale * min1;
  if (m1 > maxM) m1 = maxM;
  let m2 = scale * min2;
  if (m2 > maxM) m2 = maxM;
  for (let k = 0; k < d; k++) {
    const mag = k === arg ? m2 : m1;
    const m = (sign ^ (x[k]! < 0 ? 1 : 0)) !== 0 ? -mag : mag;
    state[e0 + k] = m;
    const v = edgeVar[e0 + k]!;
    state[B + v] = x[k]! + m;
    state[A + v] = state[A + v]! + m - old[k]!;
  }
}

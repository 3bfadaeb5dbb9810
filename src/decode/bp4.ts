import type { BitMatrix } from '../gf2/bitmatrix.js';
import { posteriorLlrOf, runIterations, type BpOptions, type IterativeDecoder } from './bp-options.js';
import { type CheckScratch, checkScratch, messageLimit, minSumPass, minSumSerial, sumProductPass, sumProductSerial } from './check-rules.js';
import { stackedTannerEdges, syndromeMatches, type TannerEdges } from './tanner-edges.js';

/**
 * Quaternary belief propagation for a CSS code with scalar messages, after Kuo & Lai, "Refined belief
 * propagation decoding of sparse-graph quantum codes", IEEE JSAIT 1(2), 2020 (and npj Quantum Information 8,
 * 111, 2022). Its messages equal those of BP over GF(4) with vector messages, at the cost of binary BP.
 *
 * Why scalars suffice: a check S only sees whether a qubit's Pauli W commutes with S on that qubit, so the
 * 4-vector message q(W) a qubit sends may be folded to one LLR ln[(q(I)+q(S))/(the other two)], and the check's
 * reply depends on W only through that commutation bit, so it is one LLR Λ too.
 *
 * On a CSS code a qubit j gathers A_j (the sum of the Λ from X-type checks, which see its Z part) and B_j (from
 * Z-type checks, which see its X part). With prior p(W) the folded message into an X-type check i is then
 *   ln[(p_I + p_X e^{−B_j}) / (p_Z + p_Y e^{−B_j})] + A_j − Λ_{i→j},
 * a per-qubit quantity minus the edge's own message, exactly the shape of binary BP. Here the variables are
 * doubled: 0..n−1 are the Z parts (neighbours of the X-type checks, the rows of DX), n..2n−1 the X parts
 * (neighbours of the Z-type checks, the rows of DZ); belief[v] is that per-qubit quantity, which is also the
 * exact marginal LLR of the corresponding bit under the current beliefs.
 *
 * Sum-product runs on likelihood ratios (A and B become products e^A, e^B and the per-qubit quantity a
 * rational function of them: no exp or log at all); min-sum on LLRs (one exp and one log per qubit part and
 * iteration, skipped while that part's input sum repeats exactly). See check-rules.ts.
 */
export class QuaternaryBp implements IterativeDecoder {
  readonly n: number;
  readonly xChecks: number;
  readonly g: TannerEdges;
  readonly options: BpOptions;
  readonly ratioDomain: boolean;
  readonly maxLlr: number;
  /** All numbers in one array (see check-rules.ts): messages, then beliefs, then accumulated messages. */
  readonly state: Float64Array;
  readonly c2v: Float64Array;
  /** belief[j]: the Z part of qubit j; belief[n+j]: its X part (ratios or LLRs). */
  readonly belief: Float64Array;
  /** acc[j] = A_j, acc[n+j] = B_j (as products e^A, e^B in the ratio domain). */
  readonly acc: Float64Array;
  /** hard[j] = Z part of the decided Pauli of qubit j, hard[n+j] = its X part. */
  readonly hard: Uint8Array;
  iterations = 0;
  matched = false;
  /** Per-qubit Pauli priors: pI, pX, pY, pZ at 4j .. 4j+3 (probabilities), and their logarithms. */
  private readonly prob: Float64Array;
  private readonly logProb: Float64Array;
  /** Per qubit: the last B and the Z part's log term for it, the last A and the X part's term (LLR domain). */
  private readonly memo: Float64Array;
  /** Beliefs and decisions for neutral sums, the starting point of every decode. */
  private readonly startBelief: Float64Array;
  private readonly startHard: Uint8Array;
  private readonly llr: Float64Array;
  private readonly scratch: CheckScratch;
  private syndrome: Uint8Array;

  /** Checks are the rows of dx (X-type, stacked first) then of dz (Z-type). */
  constructor(dx: BitMatrix, dz: BitMatrix, options: BpOptions) {
    if (dx.cols !== dz.cols) throw new RangeError(`BP4: ${dx.cols} vs ${dz.cols} columns`);
    const n = dx.cols;
    this.n = n;
    this.xChecks = dx.rows;
    this.g = stackedTannerEdges([{ h: dx, varOffset: 0 }, { h: dz, varOffset: n }], 2 * n);
    this.options = options;
    this.ratioDomain = options.rule === 'sum-product';
    this.maxLlr = messageLimit(this.g.maxVarDegree);
    const E = this.g.edges;
    this.state = new Float64Array(E + 4 * n);
    this.c2v = this.state.subarray(0, E);
    this.belief = this.state.subarray(E, E + 2 * n);
    this.acc = this.state.subarray(E + 2 * n);
    this.hard = new Uint8Array(2 * n);
    this.llr = new Float64Array(2 * n);
    this.prob = new Float64Array(4 * n);
    this.logProb = new Float64Array(4 * n);
    this.memo = new Float64Array(4 * n).fill(NaN);
    this.startBelief = new Float64Array(2 * n);
    this.startHard = new Uint8Array(2 * n);
    this.scratch = checkScratch(this.g.maxCheckDegree);
    this.syndrome = new Uint8Array(this.g.checks);
    this.computeStart();
  }

  /** The same Pauli distribution [I, X, Y, Z] on every qubit. */
  setUniformPrior(pauli: readonly number[]): void {
    const probs = new Float64Array(4 * this.n);
    for (let j = 0; j < this.n; j++) for (let k = 0; k < 4; k++) probs[4 * j + k] = pauli[k]!;
    this.setPrior(probs);
  }

  /** Per-qubit priors: probs[4j + k] for k = I, X, Y, Z (all positive). */
  setPrior(probs: ArrayLike<number>): void {
    for (let i = 0; i < 4 * this.n; i++) {
      this.prob[i] = probs[i]!;
      this.logProb[i] = Math.log(probs[i]!);
    }
    this.memo.fill(NaN);
    this.computeStart();
  }

  /** Reset for a new syndrome: one byte per check, X-type checks first (the array is referenced). */
  start(syndrome: Uint8Array): void {
    this.syndrome = syndrome;
    const unit = this.ratioDomain ? 1 : 0;
    this.c2v.fill(unit);
    this.acc.fill(unit);
    // the beliefs and decisions for neutral sums depend on the priors only: computed in setPrior
    this.belief.set(this.startBelief);
    this.hard.set(this.startHard);
    this.iterations = 0;
  }

  iterate(): void {
    const { g, state, acc, syndrome, scratch, n, maxLlr } = this;
    const scale = this.options.scale;
    const B = g.edges;
    const A = B + 2 * n;
    if (this.options.schedule === 'flooding') {
      if (this.ratioDomain) {
        acc.fill(1);
        sumProductPass(g, state, B, A, syndrome, scale, Math.exp(maxLlr), scratch);
        this.refreshAllRatio();
      } else {
        acc.fill(0);
        minSumPass(g, state, B, A, syndrome, scale, maxLlr, scratch);
        this.refreshAllLlr();
      }
    } else {
      const { checkStart, edgeVar } = g;
      const maxRatio = Math.exp(maxLlr);
      for (let c = 0; c < g.checks; c++) {
        if (this.ratioDomain) sumProductSerial(g, c, state, B, A, syndrome[c]!, scale, maxRatio, scratch);
        else minSumSerial(g, c, state, B, A, syndrome[c]!, scale, maxLlr, scratch);
        // the other part of each touched qubit depends on the sum that just moved
        const end = checkStart[c + 1]!;
        if (c < this.xChecks) for (let e = checkStart[c]!; e < end; e++) this.refreshX(edgeVar[e]!);
        else for (let e = checkStart[c]!; e < end; e++) this.refreshZ(edgeVar[e]! - n);
      }
      for (let j = 0; j < n; j++) this.decideQubit(j);
    }
    this.iterations++;
  }

  decode(syndrome: Uint8Array): number {
    return runIterations(this, syndrome);
  }

  matches(syndrome: Uint8Array): boolean {
    return syndromeMatches(this.g, this.hard, syndrome);
  }

  /** Marginal LLRs of the parts (Z parts 0..n−1, X parts n..2n−1): a buffer owned by the decoder. */
  posteriorLlr(): Float64Array {
    return posteriorLlrOf(this.ratioDomain, this.belief, this.llr);
  }

  /** LLR of the last check-to-variable message on edge e. */
  checkMessageLlr(e: number): number {
    return this.ratioDomain ? Math.log(this.c2v[e]!) : this.c2v[e]!;
  }

  /** LLR of the folded variable-to-check message the next iteration would send on edge e (flooding). */
  variableMessageLlr(e: number): number {
    const b = this.belief[this.g.edgeVar[e]!]!;
    return this.ratioDomain ? Math.log(b / this.c2v[e]!) : b - this.c2v[e]!;
  }

  /** Posterior distribution of qubit j's Pauli [I, X, Y, Z] under the current messages, into out[0..3]. */
  posterior(j: number, out: Float64Array): void {
    let a = this.acc[j]!;
    let b = this.acc[this.n + j]!;
    if (this.ratioDomain) {
      a = Math.log(a);
      b = Math.log(b);
    }
    const l = this.logProb;
    const sI = l[4 * j]!;
    const sX = l[4 * j + 1]! - b;
    const sY = l[4 * j + 2]! - a - b;
    const sZ = l[4 * j + 3]! - a;
    const top = Math.max(sI, sX, sY, sZ);
    const wI = Math.exp(sI - top);
    const wX = Math.exp(sX - top);
    const wY = Math.exp(sY - top);
    const wZ = Math.exp(sZ - top);
    const total = wI + wX + wY + wZ;
    out[0] = wI / total;
    out[1] = wX / total;
    out[2] = wY / total;
    out[3] = wZ / total;
  }

  /** Beliefs and decisions of every qubit for neutral sums (A = B = 0), into startBelief and startHard. */
  private computeStart(): void {
    const { n, prob, logProb, startBelief, startHard } = this;
    const unit = this.ratioDomain ? 1 : 0;
    for (let j = 0; j < n; j++) {
      const pI = prob[4 * j]!;
      const pX = prob[4 * j + 1]!;
      const pY = prob[4 * j + 2]!;
      const pZ = prob[4 * j + 3]!;
      let pauli: number;
      if (this.ratioDomain) {
        startBelief[j] = unit * ratioTerm(unit, pI, pX, pZ, pY);
        startBelief[n + j] = unit * ratioTerm(unit, pI, pZ, pX, pY);
        pauli = decideRatio(unit, unit, pI, pX, pY, pZ);
      } else {
        startBelief[j] = logTerm(unit, pI, pX, pZ, pY) + unit;
        startBelief[n + j] = logTerm(unit, pI, pZ, pX, pY) + unit;
        pauli = decideLlr(unit, unit, logProb[4 * j]!, logProb[4 * j + 1]!, logProb[4 * j + 2]!, logProb[4 * j + 3]!);
      }
      startHard[j] = pauli & 1;
      startHard[n + j] = pauli >> 1;
    }
  }

  /** Both parts and the decision of every qubit in the ratio domain, as one loop (the flooding hot path). */
  private refreshAllRatio(): void {
    const { n, state, hard, prob } = this;
    const B = this.g.edges;
    const A = B + 2 * n;
    for (let j = 0; j < n; j++) {
      const a = state[A + j]!;
      const b = state[A + n + j]!;
      const pI = prob[4 * j]!;
      const pX = prob[4 * j + 1]!;
      const pY = prob[4 * j + 2]!;
      const pZ = prob[4 * j + 3]!;
      state[B + j] = a * ratioTerm(b, pI, pX, pZ, pY);
      state[B + n + j] = b * ratioTerm(a, pI, pZ, pX, pY);
      const pauli = decideRatio(a, b, pI, pX, pY, pZ);
      hard[j] = pauli & 1;
      hard[n + j] = pauli >> 1;
    }
  }

  /**
   * The same on LLRs (the flooding min-sum hot path). The log term of a part depends only on the other part's
   * sum, so it is kept with that sum in `memo` and reused while the sum repeats exactly (common once messages
   * saturate): the same numbers with fewer exp and log calls.
   */
  private refreshAllLlr(): void {
    const { n, state, hard, prob, logProb, memo } = this;
    const B = this.g.edges;
    const A = B + 2 * n;
    for (let j = 0; j < n; j++) {
      const a = state[A + j]!;
      const b = state[A + n + j]!;
      const pI = prob[4 * j]!;
      const pX = prob[4 * j + 1]!;
      const pY = prob[4 * j + 2]!;
      const pZ = prob[4 * j + 3]!;
      let tz = memo[4 * j + 1]!;
      if (b !== memo[4 * j]) {
        tz = logTerm(b, pI, pX, pZ, pY);
        memo[4 * j] = b;
        memo[4 * j + 1] = tz;
      }
      let tx = memo[4 * j + 3]!;
      if (a !== memo[4 * j + 2]) {
        tx = logTerm(a, pI, pZ, pX, pY);
        memo[4 * j + 2] = a;
        memo[4 * j + 3] = tx;
      }
      state[B + j] = tz + a;
      state[B + n + j] = tx + b;
      const pauli = decideLlr(a, b, logProb[4 * j]!, logProb[4 * j + 1]!, logProb[4 * j + 2]!, logProb[4 * j + 3]!);
      hard[j] = pauli & 1;
      hard[n + j] = pauli >> 1;
    }
  }

  /** Z part of qubit j: ln[(pI + pX e^{−B}) / (pZ + pY e^{−B})] + A, or its ratio. */
  private refreshZ(j: number): void {
    const p = this.prob;
    const a = this.acc[j]!;
    const b = this.acc[this.n + j]!;
    if (this.ratioDomain) this.belief[j] = a * ratioTerm(b, p[4 * j]!, p[4 * j + 1]!, p[4 * j + 3]!, p[4 * j + 2]!);
    else this.belief[j] = logTerm(b, p[4 * j]!, p[4 * j + 1]!, p[4 * j + 3]!, p[4 * j + 2]!) + a;
  }

  /** X part of qubit j: ln[(pI + pZ e^{−A}) / (pX + pY e^{−A})] + B, or its ratio. */
  private refreshX(j: number): void {
    const p = this.prob;
    const a = this.acc[j]!;
    const b = this.acc[this.n + j]!;
    if (this.ratioDomain) this.belief[this.n + j] = b * ratioTerm(a, p[4 * j]!, p[4 * j + 3]!, p[4 * j + 1]!, p[4 * j + 2]!);
    else this.belief[this.n + j] = logTerm(a, p[4 * j]!, p[4 * j + 3]!, p[4 * j + 1]!, p[4 * j + 2]!) + b;
  }

  /** The most likely Pauli of qubit j (ties: I, then X, Z, Y). */
  private decideQubit(j: number): void {
    const a = this.acc[j]!;
    const b = this.acc[this.n + j]!;
    const p = this.ratioDomain ? this.prob : this.logProb;
    const pauli = this.ratioDomain
      ? decideRatio(a, b, p[4 * j]!, p[4 * j + 1]!, p[4 * j + 2]!, p[4 * j + 3]!)
      : decideLlr(a, b, p[4 * j]!, p[4 * j + 1]!, p[4 * j + 2]!, p[4 * j + 3]!);
    this.hard[j] = pauli & 1;
    this.hard[this.n + j] = pauli >> 1;
  }
}

/*
 * One part of a qubit given the sum s of the other part's messages, with the prior weights of the two Paulis
 * that commute with its checks (p0, p1: I and the other part's Pauli) and of the two that do not (q0, q1).
 * Z part: ratioTerm(e^B, pI, pX, pZ, pY); X part: ratioTerm(e^A, pI, pZ, pX, pY). Written so that neither a
 * large nor a small sum overflows.
 */

/** (p0 + p1/s) / (q0 + q1/s) for a ratio s = e^{sum}. */
function ratioTerm(s: number, p0: number, p1: number, q0: number, q1: number): number {
  return s >= 1 ? (p0 + p1 / s) / (q0 + q1 / s) : (p0 * s + p1) / (q0 * s + q1);
}

/** ln[(p0 + p1 e^{−s}) / (q0 + q1 e^{−s})] for an LLR sum s. */
function logTerm(s: number, p0: number, p1: number, q0: number, q1: number): number {
  if (s >= 0) {
    const u = Math.exp(-s);
    return Math.log((p0 + p1 * u) / (q0 + q1 * u));
  }
  const u = Math.exp(s);
  return Math.log((p0 * u + p1) / (q0 * u + q1));
}

/**
 * The most likely Pauli from the sums (ratios a = e^A, b = e^B) and the prior probabilities, as z + 2x (ties:
 * I, then X, Z, Y): the weights of I, X, Z, Y times e^{A+B} are pI·a·b, pX·a, pZ·b, pY.
 */
function decideRatio(a: number, b: number, pI: number, pX: number, pY: number, pZ: number): number {
  let pauli = 0;
  let best = pI * a * b;
  const wX = pX * a;
  if (wX > best) {
    best = wX;
    pauli = 2;
  }
  const wZ = pZ * b;
  if (wZ > best) {
    best = wZ;
    pauli = 1;
  }
  if (pY > best) pauli = 3;
  return pauli;
}

/** The same from LLR sums A, B and the logarithms of the prior probabilities. */
function decideLlr(a: number, b: number, lI: number, lX: number, lY: number, lZ: number): number {
  let pauli = 0;
  let best = lI;
  const sX = lX - b;
  if (sX > best) {
    best = sX;
    pauli = 2;
  }
  const sZ = lZ - a;
  if (sZ > best) {
    best = sZ;
    pauli = 1;
  }
  if (lY - a - b > best) pauli = 3;
  return pauli;
}

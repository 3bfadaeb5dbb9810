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
 * iteration). See check-rules.ts.
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
    this.scratch = checkScratch(this.g.maxCheckDegree);
    this.syndrome = new Uint8Array(this.g.checks);
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
  }

  /** Reset for a new syndrome: one byte per check, X-type checks first (the array is referenced). */
  start(syndrome: Uint8Array): void {
    this.syndrome = syndrome;
    const unit = this.ratioDomain ? 1 : 0;
    this.c2v.fill(unit);
    this.acc.fill(unit);
    for (let j = 0; j < this.n; j++) this.refresh(j);
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
        for (let j = 0; j < n; j++) this.refresh(j);
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

  /** refresh() of every qubit in the ratio domain, as one tight loop (the flooding hot path). */
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
      state[B + j] = a * (b >= 1 ? (pI + pX / b) / (pZ + pY / b) : (pI * b + pX) / (pZ * b + pY));
      state[B + n + j] = b * (a >= 1 ? (pI + pZ / a) / (pX + pY / a) : (pI * a + pZ) / (pX * a + pY));
      let x = 0;
      let z = 0;
      let best = pI * a * b;
      const wX = pX * a;
      if (wX > best) {
        best = wX;
        x = 1;
      }
      const wZ = pZ * b;
      if (wZ > best) {
        best = wZ;
        x = 0;
        z = 1;
      }
      if (pY > best) {
        x = 1;
        z = 1;
      }
      hard[j] = z;
      hard[n + j] = x;
    }
  }

  /** Both parts of qubit j from its accumulated messages, and its hard decision. */
  private refresh(j: number): void {
    this.refreshZ(j);
    this.refreshX(j);
    this.decideQubit(j);
  }

  /** Z part: ln[(pI + pX e^{−B}) / (pZ + pY e^{−B})] + A, or its ratio. */
  private refreshZ(j: number): void {
    const n = this.n;
    const p = this.prob;
    const a = this.acc[j]!;
    const b = this.acc[n + j]!;
    const pI = p[4 * j]!;
    const pX = p[4 * j + 1]!;
    const pY = p[4 * j + 2]!;
    const pZ = p[4 * j + 3]!;
    if (this.ratioDomain) {
      // b = e^B: (pI + pX/b)/(pZ + pY/b), written so that neither a large nor a small b overflows
      this.belief[j] = a * (b >= 1 ? (pI + pX / b) / (pZ + pY / b) : (pI * b + pX) / (pZ * b + pY));
    } else if (b >= 0) {
      const u = Math.exp(-b);
      this.belief[j] = Math.log((pI + pX * u) / (pZ + pY * u)) + a;
    } else {
      const u = Math.exp(b);
      this.belief[j] = Math.log((pI * u + pX) / (pZ * u + pY)) + a;
    }
  }

  /** X part: ln[(pI + pZ e^{−A}) / (pX + pY e^{−A})] + B, or its ratio. */
  private refreshX(j: number): void {
    const n = this.n;
    const p = this.prob;
    const a = this.acc[j]!;
    const b = this.acc[n + j]!;
    const pI = p[4 * j]!;
    const pX = p[4 * j + 1]!;
    const pY = p[4 * j + 2]!;
    const pZ = p[4 * j + 3]!;
    if (this.ratioDomain) {
      this.belief[n + j] = b * (a >= 1 ? (pI + pZ / a) / (pX + pY / a) : (pI * a + pZ) / (pX * a + pY));
    } else if (a >= 0) {
      const u = Math.exp(-a);
      this.belief[n + j] = Math.log((pI + pZ * u) / (pX + pY * u)) + b;
    } else {
      const u = Math.exp(a);
      this.belief[n + j] = Math.log((pI * u + pZ) / (pX * u + pY)) + b;
    }
  }

  /** The most likely Pauli of qubit j (ties: I, then X, Z, Y). */
  private decideQubit(j: number): void {
    const n = this.n;
    const a = this.acc[j]!;
    const b = this.acc[n + j]!;
    let x = 0;
    let z = 0;
    if (this.ratioDomain) {
      // weights of I, X, Z, Y times e^{A+B}: pI·e^A·e^B, pX·e^A, pZ·e^B, pY
      const p = this.prob;
      let best = p[4 * j]! * a * b;
      const wX = p[4 * j + 1]! * a;
      if (wX > best) {
        best = wX;
        x = 1;
      }
      const wZ = p[4 * j + 3]! * b;
      if (wZ > best) {
        best = wZ;
        x = 0;
        z = 1;
      }
      if (p[4 * j + 2]! > best) {
        x = 1;
        z = 1;
      }
    } else {
      const l = this.logProb;
      let best = l[4 * j]!;
      const sX = l[4 * j + 1]! - b;
      if (sX > best) {
        best = sX;
        x = 1;
      }
      const sZ = l[4 * j + 3]! - a;
      if (sZ > best) {
        best = sZ;
        x = 0;
        z = 1;
      }
      if (l[4 * j + 2]! - a - b > best) {
        x = 1;
        z = 1;
      }
    }
    this.hard[j] = z;
    this.hard[n + j] = x;
  }
}

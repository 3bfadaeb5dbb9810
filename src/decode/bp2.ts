import { posteriorLlrOf, runIterations, type BpOptions, type IterativeDecoder } from './bp-options.js';
import { type CheckScratch, checkScratch, messageLimit, minSumPass, minSumSerial, sumProductPass, sumProductSerial } from './check-rules.js';
import { syndromeMatches, type TannerEdges } from './tanner-edges.js';

/**
 * Binary belief propagation for a syndrome: find bits e with H·e = s, each bit 1 a priori with the
 * probability given by its prior LLR. Messages live on edges (Float64Array, check order); every array is
 * allocated once, so decoding a shot allocates nothing.
 *
 * Sum-product runs on likelihood ratios, min-sum on LLRs (see check-rules.ts): `belief` and `c2v` hold
 * numbers of that domain; posteriorLlr() converts. After a run: `hard` is the decision, `matched` whether
 * H·hard = s, `iterations` how many iterations ran.
 */
export class BinaryBp implements IterativeDecoder {
  readonly g: TannerEdges;
  readonly options: BpOptions;
  /** True for sum-product (ratios), false for min-sum (LLRs). */
  readonly ratioDomain: boolean;
  /** Clamp on |LLR| of check messages for this graph. */
  readonly maxLlr: number;
  /** All numbers in one array (see check-rules.ts): messages, then beliefs, then accumulated messages. */
  readonly state: Float64Array;
  readonly c2v: Float64Array;
  readonly belief: Float64Array;
  readonly hard: Uint8Array;
  iterations = 0;
  matched = false;
  private readonly acc: Float64Array;
  private readonly prior: Float64Array;
  private readonly llr: Float64Array;
  private readonly scratch: CheckScratch;
  private syndrome: Uint8Array;

  constructor(g: TannerEdges, options: BpOptions) {
    this.g = g;
    this.options = options;
    this.ratioDomain = options.rule === 'sum-product';
    this.maxLlr = messageLimit(g.maxVarDegree);
    this.state = new Float64Array(g.edges + 2 * g.vars);
    this.c2v = this.state.subarray(0, g.edges);
    this.belief = this.state.subarray(g.edges, g.edges + g.vars);
    this.acc = this.state.subarray(g.edges + g.vars);
    this.hard = new Uint8Array(g.vars);
    this.prior = new Float64Array(g.vars);
    this.llr = new Float64Array(g.vars);
    this.scratch = checkScratch(g.maxCheckDegree);
    this.syndrome = new Uint8Array(g.checks);
  }

  /** Prior LLR ln(P(0)/P(1)) of every variable (copied). */
  setPrior(llr: ArrayLike<number>): void {
    for (let v = 0; v < this.g.vars; v++) this.prior[v] = this.ratioDomain ? Math.exp(llr[v]!) : llr[v]!;
  }

  /** Reset to the priors for a new syndrome (one byte per check; referenced, keep it unchanged). */
  start(syndrome: Uint8Array): void {
    this.syndrome = syndrome;
    const unit = this.ratioDomain ? 1 : 0;
    this.c2v.fill(unit);
    this.acc.fill(unit);
    this.belief.set(this.prior);
    this.decide();
    this.iterations = 0;
  }

  /** One iteration in the configured schedule, then the hard decision. */
  iterate(): void {
    if (this.options.schedule === 'flooding') {
      if (this.ratioDomain) this.floodSumProduct();
      else this.floodMinSum();
    } else {
      const { g, state, syndrome, scratch, maxLlr } = this;
      const scale = this.options.scale;
      const B = g.edges;
      const A = B + g.vars;
      if (this.ratioDomain) {
        const maxRatio = Math.exp(maxLlr);
        for (let c = 0; c < g.checks; c++) sumProductSerial(g, c, state, B, A, syndrome[c]!, scale, maxRatio, scratch);
      } else {
        for (let c = 0; c < g.checks; c++) minSumSerial(g, c, state, B, A, syndrome[c]!, scale, maxLlr, scratch);
      }
      this.decide();
    }
    this.iterations++;
  }

  // flooding: the accumulators hold the neutral value on entry (start, or the loop below), reset as they are read
  private floodSumProduct(): void {
    const { g, state, prior, hard } = this;
    const vars = g.vars;
    const B = g.edges;
    const A = B + vars;
    sumProductPass(g, state, B, A, this.syndrome, this.options.scale, Math.exp(this.maxLlr), this.scratch);
    for (let v = 0; v < vars; v++) {
      const b = prior[v]! * state[A + v]!;
      state[B + v] = b;
      hard[v] = b < 1 ? 1 : 0;
      state[A + v] = 1;
    }
  }

  private floodMinSum(): void {
    const { g, state, prior, hard } = this;
    const vars = g.vars;
    const B = g.edges;
    const A = B + vars;
    minSumPass(g, state, B, A, this.syndrome, this.options.scale, this.maxLlr, this.scratch);
    for (let v = 0; v < vars; v++) {
      const b = prior[v]! + state[A + v]!;
      state[B + v] = b;
      hard[v] = b < 0 ? 1 : 0;
      state[A + v] = 0;
    }
  }

  /** Run up to options.iterations iterations; returns the number run. */
  decode(syndrome: Uint8Array): number {
    return runIterations(this, syndrome);
  }

  matches(syndrome: Uint8Array): boolean {
    return syndromeMatches(this.g, this.hard, syndrome);
  }

  /** Posterior LLRs of the current state (a buffer owned by the decoder, refilled on each call). */
  posteriorLlr(): Float64Array {
    return posteriorLlrOf(this.ratioDomain, this.belief, this.llr);
  }

  /** LLR of the last check-to-variable message on edge e. */
  checkMessageLlr(e: number): number {
    return this.ratioDomain ? Math.log(this.c2v[e]!) : this.c2v[e]!;
  }

  private decide(): void {
    const { belief, hard } = this;
    const zero = this.ratioDomain ? 1 : 0;
    for (let v = 0; v < belief.length; v++) hard[v] = belief[v]! < zero ? 1 : 0;
  }
}

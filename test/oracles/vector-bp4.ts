// Quaternary BP with vector messages, written straight from the definition: every message is a
// distribution over {I, X, Y, Z}, and a check's message is a sum over all Pauli assignments of its other
// neighbours. The oracle for the scalar-message decoder in src/decode/bp4.ts. Clarity over speed.
import { anticommutes, type PauliCheck } from './pauli-brute.js';

export interface VectorBp4State {
  /** r[i][k][w]: check i to its k-th neighbour (normalised). */
  r: number[][][];
  /** q[i][k][w]: k-th neighbour of check i to the check (normalised). */
  q: number[][][];
  /** posterior[j][w] (normalised). */
  posterior: number[][];
}

function normalise(v: number[]): number[] {
  const s = v.reduce((a, b) => a + b, 0);
  return v.map((x) => x / s);
}

export class VectorBp4 {
  readonly state: VectorBp4State;

  constructor(
    readonly n: number,
    readonly prior: number[][],
    readonly checks: PauliCheck[],
  ) {
    this.state = {
      r: checks.map((c) => c.vars.map(() => [1, 1, 1, 1].map((x) => x / 4))),
      q: checks.map((c) => c.vars.map((v) => prior[v]!.slice())),
      posterior: prior.map((p) => p.slice()),
    };
  }

  /** q from check i to its k-th neighbour j, from the current r of j's other checks. */
  private varMessage(i: number, k: number): number[] {
    const j = this.checks[i]!.vars[k]!;
    const m = this.prior[j]!.slice();
    this.checks.forEach((c, i2) => {
      if (i2 === i) return;
      c.vars.forEach((v, k2) => {
        if (v === j) for (let w = 0; w < 4; w++) m[w]! *= this.state.r[i2]![k2]![w]!;
      });
    });
    return normalise(m);
  }

  /** r from check i to its k-th neighbour, from the current q of its other neighbours. */
  private checkMessage(i: number, k: number): number[] {
    const c = this.checks[i]!;
    const others = c.vars.map((_, k2) => k2).filter((k2) => k2 !== k);
    const out = [0, 0, 0, 0];
    for (let idx = 0; idx < 4 ** others.length; idx++) {
      let x = idx;
      let parity = 0;
      let pr = 1;
      for (const k2 of others) {
        const w = x & 3;
        x >>>= 2;
        parity ^= anticommutes(w, c.type);
        pr *= this.state.q[i]![k2]![w]!;
      }
      for (let w = 0; w < 4; w++) if ((parity ^ anticommutes(w, c.type)) === c.bit) out[w]! += pr;
    }
    return normalise(out);
  }

  private updatePosteriors(): void {
    this.state.posterior = this.prior.map((p, j) => {
      const m = p.slice();
      this.checks.forEach((c, i) =>
        c.vars.forEach((v, k) => {
          if (v === j) for (let w = 0; w < 4; w++) m[w]! *= this.state.r[i]![k]![w]!;
        }),
      );
      return normalise(m);
    });
  }

  /** Flooding: every check message from the previous q, then every q and posterior. */
  floodingIteration(): void {
    this.state.r = this.checks.map((c, i) => c.vars.map((_, k) => this.checkMessage(i, k)));
    this.state.q = this.checks.map((c, i) => c.vars.map((_, k) => this.varMessage(i, k)));
    this.updatePosteriors();
  }

  /** Serial: checks one at a time, each from the latest messages; then q and posteriors for reading. */
  serialIteration(): void {
    this.checks.forEach((c, i) => {
      c.vars.forEach((_, k) => {
        this.state.q[i]![k] = this.varMessage(i, k);
      });
      this.state.r[i] = c.vars.map((_, k) => this.checkMessage(i, k));
    });
    this.state.q = this.checks.map((c, i) => c.vars.map((_, k) => this.varMessage(i, k)));
    this.updatePosteriors();
  }
}

// Brute-force posteriors on tiny factor graphs: the oracle for BP on cycle-free graphs (Pearl, 1988:
// on a tree, BP's beliefs are the exact marginals). Written for clarity, not speed.

/** A check on bits: the listed variables must have parity `bit`. */
export interface BinaryCheck {
  vars: number[];
  bit: number;
}

/** Exact P(e_j = 1 | all checks) for independent bits with P(e_j = 1) = q[j]. Precondition: n ≤ 20. */
export function binaryMarginals(n: number, q: number[], checks: BinaryCheck[]): number[] {
  const one = new Array<number>(n).fill(0);
  let total = 0;
  for (let e = 0; e < 1 << n; e++) {
    if (!checks.every((c) => c.vars.reduce((s, v) => s ^ ((e >>> v) & 1), 0) === c.bit)) continue;
    let w = 1;
    for (let j = 0; j < n; j++) w *= (e >>> j) & 1 ? q[j]! : 1 - q[j]!;
    total += w;
    for (let j = 0; j < n; j++) if ((e >>> j) & 1) one[j]! += w;
  }
  return one.map((x) => x / total);
}

/** Paulis are numbered I = 0, X = 1, Y = 2, Z = 3; a check of type X sees Z and Y, of type Z sees X and Y. */
export type CheckType = 'X' | 'Z';

export function anticommutes(w: number, type: CheckType): number {
  if (type === 'X') return w === 2 || w === 3 ? 1 : 0;
  return w === 1 || w === 2 ? 1 : 0;
}

export interface PauliCheck {
  type: CheckType;
  vars: number[];
  bit: number;
}

/** Exact P(W_j = w | checks) for independent qubits with prior[j][w]. Precondition: n ≤ 10. */
export function pauliMarginals(n: number, prior: number[][], checks: PauliCheck[]): number[][] {
  const out = Array.from({ length: n }, () => [0, 0, 0, 0]);
  let total = 0;
  const w = new Array<number>(n).fill(0);
  for (let idx = 0; idx < 4 ** n; idx++) {
    let x = idx;
    for (let j = 0; j < n; j++) {
      w[j] = x & 3;
      x >>>= 2;
    }
    if (!checks.every((c) => c.vars.reduce((s, v) => s ^ anticommutes(w[v]!, c.type), 0) === c.bit)) continue;
    let pr = 1;
    for (let j = 0; j < n; j++) pr *= prior[j]![w[j]!]!;
    total += pr;
    for (let j = 0; j < n; j++) out[j]![w[j]!]! += pr;
  }
  return out.map((r) => r.map((x) => x / total));
}

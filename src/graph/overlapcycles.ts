import type { SidedGraph } from './tanner.js';
import { WideSum } from './widesum.js';

/**
 * Exact numbers of 4-, 6- and 8-cycles of a bipartite graph at any girth, from overlaps.
 *
 * Notation (S = the side iterated over, T = the other side; see SidedGraph):
 *   N(a) the neighbours of a node, d_a = |N(a)| for a ∈ S, e_x = |N(x)| for x ∈ T;
 *   o_ab = |N(a) ∩ N(b)| (the overlap of S-nodes a, b) and A the s×s matrix of o_ab with zero diagonal;
 *   τ_abc = |N(a)∩N(b)∩N(c)|, q_abcd = |N(a)∩…∩N(d)|, p_xy = |N(x)∩N(y)| for x, y ∈ T (p_xx = e_x);
 *   L_x = Σ over ordered pairs a ≠ b in N(x) of o_ab;  V_ac = Σ_{x ∈ N(a)∩N(c)} (e_x − 2);
 *   Σ' = sum over ordered tuples of distinct S-nodes; (n)_j = n(n−1)…(n−j+1).
 *
 * A 2k-cycle is a cyclic sequence of k distinct S-nodes with k distinct T-nodes, the i-th joined to the
 * i-th and (i+1)-th S-node; each cycle is met by 2k ordered S-tuples. For a fixed S-tuple the number of
 * distinct T-choices follows by inclusion–exclusion over the set partitions of the k T-slots (Möbius
 * function of the partition lattice): slots merged into one block need one T-node adjacent to every
 * S-node touching them. Summed over S-tuples this gives
 *
 *   4:  N4 = Σ_{a<b} C(o_ab, 2)
 *   6:  6·N6 = tr(A³) − 3 Σ_x (e_x−2) L_x + 2 Σ_x (e_x)_3
 *   8:  8·N8 = T1 − 4 T2 − 2 T3 + 8 T4 + 2 T5 + T6 − 6 T7 with
 *       T1 = Σ' o_ab o_bc o_cd o_da = tr(A⁴) − 2 Σ_a ((A²)_aa)² + Σ_ab A_ab⁴
 *       T2 = Σ' τ_abc o_cd o_da     = Σ_{a≠c} V_ac (A²)_ac − Σ_x Σ_{b∈N(x)} (R_xb² − Σ_{a∈N(x)−b} o_ab²)
 *       T3 = Σ' q o_ab o_cd         = Σ_x (L_x² − 4 Σ_{a∈N(x)} R_xa² + 2 Σ_{a≠b∈N(x)} o_ab²)
 *       T4 = Σ' q o_ab              = Σ_x (e_x−2)(e_x−3) L_x
 *       T5 = Σ' τ_abc τ_cda         = Σ_{a≠c} V_ac² − Σ_{x,y} (p_xy)_3
 *       T6 = Σ' q²                  = Σ_{x,y} (p_xy)_4
 *       T7 = Σ' q                   = Σ_x (e_x)_4
 *     where R_xa = Σ_{b ∈ N(x), b ≠ a} o_ab and Σ_{x,y} runs over ordered pairs of T-nodes, x = y included.
 *
 * Cost: O(Σ_x e_x² + Σ_a nnzA(a)² + Σ_a d_a²) time (the last two only for 6 and 8), O(s + t + nnz(A))
 * memory; nothing is s×s dense. With S the smaller side this is what makes a 10,000×1,000 sparse matrix
 * feasible. All sums are exact (WideSum: doubles with a BigInt spill).
 *
 * Per-node 4-cycle counts come for free: a ∈ S lies on Σ_{b≠a} C(o_ab, 2) of them, x ∈ T on
 * L_x/2 − C(e_x, 2).
 */
export interface OverlapCycleCounts {
  /** cycles[L] for L = 4, 6, 8 up to the requested length. */
  readonly cycles: Map<number, bigint>;
  /** Number of 4-cycles through each S-node and each T-node. */
  readonly fourPerS: Float64Array;
  readonly fourPerT: Float64Array;
}

export function overlapCycleCounts(g: SidedGraph, maxLength: number): OverlapCycleCounts {
  const { s, t, sPtr, sAdj, tPtr, tAdj } = g;
  const want6 = maxLength >= 6;
  const want8 = maxLength >= 8;
  const e = new Float64Array(t);
  let pairBound = 0;
  for (let x = 0; x < t; x++) {
    e[x] = tPtr[x + 1]! - tPtr[x]!;
    pairBound += e[x]! * (e[x]! - 1);
  }
  // Off-diagonal nonzeros of A (and V on the same pattern), row by row; grown as needed.
  let cap = Math.max(16, Math.min(pairBound, s * (s - 1), 1 << 12));
  const aPtr = new Int32Array(s + 1);
  let aIdx = new Int32Array(want6 ? cap : 0);
  let aVal = new Float64Array(want6 ? cap : 0);
  let vVal = new Float64Array(want8 ? cap : 0);

  const orow = new Float64Array(s);
  const vrow = new Float64Array(s);
  const touched = new Int32Array(s);
  const L = new Float64Array(t);
  const fourPerS = new Float64Array(s);
  const four = new WideSum();
  const sumRR = new WideSum(); // Σ_x Σ_a R_xa²
  const sumY = new WideSum(); // Σ_x Σ_{a≠b ∈ N(x)} o_ab²
  const sumVV = new WideSum(); // Σ_{a≠c} V_ac²
  const sumA4 = new WideSum(); // Σ_{a≠b} A_ab⁴
  const sumDiag2 = new WideSum(); // Σ_a ((A²)_aa)²
  let nnz = 0;

  // Pass 1: row a of O (and V), then the T-local sums that need o_ab for a, b in a common N(x).
  for (let a = 0; a < s; a++) {
    let nt = 0;
    for (let i = sPtr[a]!; i < sPtr[a + 1]!; i++) {
      const x = sAdj[i]!;
      const w = e[x]! - 2;
      for (let j = tPtr[x]!; j < tPtr[x + 1]!; j++) {
        const b = tAdj[j]!;
        if (b === a) continue;
        if (orow[b] === 0) touched[nt++] = b;
        orow[b]! += 1;
        vrow[b]! += w;
      }
    }
    let c4 = 0;
    let diag = 0;
    if (want6 && nnz + nt > cap) {
      cap = Math.max(2 * cap, nnz + nt);
      const idx = new Int32Array(cap);
      idx.set(aIdx);
      aIdx = idx;
      aVal = growFloat(aVal, cap);
      if (want8) vVal = growFloat(vVal, cap);
    }
    for (let k = 0; k < nt; k++) {
      const b = touched[k]!;
      const o = orow[b]!;
      c4 += (o * (o - 1)) / 2;
      if (want6) {
        aIdx[nnz] = b;
        aVal[nnz] = o;
        if (want8) {
          vVal[nnz] = vrow[b]!;
          sumVV.addProduct(vrow[b]!, vrow[b]!);
          sumA4.addProduct(o * o, o * o);
        }
        nnz++;
      }
      diag += o * o;
    }
    aPtr[a + 1] = nnz;
    fourPerS[a] = c4;
    four.add(c4);
    if (want8) sumDiag2.addProduct(diag, diag);
    for (let i = sPtr[a]!; i < sPtr[a + 1]!; i++) {
      const x = sAdj[i]!;
      let r = 0;
      let r2 = 0;
      for (let j = tPtr[x]!; j < tPtr[x + 1]!; j++) {
        const b = tAdj[j]!;
        if (b === a) continue;
        const o = orow[b]!;
        r += o;
        r2 += o * o;
      }
      L[x]! += r;
      if (want8) {
        sumRR.addProduct(r, r);
        sumY.add(r2);
      }
    }
    for (let k = 0; k < nt; k++) {
      orow[touched[k]!] = 0;
      vrow[touched[k]!] = 0;
    }
  }

  const fourPerT = new Float64Array(t);
  const sumEL = new WideSum(); // Σ_x (e_x − 2) L_x
  const sumE3 = new WideSum(); // Σ_x (e_x)_3
  const sumL2 = new WideSum(); // Σ_x L_x²
  const sumE4L = new WideSum(); // Σ_x (e_x−2)(e_x−3) L_x
  const sumE4 = new WideSum(); // Σ_x (e_x)_4
  for (let x = 0; x < t; x++) {
    const ex = e[x]!;
    const lx = L[x]!;
    fourPerT[x] = lx / 2 - (ex * (ex - 1)) / 2;
    if (want6) {
      sumEL.addProduct(ex - 2, lx);
      sumE3.addProduct3(ex, ex - 1, ex - 2);
    }
    if (want8) {
      sumL2.addProduct(lx, lx);
      sumE4L.addProduct3(ex - 2, ex - 3, lx);
      sumE4.addProduct(ex * (ex - 1), (ex - 2) * (ex - 3));
    }
  }
  const cycles = new Map<number, bigint>();
  cycles.set(4, four.value() / 2n);
  if (!want6) return { cycles, fourPerS, fourPerT };

  // Pass 2: row a of A², sparse times sparse.
  const tr3 = new WideSum();
  const tr4 = new WideSum();
  const sumVA2 = new WideSum(); // Σ_{a≠c} V_ac (A²)_ac
  const w2 = new Float64Array(s);
  for (let a = 0; a < s; a++) {
    let nt = 0;
    for (let i = aPtr[a]!; i < aPtr[a + 1]!; i++) {
      const b = aIdx[i]!;
      const ab = aVal[i]!;
      for (let j = aPtr[b]!; j < aPtr[b + 1]!; j++) {
        const c = aIdx[j]!;
        if (w2[c] === 0) touched[nt++] = c;
        w2[c]! += ab * aVal[j]!;
      }
    }
    for (let i = aPtr[a]!; i < aPtr[a + 1]!; i++) {
      const c = aIdx[i]!;
      tr3.addProduct(w2[c]!, aVal[i]!);
      if (want8) sumVA2.addProduct(w2[c]!, vVal[i]!);
    }
    if (want8) for (let k = 0; k < nt; k++) tr4.addProduct(w2[touched[k]!]!, w2[touched[k]!]!);
    for (let k = 0; k < nt; k++) w2[touched[k]!] = 0;
  }
  const six = tr3.value() - 3n * sumEL.value() + 2n * sumE3.value();
  cycles.set(6, exactQuotient(six, 6n, 6));
  if (!want8) return { cycles, fourPerS, fourPerT };

  // Pass 3: overlaps p_xy of T-nodes sharing an S-node, for Σ (p)_3 and Σ (p)_4 over ordered pairs:
  // twice the pairs y > x (adjacency lists are ascending, so each is read from its end) plus x = y.
  const cnt = new Float64Array(t);
  const tt = new Int32Array(t);
  const sumP3 = new WideSum();
  const sumP4 = new WideSum();
  for (let x = 0; x < t; x++) {
    let nt = 0;
    for (let i = tPtr[x]!; i < tPtr[x + 1]!; i++) {
      const a = tAdj[i]!;
      for (let j = sPtr[a + 1]! - 1; j >= sPtr[a]!; j--) {
        const y = sAdj[j]!;
        if (y <= x) break;
        if (cnt[y] === 0) tt[nt++] = y;
        cnt[y]! += 1;
      }
    }
    let p3 = 0;
    let p4 = 0;
    for (let k = 0; k < nt; k++) {
      const p = cnt[tt[k]!]!;
      cnt[tt[k]!] = 0;
      if (p < 3) continue;
      const f3 = p * (p - 1) * (p - 2);
      const f4 = f3 * (p - 3);
      if (f4 >= LOCAL_LIMIT) {
        sumP3.addProduct3(2 * p, p - 1, p - 2);
        sumP4.addProduct(2 * f3, p - 3);
        continue;
      }
      p3 += 2 * f3;
      p4 += 2 * f4;
      if (p3 >= LOCAL_LIMIT || p4 >= LOCAL_LIMIT) {
        sumP3.add(p3);
        sumP4.add(p4);
        p3 = 0;
        p4 = 0;
      }
    }
    const ex = e[x]!;
    sumP3.add(p3);
    sumP4.add(p4);
    sumP3.addProduct3(ex, ex - 1, ex - 2);
    sumP4.addProduct(ex * (ex - 1), (ex - 2) * (ex - 3));
  }
  const T1 = tr4.value() - 2n * sumDiag2.value() + sumA4.value();
  const T2 = sumVA2.value() - (sumRR.value() - sumY.value());
  const T3 = sumL2.value() - 4n * sumRR.value() + 2n * sumY.value();
  const T4 = sumE4L.value();
  const T5 = sumVV.value() - sumP3.value();
  const T6 = sumP4.value();
  const T7 = sumE4.value();
  const eight = T1 - 4n * T2 - 2n * T3 + 8n * T4 + 2n * T5 + T6 - 6n * T7;
  cycles.set(8, exactQuotient(eight, 8n, 8));
  return { cycles, fourPerS, fourPerT };
}

function growFloat(a: Float64Array, size: number): Float64Array<ArrayBuffer> {
  const b = new Float64Array(size);
  b.set(a);
  return b;
}

/** Local float sums are flushed before they can leave the exact range. */
const LOCAL_LIMIT = 2 ** 50;

/** n / d, which the derivation says is a non-negative integer; anything else is a bug, never a result. */
export function exactQuotient(n: bigint, d: bigint, length: number): bigint {
  if (n < 0n || n % d !== 0n) throw new Error(`${length}-cycle count: ${n} is not a non-negative multiple of ${d}`);
  return n / d;
}

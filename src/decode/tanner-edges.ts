import type { BitMatrix } from '../gf2/bitmatrix.js';
import { popcount32 } from '../gf2/popcount.js';

/**
 * The edges of a Tanner graph in compressed sparse row form, the layout every decoder kernel walks.
 *
 * Edges are numbered in check order: the edges of check c are checkStart[c] .. checkStart[c+1]-1, and
 * edgeVar[e] is the variable at the other end of edge e (increasing within a check). The same edges seen from
 * the variables: varEdge[varStart[v] .. varStart[v+1]-1] are the edge numbers touching variable v.
 */
export interface TannerEdges {
  readonly checks: number;
  readonly vars: number;
  readonly edges: number;
  readonly checkStart: Int32Array;
  readonly edgeVar: Int32Array;
  /** edgeCheck[e] = the check of edge e. */
  readonly edgeCheck: Int32Array;
  readonly varStart: Int32Array;
  readonly varEdge: Int32Array;
  readonly maxCheckDegree: number;
  readonly maxVarDegree: number;
}

/** One block of checks: the rows of `h`, whose columns are variables varOffset .. varOffset+h.cols-1. */
export interface CheckBlock {
  readonly h: BitMatrix;
  readonly varOffset: number;
}

/**
 * Edge lists of the checks of several blocks stacked in order (block 0's rows first), on `vars` variables.
 * Precondition: every block's columns fit inside 0 .. vars-1 once shifted by its offset.
 */
export function stackedTannerEdges(blocks: readonly CheckBlock[], vars: number): TannerEdges {
  let checks = 0;
  let edges = 0;
  for (const { h, varOffset } of blocks) {
    if (varOffset < 0 || varOffset + h.cols > vars) throw new RangeError(`check block of ${h.cols} columns at ${varOffset} exceeds ${vars} variables`);
    checks += h.rows;
    for (let i = 0; i < h.data.length; i++) edges += popcount32(h.data[i]!);
  }
  const checkStart = new Int32Array(checks + 1);
  const edgeVar = new Int32Array(edges);
  const edgeCheck = new Int32Array(edges);
  const varDegree = new Int32Array(vars);
  let c = 0;
  let e = 0;
  let maxCheckDegree = 0;
  for (const { h, varOffset } of blocks) {
    for (let r = 0; r < h.rows; r++) {
      checkStart[c] = e;
      const off = r * h.stride;
      for (let w = 0; w < h.stride; w++) {
        let x = h.data[off + w]!;
        while (x !== 0) {
          const low = x & -x;
          const v = varOffset + (w << 5) + (31 - Math.clz32(low));
          edgeCheck[e] = c;
          edgeVar[e++] = v;
          varDegree[v]!++;
          x ^= low;
        }
      }
      maxCheckDegree = Math.max(maxCheckDegree, e - checkStart[c]!);
      c++;
    }
  }
  checkStart[checks] = e;
  const varStart = new Int32Array(vars + 1);
  let maxVarDegree = 0;
  for (let v = 0; v < vars; v++) {
    varStart[v + 1] = varStart[v]! + varDegree[v]!;
    maxVarDegree = Math.max(maxVarDegree, varDegree[v]!);
  }
  const fill = varStart.slice(0, vars);
  const varEdge = new Int32Array(edges);
  for (let k = 0; k < edges; k++) {
    const v = edgeVar[k]!;
    varEdge[fill[v]!++] = k;
  }
  return { checks, vars, edges, checkStart, edgeVar, edgeCheck, varStart, varEdge, maxCheckDegree, maxVarDegree };
}

/** Edge lists of one check matrix (variables = its columns). */
export function tannerEdges(h: BitMatrix): TannerEdges {
  return stackedTannerEdges([{ h, varOffset: 0 }], h.cols);
}

/**
 * Whether the hard decision `bits` (one byte per variable) has syndrome `syndrome` (one byte per check) on
 * checks from .. to-1 (all checks by default).
 */
export function syndromeMatches(g: TannerEdges, bits: Uint8Array, syndrome: Uint8Array, from = 0, to = g.checks): boolean {
  const { checkStart, edgeVar } = g;
  for (let c = from; c < to; c++) {
    let parity = syndrome[c]!;
    const end = checkStart[c + 1]!;
    for (let e = checkStart[c]!; e < end; e++) parity ^= bits[edgeVar[e]!]!;
    if (parity !== 0) return false;
  }
  return true;
}

import type { BitMatrix } from '../gf2/bitmatrix.js';

/**
 * The Tanner graph of a binary matrix as two compressed adjacency lists: row r is joined to the columns
 * rowAdj[rowPtr[r] .. rowPtr[r+1]) (ascending), column c to the rows colAdj[colPtr[c] .. colPtr[c+1]).
 * One edge per nonzero entry; rows and columns of degree 0 are isolated nodes.
 */
export interface TannerGraph {
  readonly rows: number;
  readonly cols: number;
  readonly edges: number;
  readonly rowPtr: Int32Array;
  readonly rowAdj: Int32Array;
  readonly colPtr: Int32Array;
  readonly colAdj: Int32Array;
}

/** Build the Tanner graph of `m`. Cost O(rows·stride + edges). */
export function tannerGraph(m: BitMatrix): TannerGraph {
  const { rows, cols, stride, data } = m;
  const rowPtr = new Int32Array(rows + 1);
  const colDeg = new Int32Array(cols);
  let edges = 0;
  for (let r = 0; r < rows; r++) {
    const off = r * stride;
    for (let w = 0; w < stride; w++) {
      let x = data[off + w]!;
      while (x !== 0) {
        const low = x & -x;
        colDeg[(w << 5) + (31 - Math.clz32(low))]! += 1;
        edges++;
        x ^= low;
      }
    }
    rowPtr[r + 1] = edges;
  }
  const rowAdj = new Int32Array(edges);
  const colPtr = new Int32Array(cols + 1);
  for (let c = 0; c < cols; c++) colPtr[c + 1] = colPtr[c]! + colDeg[c]!;
  const fill = colPtr.slice(0, cols);
  const colAdj = new Int32Array(edges);
  let e = 0;
  for (let r = 0; r < rows; r++) {
    const off = r * stride;
    for (let w = 0; w < stride; w++) {
      let x = data[off + w]!;
      while (x !== 0) {
        const low = x & -x;
        const c = (w << 5) + (31 - Math.clz32(low));
        rowAdj[e++] = c;
        colAdj[fill[c]!++] = r;
        x ^= low;
      }
    }
  }
  return { rows, cols, edges, rowPtr, rowAdj, colPtr, colAdj };
}

/**
 * The Tanner graph seen from one side. The counting formulas iterate over the nodes of side S (size s)
 * and treat the other side T (size t) through adjacency lists; `sIsRows` says which side S is.
 */
export interface SidedGraph {
  readonly s: number;
  readonly t: number;
  readonly edges: number;
  readonly sPtr: Int32Array;
  readonly sAdj: Int32Array;
  readonly tPtr: Int32Array;
  readonly tAdj: Int32Array;
  readonly sIsRows: boolean;
}

export function sidedGraph(g: TannerGraph, sIsRows: boolean): SidedGraph {
  return sIsRows
    ? { s: g.rows, t: g.cols, edges: g.edges, sPtr: g.rowPtr, sAdj: g.rowAdj, tPtr: g.colPtr, tAdj: g.colAdj, sIsRows }
    : { s: g.cols, t: g.rows, edges: g.edges, sPtr: g.colPtr, sAdj: g.colAdj, tPtr: g.rowPtr, tAdj: g.rowAdj, sIsRows };
}

/** S = the side with fewer nodes (rows on a tie): every cost that grows fastest in s is then smallest. */
export function smallerSide(g: TannerGraph): SidedGraph {
  return sidedGraph(g, g.rows <= g.cols);
}

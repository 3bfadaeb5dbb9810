import type { BitMatrix } from '../gf2/bitmatrix.js';
import { popcount32 } from '../gf2/popcount.js';
import type { Budget } from './budget.js';
import { Layering, latencyOf, type LatencyModel } from './latency.js';

/**
 * The matrix being conditioned, as the budgets see it: rows (packed), column degrees, edges, maximum row
 * weight and degree, and a greedy layering for the layered latency model. Rows are only ever appended.
 */
export class MatrixState {
  readonly stride: number;
  readonly rows: Uint32Array[] = [];
  readonly colDegree: Int32Array;
  edges = 0;
  maxRowWeight = 0;
  maxColDegree = 0;
  readonly layering: Layering;

  constructor(readonly cols: number, readonly latencyModel: LatencyModel, readonly iterations: number) {
    this.stride = (cols + 31) >>> 5;
    this.colDegree = new Int32Array(cols);
    this.layering = new Layering(this.stride);
  }

  static of(m: BitMatrix, rows: readonly number[], model: LatencyModel, iterations: number): MatrixState {
    const st = new MatrixState(m.cols, model, iterations);
    for (const r of rows) st.add(m.data.slice(r * m.stride, (r + 1) * m.stride));
    return st;
  }

  add(v: Uint32Array): void {
    this.rows.push(v);
    let w = 0;
    for (let x = 0; x < this.stride; x++) {
      let y = v[x]!;
      w += popcount32(y);
      while (y !== 0) {
        const low = y & -y;
        const c = (x << 5) + (31 - Math.clz32(low));
        const d = ++this.colDegree[c]!;
        if (d > this.maxColDegree) this.maxColDegree = d;
        y ^= low;
      }
    }
    this.edges += w;
    if (w > this.maxRowWeight) this.maxRowWeight = w;
    this.layering.add(v);
  }

  get layers(): number {
    return this.layering.count;
  }

  latency(): number {
    return latencyOf(this.latencyModel, this.iterations, this);
  }

  /** Whether adding the rows `vs` (with weights ws) keeps every budget; `added` counts rows added so far. */
  fits(vs: readonly Uint32Array[], ws: readonly number[], added: number, b: Budget): boolean {
    const k = vs.length;
    if (b.rows !== undefined && this.rows.length + k > b.rows) return false;
    if (b.extra !== undefined && added + k > b.extra) return false;
    let edges = this.edges;
    let maxW = this.maxRowWeight;
    for (const w of ws) {
      if (b.rowWeight !== undefined && w > b.rowWeight) return false;
      edges += w;
      if (w > maxW) maxW = w;
    }
    if (b.edges !== undefined && edges > b.edges) return false;
    let maxD = this.maxColDegree;
    if (b.colDegree !== undefined || b.latency !== undefined) {
      const bump = new Map<number, number>();
      for (const v of vs) {
        for (let x = 0; x < this.stride; x++) {
          let y = v[x]!;
          while (y !== 0) {
            const low = y & -y;
            const c = (x << 5) + (31 - Math.clz32(low));
            const d = this.colDegree[c]! + (bump.get(c) ?? 0) + 1;
            bump.set(c, (bump.get(c) ?? 0) + 1);
            if (b.colDegree !== undefined && d > b.colDegree) return false;
            if (d > maxD) maxD = d;
            y ^= low;
          }
        }
      }
    }
    if (b.latency !== undefined) {
      let layers = this.layering.count;
      if (this.latencyModel === 'layered') {
        const trial = new Layering(this.stride);
        for (const m of this.layering.layerMasks) trial.layerMasks.push(m.slice());
        for (const v of vs) trial.add(v);
        layers = trial.count;
      }
      const lat = latencyOf(this.latencyModel, this.iterations, { edges, maxRowWeight: maxW, maxColDegree: maxD, layers });
      if (lat > b.latency) return false;
    }
    return true;
  }

  /** Which budget the current matrix already breaks (before anything is added), or null. */
  violation(b: Budget, added: number): string | null {
    if (b.rows !== undefined && this.rows.length > b.rows) return `rows=${b.rows} is below the ${this.rows.length} rows kept from the original matrix`;
    if (b.extra !== undefined && added > b.extra) return `extra=${b.extra}`;
    if (b.edges !== undefined && this.edges > b.edges) return `edges=${b.edges} is below the original matrix's ${this.edges} edges`;
    if (b.colDegree !== undefined && this.maxColDegree > b.colDegree) return `col-degree=${b.colDegree} is below the original matrix's maximum column degree ${this.maxColDegree}`;
    if (b.latency !== undefined && this.latency() > b.latency) return `latency=${b.latency} is below the original matrix's latency ${this.latency()}`;
    return null;
  }
}

import type { TannerGraph } from './tanner.js';

/**
 * Structure of a check matrix beside its cycle census: row-weight and column-degree histograms
 * (value → how many rows/columns), the number of edges, and the row-overlap histogram rowOverlaps[k] =
 * number of unordered row pairs sharing exactly k columns. Pairs that share something are counted through
 * the column lists (O(Σ_c deg_c²)); the rest share nothing.
 */
export interface StructureSummary {
  readonly rows: number;
  readonly cols: number;
  readonly edges: number;
  readonly rowWeights: ReadonlyMap<number, number>;
  readonly colDegrees: ReadonlyMap<number, number>;
  readonly rowOverlaps: readonly number[];
}

export function structureSummary(g: TannerGraph): StructureSummary {
  const rowWeights = histogram(g.rowPtr, g.rows);
  const colDegrees = histogram(g.colPtr, g.cols);
  const overlaps: number[] = [0];
  const cnt = new Int32Array(g.rows);
  const touched = new Int32Array(g.rows);
  let sharing = 0;
  for (let r = 0; r < g.rows; r++) {
    let nt = 0;
    for (let i = g.rowPtr[r]!; i < g.rowPtr[r + 1]!; i++) {
      const c = g.rowAdj[i]!;
      for (let j = g.colPtr[c]!; j < g.colPtr[c + 1]!; j++) {
        const q = g.colAdj[j]!;
        if (q <= r) continue;
        if (cnt[q] === 0) touched[nt++] = q;
        cnt[q]! += 1;
      }
    }
    for (let k = 0; k < nt; k++) {
      const o = cnt[touched[k]!]!;
      while (overlaps.length <= o) overlaps.push(0);
      overlaps[o]! += 1;
      cnt[touched[k]!] = 0;
    }
    sharing += nt;
  }
  overlaps[0] = (g.rows * (g.rows - 1)) / 2 - sharing;
  return { rows: g.rows, cols: g.cols, edges: g.edges, rowWeights, colDegrees, rowOverlaps: overlaps };
}

function histogram(ptr: Int32Array, n: number): Map<number, number> {
  const h = new Map<number, number>();
  for (let i = 0; i < n; i++) {
    const d = ptr[i + 1]! - ptr[i]!;
    h.set(d, (h.get(d) ?? 0) + 1);
  }
  return new Map([...h].sort((a, b) => a[0] - b[0]));
}

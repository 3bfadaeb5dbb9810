/**
 * Canonical form of a small bipartite pattern graph (at most 31 nodes) with its sides fixed: two
 * patterns get the same key exactly when there is an isomorphism mapping S-nodes to S-nodes and
 * T-nodes to T-nodes. Method: individualization–refinement. Colour classes (ordered cells, S-nodes first)
 * are refined until equitable, splitting each cell by the number of neighbours in another cell; when a
 * cell stays non-trivial, each of its nodes is individualized in turn and the smallest resulting
 * adjacency string wins. Exponential in the worst case, instant for the graphs met here (≤ 12 nodes).
 */
export interface PatternGraph {
  readonly sCount: number;
  readonly tCount: number;
  /** Edges as pairs (S-node, T-node), S-nodes 0..sCount-1, T-nodes 0..tCount-1. No repeats. */
  readonly edges: readonly (readonly [number, number])[];
}

export function canonicalPattern(p: PatternGraph): { key: string; pattern: PatternGraph } {
  const n = p.sCount + p.tCount;
  const adj = new Array<number>(n).fill(0);
  for (const [a, x] of p.edges) {
    const u = a;
    const v = p.sCount + x;
    adj[u] = adj[u]! | (1 << v);
    adj[v] = adj[v]! | (1 << u);
  }
  const cells: number[][] = [];
  if (p.sCount > 0) cells.push(range(0, p.sCount));
  if (p.tCount > 0) cells.push(range(p.sCount, n));
  let best: { key: string; order: number[] } | null = null;
  const search = (start: number[][]) => {
    const c = refine(start, adj);
    const open = c.findIndex((cell) => cell.length > 1);
    if (open < 0) {
      const order = c.map((cell) => cell[0]!);
      const key = certificate(order, adj, p.sCount, p.tCount);
      if (best === null || key < best.key) best = { key, order };
      return;
    }
    const cell = c[open]!;
    for (const v of cell) {
      const next = c.slice();
      next.splice(open, 1, [v], cell.filter((u) => u !== v));
      search(next);
    }
  };
  search(cells);
  const { key, order } = best!;
  const pos = new Array<number>(n);
  order.forEach((v, i) => (pos[v] = i));
  const edges = p.edges
    .map(([a, x]) => [pos[a]!, pos[p.sCount + x]! - p.sCount] as [number, number])
    .sort((u, v) => u[0] - v[0] || u[1] - v[1]);
  return { key, pattern: { sCount: p.sCount, tCount: p.tCount, edges } };
}

function range(a: number, b: number): number[] {
  const out: number[] = [];
  for (let i = a; i < b; i++) out.push(i);
  return out;
}

function popcount(x: number): number {
  let c = 0;
  while (x !== 0) {
    x &= x - 1;
    c++;
  }
  return c;
}

/** Split cells by neighbour counts into other cells until nothing changes (an equitable partition). */
function refine(cells: number[][], adj: number[]): number[][] {
  let c = cells;
  for (let changed = true; changed; ) {
    changed = false;
    for (let j = 0; j < c.length && !changed; j++) {
      let mask = 0;
      for (const v of c[j]!) mask |= 1 << v;
      for (let i = 0; i < c.length; i++) {
        const cell = c[i]!;
        if (cell.length === 1) continue;
        const groups = new Map<number, number[]>();
        for (const v of cell) {
          const k = popcount(adj[v]! & mask);
          const g = groups.get(k);
          if (g) g.push(v);
          else groups.set(k, [v]);
        }
        if (groups.size > 1) {
          const split = [...groups.entries()].sort((u, v) => u[0] - v[0]).map((g) => g[1]);
          c = [...c.slice(0, i), ...split, ...c.slice(i + 1)];
          changed = true;
          break;
        }
      }
    }
  }
  return c;
}

function certificate(order: number[], adj: number[], sCount: number, tCount: number): string {
  let bits = `${sCount}.${tCount}.`;
  for (let i = 0; i < sCount; i++) {
    for (let j = sCount; j < order.length; j++) bits += (adj[order[i]!]! >>> order[j]!) & 1 ? '1' : '0';
  }
  return bits;
}

import type { SidedGraph } from './tanner.js';

/**
 * Girth and shortest-cycle participation by breadth-first search. Nodes are numbered S first
 * (0..s−1), then T (s..s+t−1).
 *
 * girth: a BFS from each S-node (every cycle has S-nodes) finds, at the first non-tree edge (u, w), a
 * closed walk of length dist(u) + dist(w) + 1 containing a cycle; from a node on a shortest cycle this is
 * exactly the girth. O(s·edges) time, each search stopped once it cannot beat the best so far.
 *
 * participation at the girth g: from each node v, a BFS to depth g/2 counting shortest paths. When g is
 * the girth, two shortest paths to a node u at depth g/2 are internally disjoint (else a shorter cycle
 * would exist), so they form a g-cycle through v with u opposite v, and every g-cycle through v arises once
 * this way: v lies on Σ_u C(paths(u), 2) of them. O((s+t)·edges) time.
 */
export function girthByBfs(g: SidedGraph): number {
  const { s, t, sPtr, sAdj, tPtr, tAdj } = g;
  const n = s + t;
  const dist = new Int32Array(n).fill(-1);
  const parent = new Int32Array(n);
  const queue = new Int32Array(n);
  let best = Infinity;
  for (let root = 0; root < s; root++) {
    let head = 0;
    let tail = 0;
    queue[tail++] = root;
    dist[root] = 0;
    parent[root] = -1;
    search: while (head < tail) {
      const u = queue[head++]!;
      if (2 * dist[u]! + 1 >= best) break;
      const isS = u < s;
      const lo = isS ? sPtr[u]! : tPtr[u - s]!;
      const hi = isS ? sPtr[u + 1]! : tPtr[u - s + 1]!;
      const adj = isS ? sAdj : tAdj;
      const offset = isS ? s : 0;
      for (let i = lo; i < hi; i++) {
        const w = adj[i]! + offset;
        if (dist[w] === -1) {
          dist[w] = dist[u]! + 1;
          parent[w] = u;
          queue[tail++] = w;
        } else if (w !== parent[u]) {
          const len = dist[u]! + dist[w]! + 1;
          if (len < best) best = len;
          break search;
        }
      }
    }
    for (let i = 0; i < tail; i++) dist[queue[i]!] = -1;
  }
  return best;
}

export function girthParticipation(g: SidedGraph, girth: number): { perS: Float64Array; perT: Float64Array } {
  const { s, t, sPtr, sAdj, tPtr, tAdj } = g;
  const n = s + t;
  const half = girth / 2;
  const dist = new Int32Array(n).fill(-1);
  const paths = new Float64Array(n);
  const queue = new Int32Array(n);
  const per = new Float64Array(n);
  for (let root = 0; root < n; root++) {
    let head = 0;
    let tail = 0;
    queue[tail++] = root;
    dist[root] = 0;
    paths[root] = 1;
    let count = 0;
    while (head < tail) {
      const u = queue[head++]!;
      const du = dist[u]!;
      if (du === half) {
        const p = paths[u]!;
        count += (p * (p - 1)) / 2;
        continue;
      }
      const isS = u < s;
      const lo = isS ? sPtr[u]! : tPtr[u - s]!;
      const hi = isS ? sPtr[u + 1]! : tPtr[u - s + 1]!;
      const adj = isS ? sAdj : tAdj;
      const offset = isS ? s : 0;
      for (let i = lo; i < hi; i++) {
        const w = adj[i]! + offset;
        if (dist[w] === -1) {
          dist[w] = du + 1;
          paths[w] = paths[u]!;
          queue[tail++] = w;
        } else if (dist[w] === du + 1) paths[w]! += paths[u]!;
      }
    }
    per[root] = count;
    for (let i = 0; i < tail; i++) {
      dist[queue[i]!] = -1;
      paths[queue[i]!] = 0;
    }
  }
  return { perS: per.slice(0, s), perT: per.slice(s) };
}

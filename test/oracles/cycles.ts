/**
 * Brute-force cycle census of the Tanner graph of a small dense 0/1 matrix: explicit enumeration of the
 * simple cycles, each counted once. Nodes 0..rows-1 are rows, rows..rows+cols-1 columns. A cycle is
 * found from its smallest node v by a depth-first search over simple paths through nodes larger than v;
 * each is met twice (once per direction), so every count is halved at the end.
 * Exponential; meant for graphs of a few dozen edges.
 */
export interface OracleCensus {
  /** count[L] for every even L ≤ maxLength. */
  readonly counts: Map<number, number>;
  /** perRow[L][r], perCol[L][c]: cycles of length L through row r / column c. */
  readonly perRow: Map<number, number[]>;
  readonly perCol: Map<number, number[]>;
  /** Length of the shortest cycle of any length (searched up to rows+cols), or null for a forest. */
  readonly girth: number | null;
}

export function oracleCensus(dense: readonly (readonly number[])[], cols: number, maxLength: number): OracleCensus {
  const rows = dense.length;
  const n = rows + cols;
  const adj: number[][] = Array.from({ length: n }, () => []);
  for (let r = 0; r < rows; r++) {
    for (let c = 0; c < cols; c++) {
      if (dense[r]![c]) {
        adj[r]!.push(rows + c);
        adj[rows + c]!.push(r);
      }
    }
  }
  const limit = Math.max(maxLength, 0);
  const twice = new Map<number, number>();
  const node = new Map<number, number[]>();
  for (let L = 4; L <= limit; L += 2) {
    twice.set(L, 0);
    node.set(L, new Array<number>(n).fill(0));
  }
  const path: number[] = [];
  const onPath = new Array<boolean>(n).fill(false);
  let shortest = Infinity;
  const search = (start: number, v: number, depth: number, cap: number) => {
    for (const w of adj[v]!) {
      if (w === start && depth >= 3) {
        const L = depth + 1;
        if (L < shortest) shortest = L;
        if (L <= limit) {
          twice.set(L, twice.get(L)! + 1);
          const per = node.get(L)!;
          for (const u of path) per[u]! += 1;
        }
        continue;
      }
      if (w <= start || onPath[w] || depth + 1 >= cap) continue;
      onPath[w] = true;
      path.push(w);
      search(start, w, depth + 1, cap);
      path.pop();
      onPath[w] = false;
    }
  };
  for (let v = 0; v < n; v++) {
    onPath[v] = true;
    path.push(v);
    search(v, v, 0, Math.max(limit, 4));
    path.pop();
    onPath[v] = false;
  }
  // The girth may exceed maxLength: look further, stopping at the first length found.
  if (shortest === Infinity) {
    for (let cap = limit + 2; cap <= n && shortest === Infinity; cap += 2) {
      for (let v = 0; v < n && shortest === Infinity; v++) {
        onPath[v] = true;
        path.push(v);
        searchLength(v, cap);
        path.pop();
        onPath[v] = false;
      }
    }
  }
  function searchLength(start: number, cap: number) {
    const go = (v: number, depth: number) => {
      for (const w of adj[v]!) {
        if (w === start && depth >= 3) {
          shortest = Math.min(shortest, depth + 1);
          continue;
        }
        if (w <= start || onPath[w] || depth + 1 >= cap) continue;
        onPath[w] = true;
        go(w, depth + 1);
        onPath[w] = false;
      }
    };
    go(start, 0);
  }
  const counts = new Map<number, number>();
  const perRow = new Map<number, number[]>();
  const perCol = new Map<number, number[]>();
  for (let L = 4; L <= limit; L += 2) {
    counts.set(L, twice.get(L)! / 2);
    const per = node.get(L)!.map((x) => x / 2);
    perRow.set(L, per.slice(0, rows));
    perCol.set(L, per.slice(rows));
  }
  return { counts, perRow, perCol, girth: shortest === Infinity ? null : shortest };
}

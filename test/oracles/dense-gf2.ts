// Naive GF(2) linear algebra on number[][]: the oracle for the packed engine. Written for clarity, not speed.
export type Dense = number[][];

export function denseRank(a: Dense, cols?: number): number {
  const m = a.map((r) => r.slice());
  const n = cols ?? m[0]?.length ?? 0;
  let rank = 0;
  for (let c = 0; c < n; c++) {
    let p = -1;
    for (let i = rank; i < m.length; i++) if (m[i]![c] === 1) { p = i; break; }
    if (p < 0) continue;
    [m[rank], m[p]] = [m[p]!, m[rank]!];
    for (let i = 0; i < m.length; i++) {
      if (i !== rank && m[i]![c] === 1) m[i] = m[i]!.map((v, j) => v ^ m[rank]![j]!);
    }
    rank++;
  }
  return rank;
}

export function denseTranspose(a: Dense, cols: number): Dense {
  const out: Dense = [];
  for (let c = 0; c < cols; c++) out.push(a.map((r) => r[c]!));
  return out;
}

export function denseMultiply(a: Dense, b: Dense, bCols: number): Dense {
  return a.map((row) => {
    const out = new Array<number>(bCols).fill(0);
    row.forEach((v, k) => {
      if (v) for (let j = 0; j < bCols; j++) out[j] = out[j]! ^ b[k]![j]!;
    });
    return out;
  });
}

/** Every vector of the row space (2^rank of them), as strings of 0/1, for small cases. */
export function denseRowSpace(a: Dense, cols: number): Set<string> {
  const out = new Set<string>();
  const n = a.length;
  for (let mask = 0; mask < 1 << n; mask++) {
    const v = new Array<number>(cols).fill(0);
    for (let i = 0; i < n; i++) if ((mask >> i) & 1) for (let j = 0; j < cols; j++) v[j] = v[j]! ^ a[i]![j]!;
    out.add(v.join(''));
  }
  return out;
}

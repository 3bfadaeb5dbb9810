/**
 * Exact change in the number of 4- and 6-cycles of a Tanner graph when one row (check) is added, in
 * O(w²) per query for a row of weight w, after O(n·w) work per row actually added.
 *
 * With A the current matrix, C = AᵀA (C[x][y] = rows containing columns x and y, C[x][x] = degree of x),
 * D = C² and S[x][z] = Σ over rows a ∋ x, z of (|a| − 2), a new row r closes
 *   4-cycles: Σ_{x<z ∈ r} C[x][z]                      (one per other row sharing x and z)
 *   6-cycles: Σ_{x<z ∈ r} (D[x][z] − C[x][z]·(C[x][x] + C[z][z]) − S[x][z])
 * The 6-cycle term counts paths x – a – y – b – z with y ∉ {x, z} (Σ_y C[x][y]·C[y][z] minus the y = x and
 * y = z terms) and removes those with a = b (a row holding x, y and z: S[x][z] of them).
 */
export class ShortCycleDelta {
  readonly n: number;
  private readonly c: Float64Array;
  private readonly d: Float64Array;
  private readonly s: Float64Array;
  private readonly sup: number[] = [];

  constructor(n: number) {
    this.n = n;
    this.c = new Float64Array(n * n);
    this.d = new Float64Array(n * n);
    this.s = new Float64Array(n * n);
  }

  private support(v: Uint32Array): number[] {
    const out = this.sup;
    out.length = 0;
    for (let x = 0; x < v.length; x++) {
      let y = v[x]!;
      while (y !== 0) {
        const low = y & -y;
        out.push((x << 5) + (31 - Math.clz32(low)));
        y ^= low;
      }
    }
    return out;
  }

  /** New 4- and 6-cycles if the packed row v were added. */
  delta(v: Uint32Array): { d4: number; d6: number } {
    const r = this.support(v);
    const { n, c, d, s } = this;
    let d4 = 0;
    let d6 = 0;
    for (let i = 0; i < r.length; i++) {
      const x = r[i]!;
      for (let j = i + 1; j < r.length; j++) {
        const z = r[j]!;
        const cxz = c[x * n + z]!;
        d4 += cxz;
        d6 += d[x * n + z]! - cxz * (c[x * n + x]! + c[z * n + z]!) - s[x * n + z]!;
      }
    }
    return { d4, d6 };
  }

  /** Record the row v as added: C += uuᵀ, D = (C + uuᵀ)² = D + (Cu)uᵀ + u(Cu)ᵀ + |u|·uuᵀ (old C), S += (|u| − 2)uuᵀ. */
  add(v: Uint32Array): void {
    const r = this.support(v).slice();
    const { n, c, d, s } = this;
    const w = r.length;
    // cu[y] = Σ_{x ∈ r} C[y][x] (old C)
    const cu = new Float64Array(n);
    for (let y = 0; y < n; y++) {
      let t = 0;
      for (const x of r) t += c[y * n + x]!;
      cu[y] = t;
    }
    for (let y = 0; y < n; y++) {
      const cy = cu[y]!;
      if (cy === 0) continue;
      for (const x of r) {
        d[y * n + x] = d[y * n + x]! + cy;
        d[x * n + y] = d[x * n + y]! + cy;
      }
    }
    for (const x of r) {
      for (const z of r) {
        d[x * n + z] = d[x * n + z]! + w;
        c[x * n + z] = c[x * n + z]! + 1;
        s[x * n + z] = s[x * n + z]! + (w - 2);
      }
    }
  }
}

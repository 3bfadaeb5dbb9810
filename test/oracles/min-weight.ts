// Brute-force minimum weights for small codes (n ≤ 30), on plain integer bitmasks: its own elimination and
// its own enumeration, sharing nothing with the packed engine. Written for clarity, not speed.
import type { Dense } from './dense-gf2.js';

export function toMask(row: readonly number[]): number {
  let m = 0;
  row.forEach((v, j) => {
    if (v & 1) m |= 1 << j;
  });
  return m >>> 0;
}

export function maskWeight(m: number): number {
  let c = 0;
  for (let x = m >>> 0; x !== 0; x &= x - 1) c++;
  return c;
}

export function maskSupport(m: number): number[] {
  const out: number[] = [];
  for (let j = 0; j < 31; j++) if ((m >>> j) & 1) out.push(j);
  return out;
}

/** A basis of the row space (as masks), by elimination on masks. */
export function maskBasis(rows: readonly number[]): number[] {
  const basis: number[] = [];
  for (let v of rows) {
    for (const b of basis) if ((v ^ b) < v) v = (v ^ b) >>> 0; // reduce by leading bits (basis kept with distinct leading bits)
    if (v !== 0) {
      basis.push(v >>> 0);
      basis.sort((a, b) => b - a);
    }
  }
  return basis;
}

/** Every vector of the span (including 0). */
export function maskSpan(rows: readonly number[]): number[] {
  const basis = maskBasis(rows);
  const out: number[] = [0];
  for (const b of basis) {
    const len = out.length;
    for (let i = 0; i < len; i++) out.push((out[i]! ^ b) >>> 0);
  }
  return out;
}

/** The kernel {x : H·x = 0} over n columns: every x visited in Gray-code order, tracking its syndrome. */
export function maskKernel(h: Dense, n: number): number[] {
  const columns: number[] = [];
  for (let j = 0; j < n; j++) columns.push(toMask(h.map((row) => row[j]!)));
  const out: number[] = [0];
  let x = 0;
  let syndrome = 0;
  for (let i = 1; i < 2 ** n; i++) {
    const j = 31 - Math.clz32(i & -i);
    x = (x ^ (1 << j)) >>> 0;
    syndrome = (syndrome ^ columns[j]!) >>> 0;
    if (syndrome === 0) out.push(x);
  }
  return out;
}

/** Minimum weight over ker(hz) \ rowspace(hx), with the number of words attaining it (null when there are none). */
export function bruteCssDistance(hx: Dense, hz: Dense, n: number): { d: number; count: number } | null {
  const stabilizers = new Set(maskSpan(hx.map(toMask)));
  let d = Infinity;
  let count = 0;
  for (const x of maskKernel(hz, n)) {
    if (stabilizers.has(x)) continue;
    const w = maskWeight(x);
    if (w < d) {
      d = w;
      count = 1;
    } else if (w === d) count++;
  }
  return d === Infinity ? null : { d, count };
}

/** All nonzero words of rowspace(g) of weight ≤ W, optionally only those with odd overlap with some filter row. */
export function bruteWordsUpTo(g: Dense, maxWeight: number, filter?: Dense): number[] {
  const f = filter?.map(toMask);
  return maskSpan(g.map(toMask))
    .filter((x) => x !== 0 && maskWeight(x) <= maxWeight)
    .filter((x) => !f || f.some((r) => maskWeight((r & x) >>> 0) & 1))
    .sort((a, b) => a - b);
}

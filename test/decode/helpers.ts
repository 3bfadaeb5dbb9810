// Small graph and code generators shared by the decoder tests.
import { type BitMatrix, fromSupports } from '../../src/gf2/bitmatrix.js';
import { streamRng, type Xoshiro128 } from '../../src/parallel/seeds.js';
import type { PauliCheck } from '../oracles/pauli-brute.js';

/**
 * A random Tanner tree: start from variable 0; each new check hangs off one existing variable and brings
 * 1..3 new ones, so the check–variable graph stays connected and cycle-free.
 */
export function randomTree(rng: Xoshiro128, maxVars: number): { n: number; checks: number[][] } {
  let n = 1;
  const checks: number[][] = [];
  while (n < maxVars) {
    const anchor = rng.below(n);
    const fresh = Math.min(1 + rng.below(3), maxVars - n);
    const vars = [anchor];
    for (let k = 0; k < fresh; k++) vars.push(n++);
    checks.push(vars.sort((a, b) => a - b));
  }
  return { n, checks };
}

/** Random low-weight rows orthogonal to the rows of hx (rejection), as HZ of a CSS code. */
export function randomCss(seed: number, n: number, mx: number, mz: number): { hx: BitMatrix; hz: BitMatrix } {
  const rng = streamRng(`css-${seed}`, 0);
  const pick = (w: number) => {
    const s = new Set<number>();
    while (s.size < w) s.add(rng.below(n));
    return [...s].sort((a, b) => a - b);
  };
  const xs: number[][] = [];
  for (let i = 0; i < mx; i++) xs.push(pick(2 + rng.below(3)));
  const zs: number[][] = [];
  for (let tries = 0; zs.length < mz && tries < 100000; tries++) {
    const z = pick(2 + rng.below(3));
    if (xs.every((x) => x.filter((c) => z.includes(c)).length % 2 === 0)) zs.push(z);
  }
  return { hx: fromSupports(xs.length, n, xs), hz: fromSupports(zs.length, n, zs) };
}

/** Pauli checks (X-type rows of dx first, then Z-type rows of dz) with syndrome bits. */
export function pauliChecks(dx: BitMatrix, dz: BitMatrix, syndrome: Uint8Array): PauliCheck[] {
  const out: PauliCheck[] = [];
  const add = (m: BitMatrix, type: 'X' | 'Z', off: number) => {
    for (let r = 0; r < m.rows; r++) {
      const vars: number[] = [];
      for (let c = 0; c < m.cols; c++) if ((m.data[r * m.stride + (c >>> 5)]! >>> (c & 31)) & 1) vars.push(c);
      out.push({ type, vars, bit: syndrome[off + r]! });
    }
  };
  add(dx, 'X', 0);
  add(dz, 'Z', dx.rows);
  return out;
}

/** Random distribution over 4 (or 2) outcomes bounded away from 0. */
export function randomDistribution(rng: Xoshiro128, k: number): number[] {
  const v = Array.from({ length: k }, () => 0.05 + rng.next());
  const s = v.reduce((a, b) => a + b, 0);
  return v.map((x) => x / s);
}

import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fromDense, setBit, zeros } from '../../src/gf2/bitmatrix.js';
import { canonicalPattern, type PatternGraph } from '../../src/graph/canonical.js';
import { homomorphismCount, homTarget, planHomomorphism, tableAvailability } from '../../src/graph/homomorphisms.js';
import { sidedGraph, tannerGraph } from '../../src/graph/tanner.js';
import { smallMatrix } from './matrices.js';
import { chineseRemainder, modulusPrime, primesForBound } from '../../src/graph/modular.js';
import { partitionMobius, setPartitions } from '../../src/graph/partitions.js';
import { WideSum, countToJson } from '../../src/graph/widesum.js';

/** Side-keeping isomorphism by trying every pair of permutations (oracle for tiny patterns). */
function isomorphic(a: PatternGraph, b: PatternGraph): boolean {
  if (a.sCount !== b.sCount || a.tCount !== b.tCount || a.edges.length !== b.edges.length) return false;
  const target = new Set(b.edges.map(([x, y]) => `${x},${y}`));
  for (const ps of permutations(a.sCount)) {
    for (const pt of permutations(a.tCount)) {
      if (a.edges.every(([x, y]) => target.has(`${ps[x]},${pt[y]}`))) return true;
    }
  }
  return false;
}

function permutations(n: number): number[][] {
  if (n === 0) return [[]];
  return permutations(n - 1).flatMap((p) => Array.from({ length: n }, (_, i) => [...p.slice(0, i), n - 1, ...p.slice(i)]));
}

const pattern = fc
  .record({ s: fc.integer({ min: 1, max: 4 }), t: fc.integer({ min: 1, max: 4 }) })
  .chain(({ s, t }) =>
    fc.array(fc.boolean(), { minLength: s * t, maxLength: s * t }).map((bits): PatternGraph => {
      const edges: [number, number][] = [];
      bits.forEach((b, i) => {
        if (b) edges.push([Math.floor(i / t), i % t]);
      });
      return { sCount: s, tCount: t, edges };
    }),
  );

/** hom(F, G) by trying every side-keeping map (S-nodes to rows, T-nodes to columns). */
function bruteHom(p: PatternGraph, m: number[][], cols: number): number {
  const rows = m.length;
  let count = 0;
  const phi = new Array<number>(p.sCount + p.tCount).fill(0);
  const go = (i: number) => {
    if (i === phi.length) {
      if (p.edges.every(([a, x]) => m[phi[a]!]![phi[p.sCount + x]!] === 1)) count++;
      return;
    }
    const n = i < p.sCount ? rows : cols;
    for (let v = 0; v < n; v++) {
      phi[i] = v;
      go(i + 1);
    }
  };
  go(0);
  return count;
}

describe('building blocks of the quotient method', () => {
  it('homomorphism counts equal brute-force enumeration of all maps', () => {
    const connected = pattern.filter((p) => {
      const seen = new Set<number>([0]);
      for (let grew = true; grew; ) {
        grew = false;
        for (const [a, x] of p.edges) {
          const u = a;
          const v = p.sCount + x;
          if (seen.has(u) !== seen.has(v)) {
            seen.add(u);
            seen.add(v);
            grew = true;
          }
        }
      }
      return seen.size === p.sCount + p.tCount;
    });
    fc.assert(
      fc.property(connected, smallMatrix(4, 4), ({ sCount, tCount, edges }, { m, cols }) => {
        const p = { sCount: Math.min(sCount, 3), tCount: Math.min(tCount, 3), edges: edges.filter(([a, x]) => a < 3 && x < 3) };
        const target = homTarget(sidedGraph(tannerGraph(fromDense(m, cols)), true));
        const plan = planHomomorphism(p, target.s, target.t, tableAvailability(target));
        expect(homomorphismCount(target, plan)).toBe(BigInt(bruteHom(p, m, cols)));
      }),
      { numRuns: 150 },
    );
  });

  it('stars past 2^53: exact last sum (Σ_x e_x^6) and the modular path (Σ_x e_x^7)', () => {
    const k = zeros(300, 20);
    for (let i = 0; i < 300; i++) for (let j = 0; j < 20; j++) setBit(k, i, j, 1);
    const target = homTarget(sidedGraph(tannerGraph(k), true));
    for (const leaves of [6, 7]) {
      const star: PatternGraph = { sCount: leaves, tCount: 1, edges: Array.from({ length: leaves }, (_, i) => [i, 0] as const) };
      const plan = planHomomorphism(star, target.s, target.t, tableAvailability(target));
      expect(homomorphismCount(target, plan)).toBe(20n * 300n ** BigInt(leaves));
    }
  });

  it('set partitions: Bell numbers; Möbius values sum to 0 for n ≥ 2', () => {
    // common practice: Bell numbers 1, 1, 2, 5, 15, 52, 203; Σ_π μ(0̂, π) = 0 over a lattice with 0̂ ≠ 1̂
    expect([0, 1, 2, 3, 4, 5, 6].map((n) => setPartitions(n).length)).toEqual([1, 1, 2, 5, 15, 52, 203]);
    for (let n = 2; n <= 6; n++) expect(setPartitions(n).reduce((a, p) => a + partitionMobius(p), 0)).toBe(0);
    // common practice: μ(0̂, 1̂) = (−1)^(n−1)·(n−1)!
    expect(partitionMobius(Int8Array.from([0, 0, 0, 0]))).toBe(-6);
  });

  it('canonical keys: equal exactly for side-keeping isomorphic patterns', () => {
    fc.assert(
      fc.property(pattern, pattern, fc.nat(), fc.nat(), (a, b, i, j) => {
        const ps = permutations(a.sCount)[i % permutations(a.sCount).length]!;
        const pt = permutations(a.tCount)[j % permutations(a.tCount).length]!;
        const relabeled: PatternGraph = { ...a, edges: a.edges.map(([x, y]) => [ps[x]!, pt[y]!] as const) };
        expect(canonicalPattern(relabeled).key).toBe(canonicalPattern(a).key);
        expect(canonicalPattern(a).key === canonicalPattern(b).key).toBe(isomorphic(a, b));
      }),
      { numRuns: 200 },
    );
  });

  it('Chinese remainder reconstruction and prime counts', () => {
    fc.assert(
      fc.property(fc.bigInt({ min: 0n, max: 2n ** 120n }), (x) => {
        const k = primesForBound(Number(x) + 1);
        const residues = Array.from({ length: k }, (_, i) => Number(x % BigInt(modulusPrime(i))));
        expect(chineseRemainder(residues)).toBe(x);
      }),
    );
  });

  it('WideSum adds and multiplies exactly past 2^53', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.integer({ min: -(2 ** 31), max: 2 ** 31 }), fc.maxSafeInteger(), fc.integer({ min: -1000, max: 1000 }))), (terms) => {
        const w = new WideSum();
        let want = 0n;
        for (const [a, b, c] of terms) {
          w.addProduct(a, b);
          w.add(b);
          w.addProduct3(a, c, b);
          want += BigInt(a) * BigInt(b) + BigInt(b) + BigInt(a) * BigInt(c) * BigInt(b);
        }
        expect(w.value()).toBe(want);
      }),
    );
    expect(countToJson(2n ** 53n - 1n)).toBe(2 ** 53 - 1);
    expect(countToJson(2n ** 53n)).toBe('9007199254740992');
  });
});

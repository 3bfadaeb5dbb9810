import { canonicalPattern, type PatternGraph } from './canonical.js';
import { blockCount, partitionMobius, setPartitions } from './partitions.js';

/**
 * The cycle C_2k as a pattern has S-nodes S_0..S_{k−1} and T-nodes T_0..T_{k−1}, with T_i joined to S_i
 * and S_{i+1 mod k}. Its homomorphic images that keep the sides apart are the quotients C_2k/(ρ, σ) for a
 * partition ρ of the S-nodes and σ of the T-nodes (merging nodes of opposite sides would make an odd
 * closed walk, impossible in a bipartite target, and merging neighbours a loop). By Möbius inversion on
 * the partition lattice (Lovász, "Operations with structures", Acta Math. Hungarica 18, 1967; used for
 * subgraph counting by Curticapean, Dell and Marx, "Homomorphisms are a good basis for counting small
 * subgraphs", STOC 2017), the number of injective side-keeping maps C_2k → G is
 *     Σ_(ρ,σ) μ(ρ) μ(σ) hom(C_2k/(ρ,σ), G),
 * and each 2k-cycle of G is the image of exactly 2k of them (k rotations, k reflections keeping sides).
 * This module lists the distinct quotients (up to side-keeping isomorphism, parallel edges merged since
 * the target is simple) with their summed coefficients, dropping those whose coefficients cancel.
 */
export interface WeightedPattern {
  readonly key: string;
  readonly pattern: PatternGraph;
  readonly coefficient: number;
}

const cache = new Map<number, WeightedPattern[]>();

export function cycleQuotients(k: number): WeightedPattern[] {
  const hit = cache.get(k);
  if (hit) return hit;
  const parts = setPartitions(k);
  const mus = parts.map(partitionMobius);
  const byKey = new Map<string, { pattern: PatternGraph; coefficient: number }>();
  for (let i = 0; i < parts.length; i++) {
    const rho = parts[i]!;
    for (let j = 0; j < parts.length; j++) {
      const sigma = parts[j]!;
      const seen = new Set<number>();
      const edges: [number, number][] = [];
      for (let p = 0; p < k; p++) {
        for (const a of [rho[p]!, rho[(p + 1) % k]!]) {
          const id = a * 64 + sigma[p]!;
          if (!seen.has(id)) {
            seen.add(id);
            edges.push([a, sigma[p]!]);
          }
        }
      }
      const { key, pattern } = canonicalPattern({ sCount: blockCount(rho), tCount: blockCount(sigma), edges });
      const entry = byKey.get(key);
      if (entry) entry.coefficient += mus[i]! * mus[j]!;
      else byKey.set(key, { pattern, coefficient: mus[i]! * mus[j]! });
    }
  }
  const out: WeightedPattern[] = [];
  for (const [key, v] of byKey) if (v.coefficient !== 0) out.push({ key, pattern: v.pattern, coefficient: v.coefficient });
  out.sort((a, b) => (a.key < b.key ? -1 : a.key > b.key ? 1 : 0));
  cache.set(k, out);
  return out;
}

import { describe, expect, it } from 'vitest';
import { hypergeometric, leeBrickellSuccess, segmentMissProbability } from '../../src/search/probability.js';
import { streamRng } from '../../src/parallel/seeds.js';

describe('information-set success and miss probabilities', () => {
  it('a single information set misses a word exactly when Lee–Brickell fails', () => {
    for (const [n, k, w, p] of [[23, 12, 7, 2], [48, 21, 12, 2], [144, 66, 12, 1]] as const) {
      expect(segmentMissProbability(n, k, w, p, 1)).toBeCloseTo(1 - leeBrickellSuccess(n, k, w, p), 12);
    }
    // the hypergeometric law sums to one
    let t = 0;
    for (let i = 0; i <= 7; i++) t += hypergeometric(23, 12, 7, i);
    expect(t).toBeCloseTo(1, 12);
  });

  it('the swap chain analysis matches a simulation of random column swaps (brute force)', () => {
    const [n, k, w, p, visits] = [30, 12, 6, 1, 8];
    const rng = streamRng('chain', 0);
    const runs = 40000;
    let missed = 0;
    const inSet = new Uint8Array(n);
    for (let r = 0; r < runs; r++) {
      // a uniform k-subset, the word on columns 0..w-1
      inSet.fill(0);
      let placed = 0;
      while (placed < k) {
        const c = rng.below(n);
        if (!inSet[c]) { inSet[c] = 1; placed++; }
      }
      let hit = false;
      for (let v = 0; v < visits && !hit; v++) {
        if (v > 0) {
          // swap a uniform member out for a uniform non-member
          let out = rng.below(n);
          while (!inSet[out]) out = rng.below(n);
          let inn = rng.below(n);
          while (inSet[inn]) inn = rng.below(n);
          inSet[out] = 0;
          inSet[inn] = 1;
        }
        let onWord = 0;
        for (let c = 0; c < w; c++) onWord += inSet[c]!;
        if (onWord <= p) hit = true;
      }
      if (!hit) missed++;
    }
    const est = missed / runs;
    const exact = segmentMissProbability(n, k, w, p, visits);
    const sd = Math.sqrt((exact * (1 - exact)) / runs);
    expect(Math.abs(est - exact)).toBeLessThan(5 * sd);
  });
});

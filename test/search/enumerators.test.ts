import { describe, expect, it } from 'vitest';
import { buildFamily } from '../../src/codes/families/index.js';
import { type BitMatrix, hstack, zeros } from '../../src/gf2/index.js';
import { openPool } from '../../src/parallel/pool.js';
import { runSearch } from '../../src/search/run.js';

function generatorOf(spec: string): BitMatrix {
  const b = buildFamily(spec);
  if (b.kind !== 'classical' || !b.generator) throw new Error('expected a cyclic code');
  return b.generator;
}

/** Extend a generator by an overall parity column. */
function extend(g: BitMatrix): BitMatrix {
  const parity = zeros(g.rows, 1);
  for (let r = 0; r < g.rows; r++) {
    let p = 0;
    for (let x = 0; x < g.stride; x++) { let v = g.data[r * g.stride + x]!; while (v) { v &= v - 1; p ^= 1; } }
    if (p) parity.data[r] = 1;
  }
  return hstack(g, parity);
}

async function spectrum(h: BitMatrix, W: number, method: 'exhaustive' | 'isd', extra: Partial<Parameters<typeof runSearch>[1]> = {}) {
  const pool = await openPool(0);
  return runSearch({ side: 'h', h }, { maxWeight: W, method, seed: 1, maxWords: 1e6, ...extra }, { pool });
}

describe('weight enumerators of classical codes (search of a generator matrix row space)', () => {
  it('[7,4] Hamming: 1 + 7z³ + 7z⁴ + z⁷', async () => {
    // source: MacWilliams & Sloane, The Theory of Error-Correcting Codes (1977), Hamming code weight enumerator
    const r = await spectrum(generatorOf('cyclic:n=7,g=1+x+x^3'), 7, 'exhaustive');
    expect(r.counts).toEqual({ 1: 0, 2: 0, 3: 7, 4: 7, 5: 0, 6: 0, 7: 1 });
    expect(r.complete).toBe(true);
    expect(Object.values(r.missProbability).every((p) => p === 0)).toBe(true);
  });

  it('binary Golay [23,12]: A7 = 253, A8 = 506, A11 = A12 = 1288', async () => {
    const r = await spectrum(generatorOf('cyclic:n=23,g=x^11+x^10+x^6+x^5+x^4+x^2+1'), 12, 'exhaustive');
    // source: MacWilliams & Sloane, The Theory of Error-Correcting Codes (1977), Golay code weight distribution
    expect([r.counts[7], r.counts[8], r.counts[11], r.counts[12]]).toEqual([253, 506, 1288, 1288]);
    for (const w of [1, 2, 3, 4, 5, 6, 9, 10]) expect(r.counts[w]).toBe(0);
  });

  it('extended Golay [24,12]: A8 = 759, A12 = 2576', async () => {
    const r = await spectrum(extend(generatorOf('cyclic:n=23,g=x^11+x^10+x^6+x^5+x^4+x^2+1')), 12, 'exhaustive');
    // source: MacWilliams & Sloane, The Theory of Error-Correcting Codes (1977), extended Golay code
    expect([r.counts[8], r.counts[12]]).toEqual([759, 2576]);
    expect(r.wordCount).toBe(759 + 2576);
  });

  it('information-set search finds the Golay weight-7 and weight-8 words with a tiny miss probability', async () => {
    const r = await spectrum(generatorOf('cyclic:n=23,g=x^11+x^10+x^6+x^5+x^4+x^2+1'), 8, 'isd', { targetMiss: 1e-9 });
    expect(r.method).toBe('isd');
    expect(r.missProbability[8]!).toBeLessThan(1e-9);
    // source: MacWilliams & Sloane (1977): A7 = 253, A8 = 506
    expect([r.counts[7], r.counts[8]]).toEqual([253, 506]);
  });
});


describe('each information-set variant on the Golay code', () => {
  it('Lee–Brickell p=1, p=2 (fresh and with swaps) and Stern p=1, p=2 find only code words, and all weight-7 words', async () => {
    const { isdChunk } = await import('../../src/search/isd.js');
    const { rowBasis, packedSupport, RowSpaceSolver } = await import('../../src/gf2/index.js');
    const g = generatorOf('cyclic:n=23,g=x^11+x^10+x^6+x^5+x^4+x^2+1');
    const b = rowBasis(g);
    const solver = new RowSpaceSolver(g);
    const variants = [
      { variant: 'lee-brickell', p: 1, window: 0, segment: 1 },
      { variant: 'lee-brickell', p: 2, window: 0, segment: 1 },
      { variant: 'lee-brickell', p: 2, window: 0, segment: 10 },
      { variant: 'stern', p: 1, window: 3, segment: 1 },
      { variant: 'stern', p: 2, window: 4, segment: 1 },
    ] as const;
    for (const settings of variants) {
      const r = isdChunk({ rows: b.rank, cols: 23, generator: b.reduced.data, maxWeight: 8, settings, seed: 3, stream: 0, iterations: 3000, maxWords: 1e5 });
      let w7 = 0;
      for (let i = 0; i < r.count; i++) {
        const v = r.words.subarray(i, i + 1);
        expect(solver.contains(v)).toBe(true);
        const w = packedSupport(v, 0, 1).length;
        expect(w === 7 || w === 8).toBe(true);
        if (w === 7) w7++;
      }
      // source: MacWilliams & Sloane (1977): the [23,12] Golay code has 253 words of weight 7
      expect(w7).toBe(253);
    }
  });
});

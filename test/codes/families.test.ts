import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { buildFamily, hypergraphProduct } from '../../src/codes/families/index.js';
import { cssCode, summarizeCode } from '../../src/codes/css.js';
import { logicalBasis } from '../../src/codes/logicals.js';
import { fromDense, identity, multiplyTransposed, rank, equals, RowSpaceSolver, isZero, zeros } from '../../src/gf2/index.js';
import { InputError } from '../../src/errors.js';

function nk(spec: string): [number, number] {
  const b = buildFamily(spec);
  if (b.kind !== 'css') throw new Error('expected css');
  const s = summarizeCode(b.code);
  expect(s.commute).toBe(true);
  return [s.n, s.k];
}

const HAMMING_7_4 = '(cyclic:n=7,g=1+x+x^3)';

describe('family parameters against published values', () => {
  it('generalized bicycle codes', () => {
    // source: Panteleev & Kalachev, "Degenerate quantum LDPC codes with good finite length performance", Quantum 5, 585 (2021)
    expect(nk('gb:l=24,a=1+x^2+x^8+x^15,b=1+x^2+x^12+x^17')).toEqual([48, 6]);
    // source: Panteleev & Kalachev, Quantum 5, 585 (2021)
    expect(nk('gb:l=23,a=1+x^5+x^8+x^12,b=1+x+x^5+x^7')).toEqual([46, 2]);
  });

  it('bivariate bicycle codes', () => {
    // source: Bravyi et al., "High-threshold and low-overhead fault-tolerant quantum memory", Nature 627, 778 (2024)
    expect(nk('bb:l=6,m=6,A=x^3+y+y^2,B=y^3+x+x^2')).toEqual([72, 12]);
    expect(nk('bb:l=15,m=3,A=x^9+y+y^2,B=1+x^2+x^7')).toEqual([90, 8]); // source: Bravyi et al., Nature 627, 778 (2024)
    expect(nk('bb:l=9,m=6,A=x^3+y+y^2,B=y^3+x+x^2')).toEqual([108, 8]); // source: Bravyi et al., Nature 627, 778 (2024)
    expect(nk('bb:l=12,m=6,A=x^3+y+y^2,B=y^3+x+x^2')).toEqual([144, 12]); // source: Bravyi et al., Nature 627, 778 (2024)
    expect(nk('bb:l=12,m=12,A=x^3+y^2+y^7,B=y^3+x+x^2')).toEqual([288, 12]); // source: Bravyi et al., Nature 627, 778 (2024)
  });

  it('toric, rotated surface and hypergraph products', () => {
    for (const L of [2, 3, 4, 5, 7]) expect(nk(`toric:L=${L}`)).toEqual([2 * L * L, 2]); // common practice: toric [[2L², 2, L]]
    for (const d of [2, 3, 5, 7]) expect(nk(`surface:d=${d}`)).toEqual([d * d, 1]); // common practice: rotated surface [[d², 1, d]]
    // common practice (Tillich & Zémor, hypergraph product): [7,4] Hamming with itself gives [[49+9, 16]]
    expect(nk(`hgp:h1=${HAMMING_7_4},h2=${HAMMING_7_4}`)).toEqual([58, 16]);
  });

  it('classical cyclic codes', () => {
    const golay = buildFamily('cyclic:n=23,g=x^11+x^10+x^6+x^5+x^4+x^2+1');
    if (golay.kind !== 'classical') throw new Error('expected classical');
    // source: MacWilliams & Sloane, The Theory of Error-Correcting Codes (1977): binary Golay [23,12]
    expect(golay.h.cols - rank(golay.h)).toBe(12);
    expect(rank(golay.generator!)).toBe(12);
    expect(isZero(multiplyTransposed(golay.h, golay.generator!))).toBe(true);
    const ham = buildFamily('cyclic:n=7,g=1+x+x^3');
    if (ham.kind !== 'classical') throw new Error('expected classical');
    expect(ham.h.cols - rank(ham.h)).toBe(4); // common practice: [7,4] Hamming
  });

  it('the 2,500-qubit hypergraph product of a random (3,4)-regular code builds from a spec', () => {
    const r = buildFamily('regular:n=40,col=3,row=4,seed=1');
    if (r.kind !== 'classical') throw new Error('expected classical');
    expect(r.h.rows).toBe(30);
    const rw = new Set<number>();
    for (let i = 0; i < r.h.rows; i++) rw.add(r.h.data.subarray(i * r.h.stride, (i + 1) * r.h.stride).reduce((a, x) => a + popc(x), 0));
    expect([...rw]).toEqual([4]);
    const [n] = nk('hgp:h1=(regular:n=40,col=3,row=4,seed=1),h2=(regular:n=40,col=3,row=4,seed=1)');
    expect(n).toBe(2500);
    // same seed, same matrix; another seed, another matrix
    const again = buildFamily('regular:n=40,col=3,row=4,seed=1');
    const other = buildFamily('regular:n=40,col=3,row=4,seed=2');
    expect(again.kind === 'classical' && equals(again.h, r.h)).toBe(true);
    expect(other.kind === 'classical' && equals(other.h, r.h)).toBe(false);
  });
});

function popc(x: number): number {
  let c = 0;
  while (x) { x &= x - 1; c++; }
  return c;
}

describe('spec syntax errors name the position and what was expected', () => {
  const cases: [string, RegExp][] = [
    ['gb:l=24,a=1+x^^2,b=1', /position 15: expected a whole-number exponent/],
    ['gb:l=24,a=1+x^2,b=1+z', /position 21: expected a term/],
    ['gb:l=x,a=1,b=1', /position 6: expected a whole number for l/],
    ['bb:l=6,m=6,A=x^3+y', /expected parameter B=/],
    ['toric:L=5,q=1', /unknown parameter "q"/],
    ['nope:x=1', /unknown family "nope"/],
    ['hgp:h1=(cyclic:n=7,g=1+x+x^3', /expected "\)"/],
    ['cyclic:n=8,g=1+x+x^3', /does not divide/],
    ['gb:l=24,a=1+x^2 x,b=1', /expected "\+" or the end/],
  ];
  for (const [spec, re] of cases) {
    it(spec, () => {
      expect(() => buildFamily(spec)).toThrow(InputError);
      expect(() => buildFamily(spec)).toThrow(re);
    });
  }
});

describe('CSS model', () => {
  it('names an anticommuting pair and its overlap', () => {
    const hx = fromDense([[1, 1, 0, 0], [0, 0, 1, 1]]);
    const hz = fromDense([[1, 1, 1, 1], [0, 1, 1, 0]]);
    expect(() => cssCode(hx, hz)).toThrow(/HX row 0 and HZ row 1 overlap on 1 qubit\(s\) \[1\]/);
    expect(() => cssCode(hx, fromDense([[1, 1, 0]]))).toThrow(/columns/);
  });

  /** Random CSS codes: hypergraph products of random small matrices. */
  const smallMatrix = fc.record({ r: fc.integer({ min: 1, max: 4 }), c: fc.integer({ min: 2, max: 5 }) }).chain(({ r, c }) =>
    fc.array(fc.array(fc.integer({ min: 0, max: 1 }), { minLength: c, maxLength: c }), { minLength: r, maxLength: r }).map((d) => fromDense(d, c)));

  it('logical bases: LX·LZᵀ = I, LX ⊂ ker HZ \\ rowspace HX, LZ ⊂ ker HX \\ rowspace HZ, k = n − rank HX − rank HZ', () => {
    fc.assert(fc.property(smallMatrix, smallMatrix, (h1, h2) => {
      const code = hypergraphProduct(h1, h2);
      const { lx, lz, k } = logicalBasis(code);
      expect(k).toBe(code.n - rank(code.hx) - rank(code.hz));
      // Künneth formula for hypergraph products (common practice): k = k1·k2 + k1ᵀ·k2ᵀ
      const k1 = h1.cols - rank(h1), k2 = h2.cols - rank(h2), k1t = h1.rows - rank(h1), k2t = h2.rows - rank(h2);
      expect(k).toBe(k1 * k2 + k1t * k2t);
      expect(lx.rows).toBe(k);
      expect(lz.rows).toBe(k);
      if (k === 0) return;
      expect(equals(multiplyTransposed(lx, lz), identity(k))).toBe(true);
      expect(isZero(multiplyTransposed(code.hz, lx))).toBe(true);
      expect(isZero(multiplyTransposed(code.hx, lz))).toBe(true);
      const sx = new RowSpaceSolver(code.hx);
      const sz = new RowSpaceSolver(code.hz);
      for (let i = 0; i < k; i++) {
        expect(sx.contains(lx.data.subarray(i * lx.stride, (i + 1) * lx.stride))).toBe(false);
        expect(sz.contains(lz.data.subarray(i * lz.stride, (i + 1) * lz.stride))).toBe(false);
      }
      // independence modulo stabilizers: rank [HX; LX] = rank HX + k
      const stacked = zeros(code.hx.rows + k, code.n);
      stacked.data.set(code.hx.data);
      stacked.data.set(lx.data, code.hx.data.length);
      expect(rank(stacked)).toBe(rank(code.hx) + k);
    }), { numRuns: 60 });
  });
});

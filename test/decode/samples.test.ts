import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { errorSamples, FixedWeightErrors, sampleChannel, sampleFixedWeight } from '../../src/decode/error-samples.js';
import { deriveSyndrome, syndromeMap } from '../../src/decode/syndrome-map.js';
import { InputError } from '../../src/errors.js';
import { fromRowVectors, rowVector, vstack } from '../../src/gf2/bitmatrix.js';
import { packedDot } from '../../src/gf2/popcount.js';
import { buildFamily } from '../../src/codes/families/index.js';
import { streamRng } from '../../src/parallel/seeds.js';

function pauliAt(s: ReturnType<typeof errorSamples>, shot: number, j: number): number {
  const w = shot * s.stride + (j >>> 5);
  const x = (s.ex[w]! >>> (j & 31)) & 1;
  const z = (s.ez[w]! >>> (j & 31)) & 1;
  return x | (z << 1); // 0 I, 1 X, 3 Y, 2 Z
}

describe('error sampling', () => {
  it('depolarizing: X, Y, Z each with probability p/3', () => {
    const n = 100;
    const shots = 2000;
    const p = 0.3;
    const s = errorSamples(n, shots);
    sampleChannel({ model: 'depolarizing', p }, streamRng('dep', 0), s, shots);
    const count = [0, 0, 0, 0];
    for (let k = 0; k < shots; k++) for (let j = 0; j < n; j++) count[pauliAt(s, k, j)]!++;
    const total = n * shots;
    for (const kind of [1, 2, 3]) {
      const sd = Math.sqrt((total * (p / 3) * (1 - p / 3)));
      expect(Math.abs(count[kind]! - (total * p) / 3)).toBeLessThan(5 * sd);
    }
  });

  it('independent: X and Z flips each with probability p, Y with p²', () => {
    const n = 100;
    const shots = 2000;
    const p = 0.2;
    const s = errorSamples(n, shots);
    sampleChannel({ model: 'independent', p }, streamRng('ind', 0), s, shots);
    const count = [0, 0, 0, 0];
    for (let k = 0; k < shots; k++) for (let j = 0; j < n; j++) count[pauliAt(s, k, j)]!++;
    const total = n * shots;
    const expectY = total * p * p;
    const expectX = total * p * (1 - p);
    expect(Math.abs(count[3]! - expectY)).toBeLessThan(5 * Math.sqrt(expectY));
    expect(Math.abs(count[1]! - expectX)).toBeLessThan(5 * Math.sqrt(expectX));
    expect(Math.abs(count[2]! - expectX)).toBeLessThan(5 * Math.sqrt(expectX));
  });

  it('a stream always gives the same errors', () => {
    const a = errorSamples(37, 50);
    const b = errorSamples(37, 50);
    sampleChannel({ model: 'depolarizing', p: 0.1 }, streamRng(5, 3), a, 50);
    sampleChannel({ model: 'depolarizing', p: 0.1 }, streamRng(5, 3), b, 50);
    expect([...a.ex]).toEqual([...b.ex]);
    expect([...a.ez]).toEqual([...b.ez]);
  });

  it('random fixed-weight errors have exactly that weight', () => {
    for (const model of ['depolarizing', 'independent'] as const) {
      const n = 40;
      const s = errorSamples(n, 300);
      const perm = Int32Array.from({ length: n }, (_, i) => i);
      sampleFixedWeight(model, 5, streamRng('fw', 1), perm, s, 300);
      for (let k = 0; k < 300; k++) {
        const kinds = Array.from({ length: n }, (_, j) => pauliAt(s, k, j)).filter((x) => x !== 0);
        expect(kinds.length).toBe(5);
        if (model === 'independent') expect(new Set(kinds).size).toBe(1);
      }
    }
  });
});

describe('exhaustive fixed-weight enumeration', () => {
  // oracle: all Paulis of weight t on n qubits by brute force over 4^n, as strings over I X Y Z
  function bruteForce(n: number, t: number, model: 'depolarizing' | 'independent'): Set<string> {
    const out = new Set<string>();
    for (let idx = 0; idx < 4 ** n; idx++) {
      const w = Array.from({ length: n }, (_, j) => 'IXYZ'[(idx >>> (2 * j)) & 3]!);
      const support = w.filter((x) => x !== 'I');
      if (support.length !== t) continue;
      if (model === 'independent' && !(support.every((x) => x === 'X') || support.every((x) => x === 'Z'))) continue;
      out.add(w.join(''));
    }
    return out;
  }
  const letters = (s: ReturnType<typeof errorSamples>, shot: number, n: number) => Array.from({ length: n }, (_, j) => 'IXZY'[pauliAt(s, shot, j)]!).join('');

  for (const model of ['depolarizing', 'independent'] as const) {
    for (const [n, t] of [[5, 1], [6, 2], [6, 3], [7, 2]] as const) {
      it(`${model}, n=${n}, t=${t}: every error once`, () => {
        const e = new FixedWeightErrors(model, n, t);
        const want = bruteForce(n, t, model);
        expect(e.total).toBe(want.size);
        // two uneven batches, to exercise the offset
        const first = Math.floor(e.total / 3);
        const a = errorSamples(n, first);
        const b = errorSamples(n, e.total - first);
        e.fill(0, first, a);
        e.fill(first, e.total - first, b);
        const got: string[] = [];
        for (let k = 0; k < first; k++) got.push(letters(a, k, n));
        for (let k = 0; k < e.total - first; k++) got.push(letters(b, k, n));
        expect(new Set(got).size).toBe(got.length);
        expect(new Set(got)).toEqual(want);
      });
    }
  }
});

describe('syndrome map', () => {
  const built = buildFamily('toric:L=3');
  if (built.kind !== 'css') throw new Error('css');
  const { hx } = built.code;

  it('derived syndrome bits equal D·e for D = H plus sums of rows', () => {
    fc.assert(
      fc.property(fc.array(fc.array(fc.nat(hx.rows - 1), { minLength: 1, maxLength: 4 }), { minLength: 1, maxLength: 6 }), fc.array(fc.nat(hx.cols - 1), { maxLength: 8 }), (sums, err) => {
        const extra = sums.map((rows) => {
          const v = new Uint32Array(hx.stride);
          for (const r of rows) for (let w = 0; w < hx.stride; w++) v[w] = v[w]! ^ hx.data[r * hx.stride + w]!;
          return v;
        });
        const d = vstack(hx, fromRowVectors(hx.cols, extra));
        const map = syndromeMap(hx, d, 'test', 'HX');
        const e = new Uint32Array(hx.stride);
        for (const j of err) e[j >>> 5] = e[j >>> 5]! ^ (1 << (j & 31));
        const measured = Uint8Array.from({ length: hx.rows }, (_, r) => packedDot(hx.data, r * hx.stride, e, 0, hx.stride));
        const derived = new Uint8Array(d.rows);
        deriveSyndrome(map, measured, 0, derived, 0);
        for (let r = 0; r < d.rows; r++) expect(derived[r]).toBe(packedDot(d.data, r * d.stride, e, 0, d.stride));
      }),
      { numRuns: 60 },
    );
  });

  it('names the first row outside the row space', () => {
    const bad = rowVector(hx, 0);
    bad[0] = bad[0]! ^ 1; // flip qubit 0: odd overlap with some Z check, so not a stabilizer
    const d = vstack(hx, fromRowVectors(hx.cols, [rowVector(hx, 1), bad]));
    expect(() => syndromeMap(hx, d, 'm.mtx', 'HX')).toThrow(InputError);
    expect(() => syndromeMap(hx, d, 'm.mtx', 'HX')).toThrow(/m\.mtx: row 10 .*not in the row space of HX/);
  });
});

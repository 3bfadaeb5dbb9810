import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { parsePolynomial } from '../../src/codes/polynomial.js';
import { parseSpec } from '../../src/codes/spec.js';
import { InputError } from '../../src/errors.js';

const monomials = fc.uniqueArray(fc.record({ x: fc.integer({ min: 0, max: 40 }), y: fc.integer({ min: 0, max: 40 }) }), {
  selector: (m) => `${m.x},${m.y}`, minLength: 1, maxLength: 8,
});

function show(m: { x: number; y: number }, style: number): string {
  const f = (v: string, e: number) => (e === 0 ? '' : e === 1 && style % 2 ? v : `${v}^${e}`);
  const parts = [f('x', m.x), f('y', m.y)].filter(Boolean);
  return parts.length === 0 ? '1' : parts.join(style > 1 ? '*' : '');
}

describe('polynomial and spec parsers (property tests)', () => {
  it('printing then parsing a polynomial gives back its monomials', () => {
    fc.assert(fc.property(monomials, fc.integer({ min: 0, max: 3 }), fc.boolean(), (ms, style, spaces) => {
      const text = ms.map((m) => show(m, style)).join(spaces ? ' + ' : '+');
      const back = parsePolynomial(text, 'xy');
      const sorted = [...ms].sort((a, b) => a.x - b.x || a.y - b.y);
      expect(back).toEqual(sorted);
    }));
  });

  it('repeated monomials cancel over GF(2)', () => {
    expect(parsePolynomial('1+x+x+x^2', 'x')).toEqual([{ x: 0, y: 0 }, { x: 2, y: 0 }]);
  });

  it('arbitrary text either parses or raises an InputError naming a position', () => {
    fc.assert(fc.property(fc.string({ maxLength: 30 }), (s) => {
      try {
        parsePolynomial(s, 'xy');
      } catch (e) {
        expect(e).toBeInstanceOf(InputError);
        expect((e as Error).message).toMatch(/position \d+: /);
      }
      try {
        parseSpec(s);
      } catch (e) {
        expect(e).toBeInstanceOf(InputError);
        expect((e as Error).message).toMatch(/position \d+: /);
      }
    }), { numRuns: 500 });
  });

  it('nested specs keep their parentheses as one value', () => {
    const s = parseSpec('hgp:h1=(regular:n=40,col=3,row=4,seed=1),h2=(cyclic:n=7,g=1+x+x^3)');
    expect(s.family).toBe('hgp');
    expect(s.params.get('h1')!.value).toBe('(regular:n=40,col=3,row=4,seed=1)');
    expect(s.params.get('h2')!.value).toBe('(cyclic:n=7,g=1+x+x^3)');
  });
});

import { SpecError } from './spec.js';

/** A monomial x^i y^j. */
export interface Monomial {
  x: number;
  y: number;
}

/**
 * Parse a sum of monomials over GF(2) in the given variables, e.g. `1+x^2+x^8`, `x^3+y+y^2`, `x*y^2`, `x2y`
 * is not accepted (write x^2y or x^2*y). Repeated monomials cancel (characteristic 2).
 * `text`/`base` locate the polynomial inside the whole spec for error messages.
 */
export function parsePolynomial(poly: string, vars: 'x' | 'xy', text = poly, base = 0): Monomial[] {
  let i = 0;
  const err = (expected: string): never => {
    throw new SpecError(text, base + i, expected);
  };
  const skip = () => {
    while (i < poly.length && poly[i] === ' ') i++;
  };
  const exponent = (): number => {
    if (poly[i] !== '^') return 1;
    i++;
    skip();
    const s = i;
    while (i < poly.length && /[0-9]/.test(poly[i]!)) i++;
    if (s === i) err("expected a whole-number exponent after '^'");
    return Number(poly.slice(s, i));
  };
  const terms = new Map<string, Monomial>();
  for (;;) {
    skip();
    const mono: Monomial = { x: 0, y: 0 };
    if (poly[i] === '1' && !/[0-9]/.test(poly[i + 1] ?? '')) {
      i++;
    } else {
      let factors = 0;
      for (;;) {
        skip();
        const v = poly[i];
        if (v === 'x' || (v === 'y' && vars === 'xy')) {
          i++;
          const e = exponent();
          if (v === 'x') mono.x += e;
          else mono.y += e;
          factors++;
          if (poly[i] === 'x' || poly[i] === 'y') continue; // juxtaposed product such as x^2y
          skip();
          if (poly[i] === '*') {
            i++;
            continue;
          }
          break;
        }
        err(factors === 0 ? `expected a term: 1 or ${vars === 'x' ? 'x^e' : 'x^i, y^j or a product of them'}` : 'expected a variable after "*"');
      }
    }
    const key = `${mono.x},${mono.y}`;
    if (terms.has(key)) terms.delete(key);
    else terms.set(key, mono);
    skip();
    if (i >= poly.length) break;
    if (poly[i] !== '+') err(`expected "+" or the end of the polynomial, found "${poly[i]}"`);
    i++;
  }
  return [...terms.values()].sort((a, b) => a.x - b.x || a.y - b.y);
}

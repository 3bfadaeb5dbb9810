import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { countText, decadeLabel, probabilityText, scientific, superscript } from '../../src/report/format.js';
import { decade, linearScale, linearTicks, logScale, logTicks, niceDomain, niceLinearScale, padLogDomain, project } from '../../src/report/scale.js';
import { scaleTicks } from '../../src/report/svg.js';

/** Is s = m·10^k with m ∈ {1, 2, 5}? */
function isOneTwoFive(s: number): boolean {
  const k = Math.floor(Math.log10(s) + 1e-9);
  const m = s / 10 ** k;
  return [1, 2, 5, 10].some((x) => Math.abs(m - x) < 1e-6);
}

describe('linear ticks', () => {
  // common practice ("nice numbers" for axis labels: steps of 1, 2 or 5 times a power of ten)
  it('0..1072 gets steps of 200', () => {
    expect(linearTicks(0, 1072)).toEqual({ step: 200, ticks: [0, 200, 400, 600, 800, 1000] });
  });

  it('decimal steps carry no floating-point noise', () => {
    expect(linearTicks(0, 0.3).ticks).toEqual([0, 0.05, 0.1, 0.15, 0.2, 0.25, 0.3]);
    expect(linearTicks(0.1, 0.7).ticks).toEqual([0.1, 0.2, 0.3, 0.4, 0.5, 0.6, 0.7]);
  });

  it('niceDomain widens to whole steps', () => {
    expect(niceDomain(0, 24)).toEqual([0, 25]);
    expect(niceDomain(0, 0)).toEqual([0, 1]);
    expect(niceDomain(3, 3)[0]).toBeLessThan(3);
  });

  it('the ticks of a nice linear scale start and end on its ends', () => {
    expect(niceDomain(0, 10388, 4)).toEqual([0, 12000]);
    expect(scaleTicks(niceLinearScale(0, 10388, [0, 1], 4)).map((t) => t.value)).toEqual([0, 2000, 4000, 6000, 8000, 10000, 12000]);
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: 1e-3, max: 1e6, noNaN: true }), fc.integer({ min: 3, max: 8 }), (lo, width, target) => {
        const hi = lo + width;
        fc.pre(width > 1e-6 * Math.max(1, Math.abs(lo))); // ranges well above double resolution
        const s = niceLinearScale(lo, hi, [0, 1], target);
        const [a, b] = s.domain;
        // ends within rounding (1e-9 of the width) of the range
        expect(a).toBeLessThanOrEqual(lo + width * 1e-9);
        expect(b).toBeGreaterThanOrEqual(hi - width * 1e-9);
        const ticks = scaleTicks(s, target).map((t) => t.value);
        expect(ticks[0]).toBe(a);
        expect(ticks[ticks.length - 1]).toBe(b);
      }),
      { numRuns: 1000 },
    );
  });

  it('ticks: inside the range, evenly spaced by a 1-2-5 step, none missed, 2..10 of them', () => {
    fc.assert(
      fc.property(fc.double({ min: -1e6, max: 1e6, noNaN: true }), fc.double({ min: 1e-3, max: 1e6, noNaN: true }), (lo, width) => {
        const hi = lo + width;
        fc.pre(width > 1e-6 * Math.max(1, Math.abs(lo))); // ranges well above double resolution
        const { step, ticks } = linearTicks(lo, hi);
        expect(isOneTwoFive(step)).toBe(true);
        expect(ticks.length).toBeGreaterThanOrEqual(2);
        expect(ticks.length).toBeLessThanOrEqual(10);
        const eps = step * 1e-6;
        for (const t of ticks) {
          expect(t).toBeGreaterThanOrEqual(lo - eps);
          expect(t).toBeLessThanOrEqual(hi + eps);
          expect(Math.abs(t / step - Math.round(t / step))).toBeLessThan(1e-6);
        }
        for (let i = 1; i < ticks.length; i++) expect(Math.abs(ticks[i]! - ticks[i - 1]! - step)).toBeLessThan(eps * 10);
        expect(ticks[0]! - step).toBeLessThan(lo + eps);
        expect(ticks[ticks.length - 1]! + step).toBeGreaterThan(hi - eps);
      }),
    );
  });
});

describe('log ticks', () => {
  it('decades of [1e-4, 0.1] are -4..-1', () => {
    expect(logTicks(1e-4, 0.1).decades).toEqual([-4, -3, -2, -1]);
  });

  it('decade(k) is the double nearest the decimal 1e<k>', () => {
    for (let k = -30; k <= 30; k++) expect(decade(k)).toBe(Number(`1e${k}`));
    expect(decade(-3)).toBe(0.001);
  });

  it('exactly the decades inside the range, checked against enumeration of 10^k', () => {
    fc.assert(
      fc.property(fc.double({ min: -12, max: 6, noNaN: true }), fc.double({ min: 0.05, max: 10, noNaN: true }), (a, span) => {
        const lo = 10 ** a;
        const hi = 10 ** (a + span);
        const expected: number[] = [];
        for (let k = -40; k <= 40; k++) {
          const v = Number(`1e${k}`);
          // a decade within 1e-9 (in log10) of an end counts as inside
          if (k >= Math.log10(lo) - 1e-9 && k <= Math.log10(hi) + 1e-9 && v > 0) expected.push(k);
        }
        const { decades, minor } = logTicks(lo, hi);
        expect(decades).toEqual(expected);
        for (const v of minor) {
          expect(v).toBeGreaterThan(lo);
          expect(v).toBeLessThan(hi);
          const k = Math.floor(Math.log10(v) + 1e-9);
          const m = Math.round(v / 10 ** k);
          expect(m).toBeGreaterThanOrEqual(2);
          expect(m).toBeLessThanOrEqual(9);
        }
      }),
    );
  });

  it('log projection is linear in log10', () => {
    const s = logScale([1e-3, 1e-1], [0, 100]);
    expect(project(s, 1e-2)).toBeCloseTo(50, 9);
    expect(project(s, 1e-3)).toBe(0);
    expect(project(s, 10 ** -1.5)).toBeCloseTo(75, 9);
    expect(project(linearScale([0, 10], [100, 0]), 2.5)).toBe(75);
    expect(() => logScale([0, 1], [0, 1])).toThrow(RangeError);
  });

  it('padLogDomain widens by a fraction of the span in log space', () => {
    const [lo, hi] = padLogDomain(1e-2, 1e-1, 0.1);
    expect(Math.log10(lo)).toBeCloseTo(-2.1, 9);
    expect(Math.log10(hi)).toBeCloseTo(-0.9, 9);
  });

  it('axis labels: decades as powers of ten; 2× and 5× labelled on a short axis only', () => {
    const long = scaleTicks(logScale([1e-6, 1], [0, 1])).filter((t) => t.label);
    expect(long.map((t) => t.label)).toEqual(['10⁻⁶', '10⁻⁵', '10⁻⁴', '10⁻³', '10⁻²', '10⁻¹', '1']);
    const short = scaleTicks(logScale([0.009, 0.11], [0, 1])).filter((t) => t.label).map((t) => t.label);
    expect(short).toEqual(['10⁻²', '10⁻¹', '2×10⁻²', '5×10⁻²']);
    const counts = scaleTicks(logScale([10, 2000], [0, 1]), 5, 'plain').filter((t) => t.label).map((t) => t.label);
    expect(counts).toEqual(['10', '100', '1000', '20', '50', '200', '500']);
    expect(scaleTicks(linearScale([0, 1072], [0, 1])).map((t) => t.label)).toEqual(['0', '200', '400', '600', '800', '1000']);
  });
});

describe('number text', () => {
  it('superscripts, powers of ten, scientific notation', () => {
    expect(superscript(-12)).toBe('⁻¹²');
    expect(decadeLabel(-3)).toBe('10⁻³');
    expect(decadeLabel(0)).toBe('1');
    expect(scientific(3.2e-7)).toBe('3.2×10⁻⁷');
    expect(scientific(250000, 2)).toBe('2.5×10⁵');
  });

  it('probabilities and counts', () => {
    expect(probabilityText(0)).toBe('0');
    expect(probabilityText(0.0495092)).toBe('0.0495');
    expect(probabilityText(1.6e-11)).toBe('1.6×10⁻¹¹');
    expect(countText(1072)).toBe('1072');
    expect(countText(2097152)).toBe('2\u2009097\u2009152');
  });
});

describe('count axis of the spectrum', () => {
  it('linear from 0 for counts of similar size, log (plain labels) when they span 10× or more', async () => {
    const { countScale } = await import('../../src/report/charts/spectrum.js');
    const box = { left: 0, top: 0, width: 100, height: 100 };
    expect(countScale([0, 3, 7], box)).toMatchObject({ kind: 'linear', domain: [0, 8] });
    const log = countScale([1, 0, 1072], box);
    expect(log.kind).toBe('log');
    expect(log.domain[0]).toBe(0.5); // a count of 1 still shows as a bar
    expect(project(log, 1)).toBeLessThan(100);
    expect(scaleTicks(log, 5, 'plain').filter((t) => t.label && !t.minor).map((t) => t.label)).toEqual(['1', '10', '100', '1000']);
  });
});

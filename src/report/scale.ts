/**
 * Axis scales and tick positions (pure). A scale maps a domain [d0, d1] onto a pixel range [r0, r1];
 * the log scale maps log10 of the value linearly.
 */

export interface Scale {
  readonly kind: 'linear' | 'log';
  readonly domain: readonly [number, number];
  readonly range: readonly [number, number];
  /** Tick step of a linear scale (default: the nice step of the domain). */
  readonly step?: number;
}

export function linearScale(domain: readonly [number, number], range: readonly [number, number]): Scale {
  return { kind: 'linear', domain, range };
}

/** Precondition: 0 < domain[0] < domain[1]. */
export function logScale(domain: readonly [number, number], range: readonly [number, number]): Scale {
  if (!(domain[0] > 0 && domain[1] > domain[0])) throw new RangeError(`log scale needs 0 < lo < hi, got [${domain[0]}, ${domain[1]}]`);
  return { kind: 'log', domain, range };
}

/** Pixel position of v (values ≤ 0 on a log scale go to the low end of the range). */
export function project(s: Scale, v: number): number {
  const [d0, d1] = s.domain;
  const [r0, r1] = s.range;
  let t: number;
  if (s.kind === 'log') t = v <= 0 ? 0 : (Math.log10(v) - Math.log10(d0)) / (Math.log10(d1) - Math.log10(d0));
  else t = d1 === d0 ? 0.5 : (v - d0) / (d1 - d0);
  return r0 + t * (r1 - r0);
}

/**
 * Tick step for about `target` ticks over [lo, hi]: 1, 2 or 5 times a power of ten (the "nice numbers"
 * rule). Precondition: hi > lo.
 */
export function niceStep(lo: number, hi: number, target = 5): number {
  const raw = (hi - lo) / Math.max(1, target);
  const k = Math.floor(Math.log10(raw));
  const f = raw / decade(k);
  const m = f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10;
  return m === 10 ? decade(k + 1) : Number(`${m}e${k}`); // the double nearest m·10^k, so equal steps compare equal
}

/** [lo, hi] widened outwards to multiples of its nice step; [0, 1] for an empty or zero range. */
export function niceDomain(lo: number, hi: number, target = 5): [number, number] {
  if (!(hi > lo)) {
    if (hi === 0 && lo === 0) return [0, 1];
    const pad = Math.abs(hi) || 1;
    return niceDomain(lo - pad / 2, hi + pad / 2, target);
  }
  const step = niceStep(lo, hi, target);
  return [clean(Math.floor(lo / step + 1e-9) * step, step), clean(Math.ceil(hi / step - 1e-9) * step, step)];
}

/**
 * A linear scale over [lo, hi] widened to whole steps, carrying that step so that its ticks start and end
 * on the ends of the axis (the widened range may have another nice step of its own).
 */
export function niceLinearScale(lo: number, hi: number, range: readonly [number, number], target = 5): Scale {
  const domain = niceDomain(lo, hi, target);
  const step = hi > lo ? niceStep(lo, hi, target) : niceStep(domain[0], domain[1], target);
  return { kind: 'linear', domain, range, step };
}

/** A multiple of `step` without floating-point noise. */
function clean(v: number, step: number): number {
  return Number(v.toFixed(Math.max(0, -Math.floor(Math.log10(step)))));
}

/** Multiples of the nice step (or of `given`) inside [lo, hi] (inclusive), free of floating-point noise. */
export function linearTicks(lo: number, hi: number, target = 5, given?: number): { step: number; ticks: number[] } {
  if (!(hi > lo)) return { step: 1, ticks: [lo] };
  const step = given ?? niceStep(lo, hi, target);
  const first = Math.ceil(lo / step - 1e-9);
  const last = Math.floor(hi / step + 1e-9);
  const decimals = Math.max(0, -Math.floor(Math.log10(step)));
  const ticks: number[] = [];
  for (let i = first; i <= last; i++) ticks.push(Number((i * step).toFixed(decimals)));
  return { step, ticks };
}

/** 10^k computed so that negative powers are the nearest doubles to the decimal values (1e-3, not 0.0010000000000000002). */
export function decade(k: number): number {
  return Number(`1e${k}`);
}

/** [lo, hi] widened on a log axis by `fraction` of its span (at least `minDecades`) at each end. */
export function padLogDomain(lo: number, hi: number, fraction: number, minDecades = 0): [number, number] {
  const a = Math.log10(lo);
  const b = Math.log10(hi);
  const pad = Math.max((b - a) * fraction, minDecades);
  return [10 ** (a - pad), 10 ** (b + pad)];
}

/**
 * Ticks of a log axis over [lo, hi]: the exponents k of the decades 10^k inside it (major, labelled every
 * `labelEvery` so that at most `maxLabels` carry a label) and the 2..9 multiples between them (minor).
 */
export function logTicks(lo: number, hi: number, maxLabels = 8): { decades: number[]; labelEvery: number; minor: number[] } {
  const a = Math.ceil(Math.log10(lo) - 1e-9) + 0; // + 0 turns -0 into 0
  const b = Math.floor(Math.log10(hi) + 1e-9) + 0;
  const decades: number[] = [];
  for (let k = a; k <= b; k++) decades.push(k);
  const labelEvery = Math.max(1, Math.ceil(decades.length / maxLabels));
  const minor: number[] = [];
  if (decades.length <= 12) {
    for (let k = a - 1; k <= b; k++) {
      for (let m = 2; m <= 9; m++) {
        const v = m * decade(k);
        if (v > lo * (1 + 1e-9) && v < hi * (1 - 1e-9)) minor.push(v);
      }
    }
  }
  return { decades, labelEvery, minor };
}

/** Number formatting for tables, tick labels and chart annotations (pure; text, not HTML). */

const SUPERSCRIPT: Record<string, string> = {
  '-': '⁻', '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹',
};

/** An integer exponent in superscript digits: -3 → "⁻³". */
export function superscript(k: number): string {
  return String(k).replace(/[-0-9]/g, (c) => SUPERSCRIPT[c]!);
}

/** A power of ten as "10⁻³" (1 for 10⁰, 10 for 10¹). */
export function decadeLabel(k: number): string {
  if (k === 0) return '1';
  if (k === 1) return '10';
  return `10${superscript(k)}`;
}

/** x in scientific notation "1.2×10⁻⁵" with `digits` significant digits. */
export function scientific(x: number, digits = 2): string {
  if (x === 0) return '0';
  const [m, e] = x.toExponential(digits - 1).split('e') as [string, string];
  const k = Number(e);
  return k === 0 ? m : `${m}×10${superscript(k)}`;
}

/** A whole count, digits grouped by thin spaces: 1 072 000. */
export function countText(n: number): string {
  if (!Number.isFinite(n)) return String(n);
  if (Math.abs(n) >= 1e15) return scientific(n, 3);
  const s = String(Math.round(Math.abs(n)));
  const grouped = s.length <= 4 ? s : s.replace(/\B(?=(\d{3})+(?!\d))/g, '\u2009');
  return n < 0 ? `−${grouped}` : grouped;
}

/** A probability: 0, 0.0123 (≥ 0.01), else 1.2×10⁻⁵. */
export function probabilityText(p: number): string {
  if (p === 0) return '0';
  if (p >= 0.01) return String(Number(p.toPrecision(3)));
  return scientific(p, 2);
}

/** A linear tick value with no floating-point noise (ticks are multiples of `step`). */
export function tickText(v: number, step: number): string {
  if (v === 0) return '0';
  if (Math.abs(v) >= 1e5) return scientific(v, 2);
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  return countOrFixed(v, decimals);
}

function countOrFixed(v: number, decimals: number): string {
  return decimals === 0 ? countText(v) : v.toFixed(decimals);
}

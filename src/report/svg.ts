import { escapeHtml } from './escape.js';
import { countText, decadeLabel, scientific, tickText } from './format.js';
import { decade, linearTicks, logTicks, project, type Scale } from './scale.js';

/**
 * SVG primitives (pure, return markup). Coordinates are in the chart's viewBox units; the page's CSS
 * (style.ts) styles the classes used here (axis, grid, tick, label ...). All text is escaped.
 */

/** The plot area inside a chart's viewBox. */
export interface Box {
  readonly left: number;
  readonly top: number;
  readonly width: number;
  readonly height: number;
}

/** A coordinate with at most two decimals. */
export function px(v: number): string {
  return String(Math.round(v * 100) / 100);
}

export interface ChartFrame {
  /** Stable id of the chart element (unique in the page). */
  readonly id: string;
  /** Kind of chart, put in data-chart (spectrum, cycles, error-rate). */
  readonly chart: string;
  readonly width: number;
  readonly height: number;
  /** Accessible title (plain text). */
  readonly title: string;
  /** Extra data-* attributes (name without the data- prefix → value). */
  readonly data?: Readonly<Record<string, string | number>>;
}

/** A complete inline <svg> element: sized by its viewBox so that it scales to the column width. */
export function svgElement(f: ChartFrame, body: string): string {
  const data = Object.entries(f.data ?? {})
    .map(([k, v]) => ` data-${k}="${escapeHtml(String(v))}"`)
    .join('');
  return (
    `<svg xmlns="http://www.w3.org/2000/svg" class="chart" id="${escapeHtml(f.id)}" data-chart="${escapeHtml(f.chart)}"${data}` +
    ` viewBox="0 0 ${f.width} ${f.height}" width="${f.width}" height="${f.height}" role="img" aria-labelledby="${escapeHtml(f.id)}-title">` +
    `<title id="${escapeHtml(f.id)}-title">${escapeHtml(f.title)}</title>${body}</svg>`
  );
}

export interface TextOptions {
  anchor?: 'start' | 'middle' | 'end';
  cls?: string;
  /** Rotation in degrees about (x, y). */
  rotate?: number;
  /** Vertical alignment: baseline (default), middle or hanging. */
  baseline?: 'middle' | 'hanging';
  fill?: string;
}

export function text(x: number, y: number, content: string, o: TextOptions = {}): string {
  const attrs = [`x="${px(x)}"`, `y="${px(y)}"`];
  if (o.anchor && o.anchor !== 'start') attrs.push(`text-anchor="${o.anchor}"`);
  if (o.baseline) attrs.push(`dominant-baseline="${o.baseline === 'middle' ? 'central' : 'hanging'}"`);
  if (o.cls) attrs.push(`class="${escapeHtml(o.cls)}"`);
  if (o.fill) attrs.push(`fill="${escapeHtml(o.fill)}"`);
  if (o.rotate) attrs.push(`transform="rotate(${o.rotate} ${px(x)} ${px(y)})"`);
  return `<text ${attrs.join(' ')}>${escapeHtml(content)}</text>`;
}

export function line(x1: number, y1: number, x2: number, y2: number, cls: string): string {
  return `<line x1="${px(x1)}" y1="${px(y1)}" x2="${px(x2)}" y2="${px(y2)}" class="${escapeHtml(cls)}"/>`;
}

/** Extra attributes as ` name="value"` (values escaped; undefined skipped). */
export function attrs(a: Readonly<Record<string, string | number | undefined>>): string {
  return Object.entries(a)
    .filter(([, v]) => v !== undefined)
    .map(([k, v]) => ` ${k}="${escapeHtml(String(v))}"`)
    .join('');
}

export function rect(x: number, y: number, w: number, h: number, a: Readonly<Record<string, string | number | undefined>> = {}): string {
  return `<rect x="${px(x)}" y="${px(y)}" width="${px(Math.max(0, w))}" height="${px(Math.max(0, h))}"${attrs(a)}/>`;
}

/** Path data through the points, M then L. */
export function pathData(points: readonly (readonly [number, number])[]): string {
  return points.map(([x, y], i) => `${i === 0 ? 'M' : 'L'}${px(x)} ${px(y)}`).join(' ');
}

/** Closed polygon point list. */
export function polygonPoints(points: readonly (readonly [number, number])[]): string {
  return points.map(([x, y]) => `${px(x)},${px(y)}`).join(' ');
}

export interface Tick {
  value: number;
  /** Empty for an unlabelled tick. */
  label: string;
  minor?: boolean;
}

/**
 * Ticks for a scale: 1-2-5 steps on a linear scale; on a log scale the decades (labelled), and the 2..9
 * multiples between them (unlabelled, except 2× and 5× on an axis of at most 2.5 decades, and all of
 * them on one of less than 0.7 decade, so that a short axis still has labels).
 */
export function scaleTicks(s: Scale, target = 5, labels: 'power' | 'plain' = 'power'): Tick[] {
  const [lo, hi] = s.domain;
  if (s.kind === 'linear') {
    const { step, ticks } = linearTicks(lo, hi, target, s.step);
    return ticks.map((value) => ({ value, label: tickText(value, step) }));
  }
  const { decades, labelEvery, minor } = logTicks(lo, hi);
  // plain: whole numbers written out (counts ≥ 1 up to 10^5), else powers of ten
  const plain = labels === 'plain' && lo >= 0.5 && hi <= 1e5;
  const major = decades.map((k, i) => ({ value: decade(k), label: (decades.length - 1 - i) % labelEvery === 0 ? (plain ? countText(decade(k)) : decadeLabel(k)) : '' }));
  const span = Math.log10(hi / lo);
  const labelMinor = (v: number): string => {
    const m = Math.round(v / decade(Math.floor(Math.log10(v) + 1e-9)));
    if (!(span < 0.7 || (span <= 2.5 && (m === 2 || m === 5)))) return '';
    return plain ? countText(v) : scientific(v, 1);
  };
  return [...major, ...minor.map((value) => ({ value, label: labelMinor(value), minor: true }))];
}

/** x axis along the bottom of the box: base line, ticks, labels, optional vertical grid, title. */
export function bottomAxis(s: Scale, box: Box, ticks: readonly Tick[], title: string, grid = true): string {
  const y = box.top + box.height;
  const out: string[] = [];
  for (const t of ticks) {
    const x = project(s, t.value);
    if (grid) out.push(line(x, box.top, x, y, t.minor ? 'grid minor' : 'grid'));
    out.push(line(x, y, x, y + (t.minor ? 3 : 5), 'tick'));
    if (t.label) out.push(text(x, y + 8, t.label, { anchor: 'middle', baseline: 'hanging', cls: 'tick-label' }));
  }
  out.push(line(box.left, y, box.left + box.width, y, 'axis'));
  if (title) out.push(text(box.left + box.width / 2, y + 34, title, { anchor: 'middle', cls: 'axis-title' }));
  return `<g class="x-axis">${out.join('')}</g>`;
}

/** y axis along the left of the box: base line, ticks, labels, optional horizontal grid, rotated title. */
export function leftAxis(s: Scale, box: Box, ticks: readonly Tick[], title: string, grid = true): string {
  const x = box.left;
  const out: string[] = [];
  for (const t of ticks) {
    const y = project(s, t.value);
    if (grid) out.push(line(x, y, x + box.width, y, t.minor ? 'grid minor' : 'grid'));
    out.push(line(x - (t.minor ? 3 : 5), y, x, y, 'tick'));
    if (t.label) out.push(text(x - 8, y, t.label, { anchor: 'end', baseline: 'middle', cls: 'tick-label' }));
  }
  out.push(line(x, box.top, x, box.top + box.height, 'axis'));
  if (title) out.push(text(box.left - 48, box.top + box.height / 2, title, { anchor: 'middle', cls: 'axis-title', rotate: -90 }));
  return `<g class="y-axis">${out.join('')}</g>`;
}

import { escapeHtml, idToken } from '../escape.js';
import type { TrialSeriesView, TrialView } from '../model.js';
import { logScale, padLogDomain, project, type Scale } from '../scale.js';
import { type Box, bottomAxis, leftAxis, line, pathData, polygonPoints, px, rect, scaleTicks, svgElement, text } from '../svg.js';
import { marker } from './markers.js';
import { seriesStyle } from './palette.js';

const WIDTH = 640;
const BOX: Box = { left: 72, top: 16, width: 544, height: 330 };
/** The legend sits under the axis title, outside the plot, so that it never hides a point. */
const LEGEND_TOP = BOX.top + BOX.height + 50;
const LEGEND_ROW = 16;
const LEGEND_LABEL = 70;

/**
 * The domains of p and of the rates (interval ends included), padded in log space so that no marker sits
 * on an axis; at least one decade wide. Null when nothing is positive.
 */
export function errorRateDomains(series: readonly TrialSeriesView[]): { x: [number, number]; y: [number, number] } | null {
  const ps: number[] = [];
  const ys: number[] = [];
  for (const s of series) {
    for (const pt of s.points) {
      ps.push(pt.p);
      for (const v of [pt.rate, ...(pt.interval ?? [])]) if (v > 0) ys.push(v);
    }
  }
  if (ps.length === 0 || ys.length === 0) return null;
  return { x: padded(Math.min(...ps), Math.max(...ps)), y: padded(Math.min(...ys), Math.min(1, Math.max(...ys))) };
}

/** Extent widened to at least one decade (about the geometric centre), then padded by 5 % of its span. */
function padded(lo: number, hi: number): [number, number] {
  let a = Math.log10(lo);
  let b = Math.log10(hi);
  if (b - a < 1) {
    const c = (a + b) / 2;
    a = c - 0.5;
    b = c + 0.5;
  }
  return padLogDomain(10 ** a, 10 ** b, 0.05);
}

function clip(text: string, n: number): string {
  return text.length <= n ? text : `${text.slice(0, n - 1)}…`;
}

/** One series: interval band (polygon), line through the positive rates (path), whiskers and markers. */
function seriesMarkup(s: TrialSeriesView, i: number, xs: Scale, ys: Scale): string {
  const st = seriesStyle(i);
  const bottom = BOX.top + BOX.height;
  const yOf = (v: number) => (v > 0 ? Math.min(bottom, Math.max(BOX.top, project(ys, v))) : bottom);
  const out: string[] = [];
  const withInterval = s.points.filter((p) => p.interval);
  if (withInterval.length >= 2) {
    const upper = withInterval.map((p) => [project(xs, p.p), yOf(p.interval![1])] as const);
    const lower = withInterval.map((p) => [project(xs, p.p), yOf(p.interval![0])] as const).reverse();
    out.push(`<polygon class="band" data-band="${i}" points="${polygonPoints([...upper, ...lower])}" fill="${st.colour}" fill-opacity="0.16" stroke="${st.colour}" stroke-opacity="0.35" stroke-width="0.6"/>`);
  }
  const positive = s.points.filter((p) => p.rate > 0);
  if (positive.length >= 2) {
    const d = pathData(positive.map((p) => [project(xs, p.p), yOf(p.rate)] as const));
    out.push(`<path class="rate-line" d="${d}" fill="none" stroke="${st.colour}" stroke-width="1.8"${st.dash ? ` stroke-dasharray="${st.dash}"` : ''}/>`);
  }
  for (const p of s.points) {
    const x = project(xs, p.p);
    if (p.interval) {
      const [lo, hi] = p.interval;
      out.push(`<line class="whisker" x1="${px(x)}" y1="${px(yOf(lo))}" x2="${px(x)}" y2="${px(yOf(hi))}" stroke="${st.colour}" stroke-width="1"/>`);
    }
    const y = p.rate > 0 ? yOf(p.rate) : yOf(p.interval?.[1] ?? 0);
    out.push(marker(st.marker, x, y, 3.6, st.colour, p.rate === 0));
  }
  return `<g class="series" data-series="${i}" data-label="${escapeHtml(s.label)}" data-points="${s.points.length}">${out.join('')}</g>`;
}

/** Legend under the plot: one entry per series (two columns when there are many short labels), then notes. */
function legend(series: readonly TrialSeriesView[], anyZero: boolean): { markup: string; height: number } {
  const columns = series.length > 3 && series.every((s) => s.label.length <= 36) ? 2 : 1;
  const labels = series.map((s) => clip(s.label, columns === 2 ? 36 : LEGEND_LABEL));
  const perColumn = Math.ceil(labels.length / columns);
  const colWidth = BOX.width / columns;
  const out: string[] = [];
  labels.forEach((label, i) => {
    const st = seriesStyle(i);
    const x0 = BOX.left + Math.floor(i / perColumn) * colWidth;
    const y = LEGEND_TOP + (i % perColumn) * LEGEND_ROW;
    out.push(`<line x1="${px(x0)}" y1="${px(y)}" x2="${px(x0 + 24)}" y2="${px(y)}" stroke="${st.colour}" stroke-width="1.8"${st.dash ? ` stroke-dasharray="${st.dash}"` : ''}/>`);
    out.push(marker(st.marker, x0 + 12, y, 3.4, st.colour));
    out.push(text(x0 + 32, y, label, { baseline: 'middle', cls: 'legend' }));
  });
  const notes = ['shaded band and whiskers: interval of each point', ...(anyZero ? ['hollow marker: no failure seen (drawn at the upper end of its interval)'] : [])];
  const yNote = LEGEND_TOP + perColumn * LEGEND_ROW;
  notes.forEach((n, j) => out.push(text(BOX.left, yNote + j * 14, n, { baseline: 'middle', cls: 'legend note' })));
  return { markup: `<g class="legend-box" data-legend="${series.length}">${out.join('')}</g>`, height: yNote + (notes.length - 1) * 14 + 12 };
}

/**
 * Logical error rate versus p on log–log axes: one series per matrix label, each with its interval band,
 * a line through the points, whiskers and markers (hollow where no failure was seen); ticks at decades.
 */
export function errorRateChart(t: TrialView, id: string): string {
  const series = t.series.filter((s) => s.points.length > 0);
  const dom = errorRateDomains(series);
  const key = legend(series, series.some((s) => s.points.some((p) => p.rate === 0)));
  const frame = { id, chart: 'error-rate', width: WIDTH, height: key.height, title: 'Logical error rate versus p', data: { series: series.length } };
  if (!dom) return svgElement(frame, text(WIDTH / 2, key.height / 2, 'no points with a positive rate or interval', { anchor: 'middle', cls: 'empty' }));
  const xs = logScale(dom.x, [BOX.left, BOX.left + BOX.width]);
  const ys = logScale(dom.y, [BOX.top + BOX.height, BOX.top]);
  const clipId = `${idToken(id)}-clip`;
  const out = [
    `<defs><clipPath id="${clipId}">${rect(BOX.left - 6, BOX.top - 6, BOX.width + 12, BOX.height + 12)}</clipPath></defs>`,
    bottomAxis(xs, BOX, scaleTicks(xs), 'physical error probability p'),
    leftAxis(ys, BOX, scaleTicks(ys), 'logical error rate'),
    `<g clip-path="url(#${clipId})">${series.map((s, i) => seriesMarkup(s, i, xs, ys)).join('')}</g>`,
    line(BOX.left, BOX.top, BOX.left + BOX.width, BOX.top, 'frame'),
    line(BOX.left + BOX.width, BOX.top, BOX.left + BOX.width, BOX.top + BOX.height, 'frame'),
    key.markup,
  ];
  return svgElement(frame, out.join(''));
}

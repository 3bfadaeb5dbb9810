import { idToken } from '../escape.js';
import { countText, decadeLabel } from '../format.js';
import type { SpectrumView } from '../model.js';
import { decade, logScale, niceLinearScale, project, type Scale } from '../scale.js';
import { type Box, leftAxis, line, rect, scaleTicks, svgElement, text } from '../svg.js';

const WIDTH = 640;
const HEIGHT = 300;
const BOX: Box = { left: 64, top: 40, width: 556, height: 180 };
const FOUND = '#0072B2';
const ROWS = '#333333';
/** Counts spanning more than this ratio are drawn on a log axis. */
const LOG_RATIO = 10;

/** The y scale for word counts: linear from 0, or log (decades) when counts span a wide range. */
export function countScale(counts: readonly number[], box: Box): Scale {
  const positive = counts.filter((c) => c > 0);
  const max = Math.max(1, ...positive);
  const min = positive.length > 0 ? Math.min(...positive) : 1;
  const range = [box.top + box.height, box.top] as const;
  if (max / min >= LOG_RATIO) {
    // from below the smallest count (so that it shows as a bar; 0.5 under a count of 1) to a little above the largest
    const lo = min === 1 ? 0.5 : decade(Math.floor(Math.log10(min) - 1e-9));
    return logScale([lo, 10 ** (Math.log10(max) + 0.3)], range);
  }
  // headroom for the count labels; at least 0..5 so that the steps are whole words
  return niceLinearScale(0, Math.max(5, max * 1.08), range);
}

/** Compact upper bound on a miss probability for a narrow column: "0", "≤10⁻³". */
function missLabel(p: number | null): string {
  if (p === null) return '?';
  if (p === 0) return '0';
  const k = Math.ceil(Math.log10(p) - 1e-12);
  return k >= 0 ? '≤1' : `≤${decadeLabel(k)}`;
}

/**
 * Bar chart of one side's words per weight 1..W: all words found (solid where the weight is complete,
 * hatched where words of that weight may have been missed) beside the rows of the original matrix among
 * them; the miss probability of each weight under the axis when the columns are wide enough.
 */
export function spectrumChart(s: SpectrumView, id: string): string {
  const W = s.maxWeight;
  const cat = W > 0 ? BOX.width / W : BOX.width;
  const y = countScale([...s.counts, ...s.originals], BOX);
  const base = BOX.top + BOX.height;
  const yOf = (c: number) => (y.kind === 'log' ? Math.min(base, project(y, c)) : project(y, c));
  const hatch = `${idToken(id)}-hatch`;
  const hasRows = s.originals.some((c) => c > 0);
  const out: string[] = [
    `<defs><pattern id="${hatch}" patternUnits="userSpaceOnUse" width="6" height="6" patternTransform="rotate(45)">` +
      `<rect width="6" height="6" fill="#cfe3f3"/><line x1="0" y1="0" x2="0" y2="6" stroke="${FOUND}" stroke-width="2.5"/></pattern></defs>`,
  ];
  out.push(leftAxis(y, BOX, scaleTicks(y, 5, 'plain'), y.kind === 'log' ? 'words (log scale)' : 'words'));
  const showMiss = cat >= 34 && s.miss.some((m) => m !== null);
  const barW = Math.min(28, cat * (hasRows ? 0.5 : 0.7));
  const rowW = hasRows ? Math.min(10, cat * 0.2) : 0;
  const labelEvery = Math.max(1, Math.ceil(W / 30));
  for (let w = 1; w <= W; w++) {
    const c = s.counts[w - 1] ?? 0;
    const rows = s.originals[w - 1] ?? 0;
    const miss = s.miss[w - 1] ?? null;
    const x0 = BOX.left + (w - 1) * cat;
    const mid = x0 + cat / 2;
    const group = x0 + (cat - barW - rowW - (hasRows ? 2 : 0)) / 2;
    const incomplete = miss !== null && miss > 0;
    const parts: string[] = [];
    if (c > 0) {
      const top = yOf(c);
      parts.push(
        rect(group, top, barW, base - top, {
          fill: incomplete ? `url(#${hatch})` : FOUND, stroke: FOUND, 'stroke-width': 0.8, class: 'bar', 'data-weight': w, 'data-count': c,
          'data-complete': incomplete ? 'false' : miss === 0 ? 'true' : 'unknown',
        }),
      );
      if (cat >= 26) parts.push(text(group + barW / 2, top - 3, countText(c), { anchor: 'middle', cls: 'bar-label' }));
    }
    if (rows > 0) {
      const top = yOf(rows);
      parts.push(rect(group + barW + 2, top, rowW, base - top, { fill: ROWS, class: 'bar rows', 'data-weight': w, 'data-count': rows }));
    }
    if ((w - 1) % labelEvery === 0 || w === W) parts.push(text(mid, base + 8, String(w), { anchor: 'middle', baseline: 'hanging', cls: 'tick-label' }));
    if (showMiss) parts.push(text(mid, base + 24, missLabel(miss), { anchor: 'middle', baseline: 'hanging', cls: incomplete ? 'miss open' : 'miss' }));
    out.push(`<g class="weight" data-weight="${w}">${parts.join('')}</g>`);
  }
  out.push(line(BOX.left, base, BOX.left + BOX.width, base, 'axis'));
  if (showMiss) out.push(text(BOX.left - 8, base + 24, 'miss', { anchor: 'end', baseline: 'hanging', cls: 'miss' }));
  out.push(text(BOX.left + BOX.width / 2, base + (showMiss ? 46 : 32), 'weight', { anchor: 'middle', baseline: 'hanging', cls: 'axis-title' }));
  out.push(legend(hasRows, s.side, hatch));
  return svgElement(
    { id, chart: 'spectrum', width: WIDTH, height: HEIGHT, title: `Words per weight, side ${s.side}`, data: { side: s.side, weights: W } },
    out.join(''),
  );
}

function legend(hasRows: boolean, side: string, hatch: string): string {
  const items: string[] = [];
  let x = BOX.left;
  const y = 14;
  const item = (swatch: string, label: string, width: number) => {
    items.push(swatch.replace(/X0/g, String(x)), text(x + 16, y + 5, label, { baseline: 'middle', cls: 'legend' }));
    x += width;
  };
  item(`<rect x="X0" y="${y}" width="11" height="11" fill="${FOUND}"/>`, 'words found, weight complete', 200);
  item(`<rect x="X0" y="${y}" width="11" height="11" fill="url(#${hatch})" stroke="${FOUND}" stroke-width="0.8"/>`, 'words may be missing', 160);
  if (hasRows) item(`<rect x="X0" y="${y}" width="11" height="11" fill="${ROWS}"/>`, side === 'h' ? 'rows of H' : `rows of H${side.toUpperCase()}`, 120);
  return `<g class="legend-box">${items.join('')}</g>`;
}

import { countText, scientific } from '../format.js';
import type { CensusView } from '../model.js';
import { niceLinearScale, project } from '../scale.js';
import { type Box, leftAxis, line, rect, scaleTicks, svgElement, text } from '../svg.js';
import { seriesStyle } from './palette.js';

const WIDTH = 640;
const PLOT_H = 180;
const GAP = 58;
/** Below the plots: length titles. */
const BOTTOM = 44;

/** Cycle lengths present in any census, ascending. */
export function cycleLengths(censuses: readonly CensusView[]): number[] {
  const s = new Set<number>();
  for (const c of censuses) for (const len of c.cycles.keys()) s.add(len);
  return [...s].sort((a, b) => a - b);
}

function short(v: number): string {
  return v < 1e5 ? countText(v) : scientific(v, 2);
}

/**
 * Grouped bar chart: one panel per cycle length (4, 6, 8, ...), each with its own linear axis (the counts
 * of different lengths differ by orders of magnitude), one bar per census (matrix and graph) in the same
 * colour in every panel.
 */
export function cycleChart(censuses: readonly CensusView[], id: string): string {
  const lengths = cycleLengths(censuses);
  const key = legend(censuses);
  const TOP = key.height + 22;
  const HEIGHT = TOP + PLOT_H + BOTTOM;
  const frame = { id, chart: 'cycles', width: WIDTH, height: HEIGHT, title: 'Cycles of the Tanner graphs by length', data: { lengths: lengths.join(' '), bars: censuses.length } };
  if (lengths.length === 0) return svgElement(frame, text(WIDTH / 2, HEIGHT / 2, 'no cycle counts', { anchor: 'middle', cls: 'empty' }));
  const panelW = (WIDTH - 12 - GAP * lengths.length) / lengths.length;
  const out: string[] = [];
  lengths.forEach((len, j) => {
    const box: Box = { left: GAP + j * (panelW + GAP), top: TOP, width: panelW, height: PLOT_H };
    const values = censuses.map((c) => c.cycles.get(len)?.value ?? 0);
    // headroom for the count labels; at least 0..4 so that the steps are whole cycles
    const ys = niceLinearScale(0, Math.max(4, Math.max(...values) * 1.06), [box.top + box.height, box.top], 4);
    const parts: string[] = [leftAxis(ys, box, scaleTicks(ys, 4), '')];
    const slot = box.width / Math.max(1, censuses.length);
    const barW = Math.min(36, slot * 0.72);
    censuses.forEach((c, i) => {
      const v = c.cycles.get(len);
      const x = box.left + i * slot + (slot - barW) / 2;
      if (!v) {
        parts.push(text(x + barW / 2, box.top + box.height - 4, '–', { anchor: 'middle', cls: 'bar-label' }));
        return;
      }
      const top = project(ys, v.value);
      const st = seriesStyle(i);
      parts.push(rect(x, top, barW, box.top + box.height - top, { fill: st.colour, class: 'bar', 'data-length': len, 'data-census': i, 'data-count': v.text }));
      if (barW >= 20) parts.push(text(x + barW / 2, top - 3, short(v.value), { anchor: 'middle', cls: 'bar-label' }));
    });
    parts.push(line(box.left, box.top + box.height, box.left + box.width, box.top + box.height, 'axis'));
    parts.push(text(box.left + box.width / 2, box.top + box.height + 10, `${len}-cycles`, { anchor: 'middle', baseline: 'hanging', cls: 'axis-title' }));
    out.push(`<g class="panel" data-length="${len}">${parts.join('')}</g>`);
  });
  out.push(key.markup);
  return svgElement(frame, out.join(''));
}

/** Legend rows (wrapped to the chart width) and their height. */
function legend(censuses: readonly CensusView[]): { markup: string; height: number } {
  const items: string[] = [];
  let x = GAP;
  let y = 10;
  censuses.forEach((c, i) => {
    const label = c.label.length > 32 ? `${c.label.slice(0, 31)}…` : c.label;
    const w = 24 + label.length * 6.3;
    if (x + w > WIDTH - 8 && x > GAP) {
      x = GAP;
      y += 16;
    }
    items.push(rect(x, y, 11, 11, { fill: seriesStyle(i).colour }), text(x + 16, y + 5.5, label, { baseline: 'middle', cls: 'legend' }));
    x += w;
  });
  return { markup: `<g class="legend-box" data-legend="${censuses.length}">${items.join('')}</g>`, height: y + 11 };
}

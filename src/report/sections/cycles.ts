import { cycleChart, cycleLengths } from '../charts/cycles.js';
import { countText } from '../format.js';
import type { CensusView } from '../model.js';
import { type Cell, numCell, section, table } from '../table.js';

function girthCell(g: number | null | undefined): Cell {
  if (g === undefined) return { text: '–', num: true, cls: 'missing' };
  return { text: g === null ? '∞ (no cycle)' : String(g), num: true };
}

/** Digits of an exact count grouped like countText (the count may exceed 2^53, so work on the text). */
function exactCount(text: string): string {
  return text.length <= 4 ? text : text.replace(/\B(?=(\d{3})+(?!\d))/g, '\u2009');
}

export function cyclesSection(censuses: readonly CensusView[]): string {
  const lengths = cycleLengths(censuses);
  const head: Cell[] = ['Tanner graph', { text: 'girth', num: true }, { text: 'edges', num: true }, ...lengths.map((l) => ({ text: `${l}-cycles`, num: true }))];
  const rows = censuses.map((c): Cell[] => [
    c.label,
    girthCell(c.girth),
    numCell(c.edges, countText),
    ...lengths.map((l): Cell => {
      const v = c.cycles.get(l);
      return v ? { text: exactCount(v.text), num: true } : { text: '–', num: true, cls: 'missing' };
    }),
  ]);
  const body =
    '<p class="explain">Short cycles of the Tanner graph (check–variable graph) of each matrix compared; fewer short cycles usually help belief propagation.</p>' +
    `<figure>${cycleChart(censuses, 'chart-cycles')}</figure>` +
    table(head, rows, { rowHeads: true, cls: 'cycles' });
  return section('cycles', 'Cycle census', body);
}

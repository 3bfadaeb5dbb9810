import { escapeHtml } from '../escape.js';
import { countText } from '../format.js';
import type { ConditionStats, ConditionView, CycleCount, SelectionView } from '../model.js';
import { type Cell, section, table } from '../table.js';

/** A quantity of the before/after table: its value as a number (for the change) and as an exact cell. */
interface Quantity {
  name: string;
  value: (s: ConditionStats) => number | undefined;
  text: (s: ConditionStats) => string | undefined;
}

function grouped(text: string): string {
  return text.length <= 4 ? text : text.replace(/\B(?=(\d{3})+(?!\d))/g, '\u2009');
}

const plain = (get: (s: ConditionStats) => number | undefined): Pick<Quantity, 'value' | 'text'> => ({
  value: get,
  text: (s) => {
    const v = get(s);
    return v === undefined ? undefined : countText(v);
  },
});

const cycles = (get: (s: ConditionStats) => CycleCount | undefined): Pick<Quantity, 'value' | 'text'> => ({
  value: (s) => get(s)?.value,
  text: (s) => {
    const c = get(s);
    return c ? grouped(c.text) : undefined;
  },
});

const QUANTITIES: Quantity[] = [
  { name: 'rows', ...plain((s) => s.rows) },
  { name: 'edges', ...plain((s) => s.edges) },
  { name: 'largest row weight', ...plain((s) => s.maxRowWeight) },
  { name: 'largest column degree', ...plain((s) => s.maxColDegree) },
  { name: '4-cycles', ...cycles((s) => s.cycles4) },
  { name: '6-cycles', ...cycles((s) => s.cycles6) },
];

function valueCell(text: string | undefined): Cell {
  return text === undefined ? { text: '–', num: true, cls: 'missing' } : { text, num: true };
}

function change(b: number | undefined, a: number | undefined): Cell {
  if (b === undefined || a === undefined) return { text: '', num: true };
  const d = a - b;
  return { text: d === 0 ? '0' : `${d > 0 ? '+' : '−'}${countText(Math.abs(d))}`, num: true };
}

export function budgetSection(c: ConditionView): string {
  let body = '';
  const facts = [c.strategy ? `strategy: ${c.strategy}` : '', c.added !== undefined ? `rows added: ${countText(c.added)}` : ''].filter(Boolean);
  if (facts.length > 0) body += `<p class="meta">${escapeHtml(facts.join(' · '))}</p>`;
  if (c.budget.length > 0) {
    body += '<h3>Budget</h3>' + table(['setting', 'value'], c.budget.map(([k, v]) => [k, v]), { rowHeads: true, cls: 'budget' });
  }
  for (const side of c.sides) {
    const rows: Cell[][] = [];
    for (const q of QUANTITIES) {
      const b = side.before ? q.text(side.before) : undefined;
      const a = side.after ? q.text(side.after) : undefined;
      if (b === undefined && a === undefined) continue;
      const bv = side.before ? q.value(side.before) : undefined;
      const av = side.after ? q.value(side.after) : undefined;
      rows.push([q.name, valueCell(b), valueCell(a), change(bv, av)]);
    }
    if (rows.length === 0) continue;
    const heading = side.side ? `Before and after, side ${side.side}` : 'Before and after';
    body += `<h3>${escapeHtml(heading)}</h3>` + table(['', { text: 'before', num: true }, { text: 'after', num: true }, { text: 'change', num: true }], rows, { rowHeads: true, cls: 'before-after' });
    if (side.selection) body += selectionTable(side.side, side.selection);
  }
  return section('budget', 'Conditioning budget', body);
}

/** The trial strategy's evidence: failures of each nested prefix on the same samples, the kept one marked. */
function selectionTable(name: string, s: SelectionView): string {
  const at = s.ps.length > 0 ? ` at p = ${s.ps.join(', ')}` : '';
  const rows: Cell[][] = s.prefixes.map((p) => [
    { text: countText(p.added), num: true },
    { text: countText(p.failures), num: true },
    { text: s.shots > 0 ? (p.failures / s.shots).toPrecision(3) : '–', num: true },
    p.added === s.chosen ? 'kept' : '',
  ]);
  return `<h3>${escapeHtml(`Measured choice${name ? `, side ${name}` : ''}`)}</h3>`
    + `<p class="meta">${escapeHtml(`nested prefixes of the candidates ranked by new short cycles, decoded on the same ${countText(s.shots)} shots${at}; the fewest failures is kept`)}</p>`
    + table([{ text: 'added rows', num: true }, { text: 'failures', num: true }, { text: 'failures / shots', num: true }, ''], rows, { cls: 'selection' });
}

import { escapeHtml } from '../escape.js';
import { countText, probabilityText } from '../format.js';
import type { DistanceSideView, DistanceView } from '../model.js';
import { type Cell, numCell, section, table } from '../table.js';

const WITNESS_SHOWN = 64;

function yesNo(v: boolean | undefined): Cell {
  return v === undefined ? { text: '–', cls: 'missing' } : { text: v ? 'yes' : 'no', cls: v ? 'ok' : 'open' };
}

function sideRow(s: DistanceSideView): Cell[] {
  const countCell: Cell =
    s.count === undefined ? { text: '–', num: true, cls: 'missing' } : { text: `${s.countExact === false ? '≥ ' : ''}${countText(s.count)}`, num: true };
  return [
    s.name,
    numCell(s.lower),
    numCell(s.upper),
    yesNo(s.certified),
    countCell,
    s.certified ? { text: '0', num: true } : numCell(s.missProbability, probabilityText),
    s.method ?? '–',
    s.stoppedBy ?? '–',
  ];
}

export function distanceSection(d: DistanceView): string {
  const rows = d.sides.map(sideRow);
  if (d.combined && d.sides.length > 1) {
    const c = d.combined;
    rows.push(['d', numCell(c.lower), numCell(c.upper), yesNo(c.certified), '', '', '', '']);
  }
  const head: Cell[] = ['', { text: 'lower', num: true }, { text: 'upper', num: true }, 'certified', { text: 'words at upper bound', num: true }, { text: 'miss probability', num: true }, 'method', 'stopped by'];
  let body = table(head, rows, { rowHeads: true, cls: 'distance' });
  const witnesses = d.sides.filter((s) => s.witness && s.witness.length > 0);
  if (witnesses.length > 0) {
    body += '<ul class="witness">';
    for (const s of witnesses) {
      const w = s.witness!;
      const shown = w.slice(0, WITNESS_SHOWN).join(', ') + (w.length > WITNESS_SHOWN ? `, … (${w.length} in all)` : '');
      body += `<li>${escapeHtml(s.name)} witness (weight ${w.length}): <code>${escapeHtml(shown)}</code></li>`;
    }
    body += '</ul>';
  }
  body +=
    '<p class="explain">d = min(dX, dZ). Upper bounds are weights of logical operators found (the witnesses); lower bounds are proven. ' +
    'The miss probability is the chance that a logical operator of weight below the upper bound was not found by the randomised search.</p>';
  return section('distance', 'Distance bounds', body);
}

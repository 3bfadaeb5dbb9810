import { escapeHtml } from '../escape.js';
import { countText } from '../format.js';
import type { CodeView, DistanceView, WeightRange } from '../model.js';
import { type Cell, numCell, section, table } from '../table.js';

function rangeText(r: WeightRange | undefined): Cell {
  if (!r) return { text: '–', num: true, cls: 'missing' };
  return { text: r.min === r.max ? String(r.min) : `${r.min}–${r.max}`, num: true };
}

/** What is known of d: "d = 8", "6 ≤ d ≤ 8", "d ≤ 8"; null when nothing is. */
export function distanceText(distance: DistanceView | undefined): string | null {
  const d = distance?.combined ?? (distance?.sides.length === 1 ? distance.sides[0] : undefined);
  if (!d || d.upper === undefined) return null;
  if (d.certified) return `d = ${d.upper}`;
  if (d.lower !== undefined && d.lower !== null) return `${d.lower} ≤ d ≤ ${d.upper}`;
  return `d ≤ ${d.upper}`;
}

/** "[[n,k,d]]" when d is certified, else "[[n,k]]"; "M × N matrix" for a single matrix. */
export function parameterText(code: CodeView, distance: DistanceView | undefined): string {
  const n = code.n ?? '?';
  if (code.matrices.length === 1 && code.k === undefined) return `${code.matrices[0]!.rows ?? '?'} × ${n} matrix`;
  const d = distanceText(distance);
  return `[[${n},${code.k ?? '?'}${d?.startsWith('d = ') ? `,${d.slice(4)}` : ''}]]`;
}

export function codeSection(code: CodeView, distance: DistanceView | undefined): string {
  const facts: string[] = [`<span class="params">${escapeHtml(parameterText(code, distance))}</span>`];
  const d = distanceText(distance);
  if (d) facts.push(`<span>${escapeHtml(d)}</span>`);
  if (code.commute !== undefined) facts.push(code.commute ? '<span class="ok">HX·HZᵀ = 0: the checks commute</span>' : '<span class="bad">HX·HZᵀ ≠ 0: not a valid CSS code</span>');
  let body = `<p class="facts">${facts.join('')}</p>`;
  if (code.label) body += `<p class="meta">code: <code>${escapeHtml(code.label)}</code></p>`;
  if (code.matrices.length > 0) {
    body += table(
      ['matrix', 'rows', 'columns', 'rank', 'row weight', 'column weight', 'edges'].map((h, i) => (i === 0 ? h : { text: h, num: true })),
      code.matrices.map((m) => [m.name, numCell(m.rows, countText), numCell(m.cols, countText), numCell(m.rank, countText), rangeText(m.rowWeight), rangeText(m.colWeight), numCell(m.edges, countText)]),
      { rowHeads: true, cls: 'code' },
    );
  }
  return section('code', 'Code', body);
}

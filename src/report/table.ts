import { escapeHtml } from './escape.js';

/** A table cell: plain text (escaped here), or markup already escaped by the caller, optionally numeric (right-aligned). */
export type Cell = string | number | { html: string; num?: boolean } | { text: string; num?: boolean; cls?: string };

function cell(tag: 'td' | 'th', c: Cell): string {
  if (typeof c === 'number') return `<${tag} class="num">${escapeHtml(String(c))}</${tag}>`;
  if (typeof c === 'string') return `<${tag}>${escapeHtml(c)}</${tag}>`;
  const cls = [c.num ? 'num' : '', 'cls' in c && c.cls ? c.cls : ''].filter(Boolean).join(' ');
  const open = cls ? `<${tag} class="${escapeHtml(cls)}">` : `<${tag}>`;
  return `${open}${'html' in c ? c.html : escapeHtml(c.text)}</${tag}>`;
}

/** A plain table: header row, body rows (first cell of each row as a row header when `rowHeads`). */
export function table(head: readonly Cell[], rows: readonly (readonly Cell[])[], o: { cls?: string; rowHeads?: boolean; caption?: string } = {}): string {
  const cap = o.caption ? `<caption>${escapeHtml(o.caption)}</caption>` : '';
  const thead = head.length > 0 ? `<thead><tr>${head.map((h) => cell('th', h)).join('')}</tr></thead>` : '';
  const tbody = rows.map((r) => `<tr>${r.map((c, i) => cell(i === 0 && o.rowHeads ? 'th' : 'td', c)).join('')}</tr>`).join('');
  return `<table${o.cls ? ` class="${escapeHtml(o.cls)}"` : ''}>${cap}${thead}<tbody>${tbody}</tbody></table>`;
}

/** A numeric cell, or an en dash when the value is unknown. */
export function numCell(v: number | undefined | null, fmt: (x: number) => string = String): Cell {
  return v === undefined || v === null ? { text: '–', num: true, cls: 'missing' } : { text: fmt(v), num: true };
}

/** A <section> with a stable id and a heading. */
export function section(id: string, heading: string, body: string): string {
  return `<section id="${escapeHtml(id)}" class="report-section"><h2>${escapeHtml(heading)}</h2>${body}</section>`;
}

/** A paragraph of plain text. */
export function para(text: string, cls?: string): string {
  return `<p${cls ? ` class="${escapeHtml(cls)}"` : ''}>${escapeHtml(text)}</p>`;
}

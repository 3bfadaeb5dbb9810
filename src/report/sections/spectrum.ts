import { spectrumChart } from '../charts/spectrum.js';
import { escapeHtml, idToken } from '../escape.js';
import { countText, probabilityText } from '../format.js';
import type { SpectrumView } from '../model.js';
import { type Cell, section, table } from '../table.js';

/** Lines per table; longer spectra are split into up to 3 tables side by side. */
const ROWS_PER_TABLE = 16;

function sideName(side: string): string {
  if (side === 'x') return 'X side: rowspace(HX)';
  if (side === 'z') return 'Z side: rowspace(HZ)';
  if (side === 'h') return 'rowspace(H)';
  return `side ${side}`;
}

function matrixName(side: string): string {
  return side === 'x' || side === 'z' ? `H${side.toUpperCase()}` : side === 'h' ? 'H' : side;
}

/** One sentence on how the words were found and whether the list is complete. */
export function completenessText(s: SpectrumView): string {
  const how =
    s.method === 'exhaustive' ? `exhaustive enumeration${s.iterations !== undefined ? ` (${countText(s.iterations)} combinations)` : ''}`
    : s.method === 'isd' ? `information-set search${s.iterations !== undefined ? ` (${countText(s.iterations)} information sets)` : ''}`
    : s.method ? s.method : 'search';
  const total = s.wordCount ?? s.counts.reduce((a, b) => a + b, 0);
  const head = `${countText(total)} word${total === 1 ? '' : 's'} of weight ≤ ${s.maxWeight} found by ${how}`;
  const known = s.miss.filter((m): m is number => m !== null);
  const worst = known.length > 0 ? Math.max(...known) : null;
  let tail: string;
  if (s.truncated) tail = 'stopped at the word cap: the list is incomplete';
  else if (s.complete === true || (worst === 0 && known.length === s.maxWeight)) tail = `complete: every word of weight ≤ ${s.maxWeight} is listed`;
  else if (worst !== null) {
    const at = s.miss.indexOf(worst) + 1;
    tail = `not proven complete: a given word may have been missed with probability up to ${probabilityText(worst)} (at weight ${at})`;
  } else tail = 'completeness not stated';
  const stop = s.stopReason ? `; stopped: ${s.stopReason}` : '';
  return `${head}${stop}; ${tail}.`;
}

/**
 * Lines of the weight table: one per weight, except that a run of weights proven empty (no word and miss
 * probability 0) shares one line "a–b".
 */
export function weightLines(s: SpectrumView): { from: number; to: number }[] {
  const empty = (w: number) => (s.counts[w - 1] ?? 0) === 0 && s.miss[w - 1] === 0;
  const lines: { from: number; to: number }[] = [];
  for (let w = 1; w <= s.maxWeight; w++) {
    const last = lines[lines.length - 1];
    if (last && empty(w) && empty(last.to) && last.to === w - 1) last.to = w;
    else lines.push({ from: w, to: w });
  }
  return lines;
}

/** Weight | words | rows of H | miss probability (split in blocks side by side when long). */
function weightTable(s: SpectrumView): string {
  const hasRows = s.originals.some((c) => c > 0);
  const head: Cell[] = [{ text: 'weight', num: true }, { text: 'words', num: true }, ...(hasRows ? [{ text: `rows of ${matrixName(s.side)}`, num: true }] : []), { text: 'miss probability', num: true }];
  const lines = weightLines(s);
  const per = Math.ceil(lines.length / Math.min(3, Math.max(1, Math.ceil(lines.length / ROWS_PER_TABLE))));
  const tables: string[] = [];
  for (let i = 0; i < lines.length; i += per) {
    const rows = lines.slice(i, i + per).map(({ from, to }): Cell[] => {
      const m = s.miss[from - 1] ?? null;
      return [
        { text: from === to ? String(from) : `${from}–${to}`, num: true },
        { text: countText(s.counts[from - 1] ?? 0), num: true },
        ...(hasRows ? [{ text: countText(s.originals[from - 1] ?? 0), num: true }] : []),
        m === null ? { text: '?', num: true, cls: 'missing' } : { text: probabilityText(m), num: true, cls: m > 0 ? 'open' : '' },
      ];
    });
    tables.push(table(head, rows, { cls: 'weights' }));
  }
  return `<div class="table-row">${tables.join('')}</div>`;
}

export function spectrumSection(spectra: readonly SpectrumView[]): string {
  const used = new Set<string>();
  const parts = spectra.map((s) => {
    let id = `spectrum-${idToken(s.side)}`;
    for (let i = 2; used.has(id); i++) id = `spectrum-${idToken(s.side)}-${i}`;
    used.add(id);
    return (
      `<div class="side" data-side="${escapeHtml(s.side)}"><h3>${escapeHtml(sideName(s.side))}</h3>` +
      `<p>${escapeHtml(completenessText(s))}</p>` +
      `<figure>${spectrumChart(s, `chart-${id}`)}</figure>${weightTable(s)}</div>`
    );
  });
  const intro =
    '<p class="explain">Low-weight words of the row spaces (candidate redundant checks). The miss probability of a weight is the ' +
    'chance that one given word of that weight was not found; 0 means the weight was searched exhaustively.</p>';
  return section('spectrum', 'Weight spectrum of the found words', intro + parts.join(''));
}

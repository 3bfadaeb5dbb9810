import { escapeHtml } from '../escape.js';
import type { ProvenanceEntry, SourceView } from '../model.js';
import { type Cell, section, table } from '../table.js';

/** The last path component (the full paths are in the table of input files). */
function baseName(path: string): string {
  return path.split(/[\\/]/).pop() || path;
}

export function provenanceSection(entries: readonly ProvenanceEntry[], sources: readonly SourceView[], version: string, command: string | undefined): string {
  let body = `<p class="meta">Rendered by overcheck ${escapeHtml(version)}${command ? ` with <code>${escapeHtml(command)}</code>` : ''}.</p>`;
  if (sources.length > 0) {
    body += table(
      ['input file', 'recognised as', 'SHA-256'],
      sources.map((s): Cell[] => [s.file, s.kind, s.sha256 ? { html: `<code class="hash">${escapeHtml(s.sha256)}</code>` } : { text: '–', cls: 'missing' }]),
      { cls: 'sources' },
    );
  }
  const shown = entries;
  if (shown.length > 0) {
    body += table(
      ['from', 'item', 'value'],
      shown.map((e, i): Cell[] => [i > 0 && shown[i - 1]!.source === e.source ? '' : baseName(e.source), e.key, { html: `<code>${escapeHtml(e.value)}</code>` }]),
      { cls: 'provenance' },
    );
  }
  return section('provenance', 'Provenance', body);
}

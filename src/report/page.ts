import { escapeHtml } from './escape.js';
import type { ReportModel } from './model.js';
import { budgetSection } from './sections/budget.js';
import { codeSection } from './sections/code.js';
import { cyclesSection } from './sections/cycles.js';
import { distanceSection } from './sections/distance.js';
import { provenanceSection } from './sections/provenance.js';
import { spectrumSection } from './sections/spectrum.js';
import { trialSection } from './sections/trial.js';
import { REPORT_CSS } from './style.js';

/** The sections of a report in page order: stable id, heading, and the markup when present. */
export function reportSections(m: ReportModel): { id: string; heading: string; html: string | null }[] {
  return [
    { id: 'code', heading: 'Code', html: m.code ? codeSection(m.code, m.distance) : null },
    { id: 'spectrum', heading: 'Weight spectrum', html: m.spectra.length > 0 ? spectrumSection(m.spectra) : null },
    { id: 'distance', heading: 'Distance bounds', html: m.distance && m.distance.sides.length > 0 ? distanceSection(m.distance) : null },
    { id: 'cycles', heading: 'Cycle census', html: m.cycles.length > 0 ? cyclesSection(m.cycles) : null },
    { id: 'error-rate', heading: 'Logical error rate', html: m.trial && m.trial.series.length > 0 ? trialSection(m.trial) : null },
    { id: 'budget', heading: 'Conditioning budget', html: m.condition ? budgetSection(m.condition) : null },
    { id: 'provenance', heading: 'Provenance', html: provenanceSection(m.provenance, m.sources, m.version, m.command) },
  ];
}

/**
 * The whole report as one self-contained HTML document (pure): inline CSS and SVG, no script, and a
 * content security policy that forbids loading anything, so the file opens offline and prints on A4.
 */
export function renderReport(m: ReportModel): string {
  const sections = reportSections(m);
  const present = sections.filter((s) => s.html !== null);
  const absent = sections.filter((s) => s.html === null);
  const nav = `<nav><ul>${present.map((s) => `<li><a href="#${s.id}">${escapeHtml(s.heading)}</a></li>`).join('')}</ul></nav>`;
  const missing = absent.length > 0 ? `<p class="sub">Not in these results: ${escapeHtml(absent.map((s) => s.heading.toLowerCase()).join(', '))}.</p>` : '';
  const notes =
    m.notes.length > 0 ? `<div class="notes" id="notes"><strong>Notes on the inputs</strong><ul>${m.notes.map((n) => `<li>${escapeHtml(n)}</li>`).join('')}</ul></div>` : '';
  return [
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:">`,
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<meta name="generator" content="overcheck ${escapeHtml(m.version)}">`,
    `<title>${escapeHtml(m.subtitle ? `${m.title}: ${m.subtitle}` : m.title)}</title>`,
    `<style>${REPORT_CSS}</style>`,
    '</head>',
    '<body>',
    `<header><h1>${escapeHtml(m.title)}</h1>${m.subtitle ? `<p class="subtitle"><code>${escapeHtml(m.subtitle)}</code></p>` : ''}${nav}${missing}</header>`,
    notes,
    '<main>',
    ...present.map((s) => s.html!),
    '</main>',
    `<footer>overcheck ${escapeHtml(m.version)} · ${m.sources.length} input file${m.sources.length === 1 ? '' : 's'}</footer>`,
    '</body>',
    '</html>',
    '',
  ].join('\n');
}

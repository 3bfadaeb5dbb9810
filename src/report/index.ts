/** HTML report: result objects → one self-contained HTML page (pure; the CLI reads and writes the files). */
export { collectReport, resultKind, RUN_KIND, type CollectOptions, type ReportInput, type ResultKind } from './read/collect.js';
export { renderReport, reportSections } from './page.js';
export type { ReportModel } from './model.js';

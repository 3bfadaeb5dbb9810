/**
 * The page's only stylesheet (inlined). Light background, system serif/sans fonts (no web fonts), charts
 * scaled to the text column; print rules for A4: 15 mm margins, sections and figures kept whole, no
 * background colours needed for meaning (bars also differ by pattern, series by dash and marker).
 */
export const REPORT_CSS = `
:root { color-scheme: light; }
* { box-sizing: border-box; }
html { background: #ffffff; }
body { margin: 0 auto; max-width: 190mm; padding: 12px 20px 40px; color: #1a1a1a; background: #ffffff;
  font: 14px/1.45 "DejaVu Sans", "Helvetica Neue", Arial, sans-serif; }
header { border-bottom: 2px solid #0072B2; margin-bottom: 8px; }
h1 { font-size: 22px; margin: 8px 0 4px; }
h2 { font-size: 17px; margin: 22px 0 6px; padding-bottom: 2px; border-bottom: 1px solid #d0d0d0; }
h3 { font-size: 14.5px; margin: 14px 0 4px; }
p { margin: 4px 0 8px; }
.sub, .meta, .explain { color: #555555; font-size: 12.5px; }
nav ul { list-style: none; padding: 0; margin: 4px 0; display: flex; flex-wrap: wrap; gap: 4px 14px; font-size: 12.5px; }
nav a { color: #0a4f8a; text-decoration: none; }
.notes { border-left: 3px solid #E69F00; background: #fff8ea; padding: 4px 10px; margin: 8px 0; font-size: 12.5px; }
.notes ul { margin: 2px 0; padding-left: 18px; }
.subtitle { margin: 0 0 4px; font-size: 14px; }
.subtitle code { font-size: 13px; }
.facts { font-size: 15px; }
.facts span { white-space: nowrap; }
.facts span + span::before { content: "·"; color: #999999; margin: 0 10px; }
.params { font-weight: bold; font-size: 17px; }
.ok { color: #006b4a; }
.bad, .open { color: #a33f00; }
.missing { color: #999999; }
figure { margin: 6px 0 8px; }
svg.chart { display: block; width: 100%; max-width: 170mm; height: auto; margin: 0 auto; font-family: "DejaVu Sans", Arial, sans-serif; }
svg .axis, svg .frame { stroke: #333333; stroke-width: 1; }
svg .tick { stroke: #333333; stroke-width: 1; }
svg .grid { stroke: #e3e3e3; stroke-width: 0.8; }
svg .grid.minor { stroke: #f1f1f1; }
svg .tick-label { font-size: 11px; fill: #333333; }
svg .axis-title { font-size: 12px; fill: #1a1a1a; }
svg .bar-label { font-size: 9.5px; fill: #333333; }
svg .miss { font-size: 9px; fill: #006b4a; }
svg .miss.open { fill: #a33f00; }
svg .legend { font-size: 11px; fill: #1a1a1a; }
svg .legend.note { fill: #555555; font-size: 10px; }
svg .legend-bg { fill: #ffffff; fill-opacity: 0.9; stroke: #cccccc; stroke-width: 0.8; }
svg .empty { font-size: 13px; fill: #777777; }
table { border-collapse: collapse; margin: 6px 0 10px; font-size: 12.5px; }
th, td { padding: 2px 8px; border-bottom: 1px solid #e2e2e2; text-align: left; vertical-align: top; }
thead th { border-bottom: 1.5px solid #555555; font-weight: 600; }
tbody th { font-weight: 600; }
.num { text-align: right; font-variant-numeric: tabular-nums; }
.table-row { display: flex; flex-wrap: wrap; gap: 0 24px; align-items: flex-start; }
table.weights th, table.weights td { padding: 1px 8px; }
td.num { white-space: nowrap; }
code.hash { word-break: break-all; }
table.provenance td:nth-child(3) { max-width: 110mm; overflow-wrap: anywhere; }
code { font-family: "DejaVu Sans Mono", Menlo, Consolas, monospace; font-size: 11.5px; }
ul.witness { font-size: 12.5px; padding-left: 18px; }
footer { margin-top: 24px; color: #777777; font-size: 11.5px; }
@page { size: A4; margin: 15mm; }
@media print {
  body { max-width: none; padding: 0; font-size: 10.5pt; }
  nav { display: none; }
  h2 { break-after: avoid; page-break-after: avoid; }
  h3 { break-after: avoid; page-break-after: avoid; }
  figure, table, .side, .notes { break-inside: avoid; page-break-inside: avoid; }
  svg.chart { max-width: 175mm; }
  a { color: inherit; }
  .notes { background: none; }
}
`;

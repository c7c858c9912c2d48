/**
 * The report's stylesheet: warm paper, slate ink, teal for daylight, amber for lamplight.
 * Screens get the interactive page; print gets a cover and one page per stone (CSS Paged
 * Media Level 3 for the margin boxes, CSS Fragmentation Level 3 for the breaks).
 */
export const REPORT_CSS = `
:root { --paper: #f6f3ec; --card: #fffdf8; --ink: #1e2a32; --muted: #5d6b73; --rule: #d9d2c3;
  --day: #2c6e73; --lamp: #b5651d; --pass: #2f7d4f; --fail: #a33b2b; }
* { box-sizing: border-box; }
html { -webkit-text-size-adjust: 100%; }
body { margin: 0; background: var(--paper); color: var(--ink); overflow-wrap: anywhere;
  font: 15px/1.45 "Source Sans 3", "Segoe UI", system-ui, sans-serif; }
header.lot { padding: 26px 40px 14px; border-bottom: 3px double var(--rule); }
header.lot .kicker { margin: 0 0 4px; color: var(--muted); font-size: 12.5px; letter-spacing: .08em; text-transform: uppercase; }
header.lot h1 { font: 600 28px/1.2 Georgia, "Iowan Old Style", serif; margin: 0 0 8px; letter-spacing: .01em; }
dl.who { display: flex; flex-wrap: wrap; gap: 4px 26px; margin: 0 0 6px; font-size: 14px; }
dl.who div { display: flex; gap: 6px; } dl.who dt { color: var(--muted); } dl.who dd { margin: 0; font-weight: 600; }
header.lot .note { margin: 6px 0 0; max-width: 70em; font-style: italic; white-space: pre-line; }
.meta { color: var(--muted); font-size: 13px; padding: 8px 40px 0; }
main { padding: 12px 40px 40px; max-width: 1400px; }
h2 { font: 600 19px/1.3 Georgia, serif; margin: 28px 0 10px; border-bottom: 1px solid var(--rule); padding-bottom: 4px; }
h3 { font-size: 15px; margin: 0 0 6px; }
.card { background: var(--card); border: 1px solid var(--rule); border-radius: 6px; padding: 14px 16px; margin: 12px 0; min-width: 0; }
.grid2 { display: grid; grid-template-columns: repeat(auto-fit, minmax(min(420px, 100%), 1fr)); gap: 14px; }
.grid2 > * { min-width: 0; }
.chart { position: relative; height: 320px; }
.chart canvas { max-width: 100%; }
.tools { display: flex; flex-wrap: wrap; gap: 6px 16px; align-items: center; margin: 0 0 8px; font-size: 13.5px; }
.tools input { font: inherit; padding: 3px 8px; border: 1px solid var(--rule); border-radius: 4px; width: 16em; max-width: 60vw; background: #fff; }
.hint, .legend { color: var(--muted); font-size: 12.5px; margin: 6px 0 0; }
.table-box { overflow-x: auto; max-width: 100%; }
@media screen { tr.off-page { display: none; } }
.pager { white-space: nowrap; } .pager button { font: inherit; } .table-box + .tools { margin: 8px 0 0; }
table.summary { border-collapse: collapse; width: 100%; font-variant-numeric: tabular-nums; font-size: 13.5px; }
table.summary th { text-align: left; font-weight: 600; color: var(--muted); border-bottom: 2px solid var(--rule);
  padding: 6px 8px; cursor: pointer; white-space: nowrap; user-select: none; }
table.summary th[aria-sort="ascending"]::after { content: " ▲"; }
table.summary th[aria-sort="descending"]::after { content: " ▼"; }
table.summary td { padding: 5px 8px; border-bottom: 1px solid #ebe5d8; vertical-align: middle; overflow-wrap: normal; }
table.summary tbody tr:hover { background: #f1ece1; }
table.summary tbody tr.open { background: #e8f0ef; }
td.num, table.summary td:first-child { text-align: right; white-space: nowrap; }
table.summary td:first-child { text-align: left; }
.swatches { display: inline-flex; border: 1px solid #0002; border-radius: 3px; overflow: hidden; }
.swatches span { display: inline-block; width: 26px; height: 18px; }
.big .swatches span { width: 90px; height: 60px; }
.pass { color: var(--pass); font-weight: 600; }
.fail { color: var(--fail); font-weight: 600; }
.undecided { color: #8a6d1f; font-weight: 600; }
.mark { color: var(--lamp); cursor: help; }
.tag { display: inline-block; font-size: 11px; padding: 0 6px; border-radius: 9px; background: #efe7d6; color: #6b5526; cursor: help; }
.day { color: var(--day); } .lamp { color: var(--lamp); }
button.detail { font: inherit; font-size: 12px; border: 1px solid var(--rule); background: #fff; border-radius: 4px; padding: 2px 8px; cursor: pointer; }
dl.facts { display: grid; grid-template-columns: minmax(0, max-content) minmax(0, 1fr); gap: 2px 14px; margin: 0; font-size: 13.5px; }
dl.facts dt { color: var(--muted); } dl.facts dd { margin: 0; }
.errors li { margin: 4px 0; font-family: ui-monospace, "SFMono-Regular", monospace; font-size: 12.5px; }
.caution { border-left: 4px solid var(--lamp); }
footer { color: var(--muted); font-size: 12.5px; padding: 10px 40px 40px; }
svg.plot { width: 100%; height: auto; display: block; font: 10px "Source Sans 3", "Segoe UI", system-ui, sans-serif; fill: #5d6b73; }
svg.plot .axis { font-size: 11px; fill: var(--ink); }
svg.plot.shared-defs { position: absolute; width: 0; height: 0; overflow: hidden; }
figure { margin: 0; }
.plot-box figcaption { font-size: 12px; font-weight: 600; margin: 0 0 2px; }
.print-only, .stones { display: none; }
@media (max-width: 640px) {
  header.lot { padding: 18px 14px 10px; } header.lot h1 { font-size: 22px; }
  .meta { padding: 8px 14px 0; } main { padding: 8px 12px 28px; } footer { padding: 10px 14px 28px; }
  .card { padding: 10px; } .chart { height: 260px; }
  .big .swatches span { width: 64px; height: 44px; }
}
@media print {
  body { background: #fff; font-size: 10pt; }
  .screen-only, button.detail, .noprint, .tools, footer { display: none !important; }
  .print-only { display: block; }
  .meta, main { padding: 0; } header.lot { padding: 0 0 8px; }
  .card { break-inside: avoid; border-color: #ddd; padding: 8px 10px; margin: 8px 0; }
  h2, h3, figcaption { break-after: avoid; }
  .table-box { overflow: visible; }
  table.summary { font-size: 8pt; } table.summary th { padding: 3px 4px; } table.summary td { padding: 2px 4px; }
  table.summary tr { break-inside: avoid; }
  .card.summary-card { break-inside: auto; }
  .lot-figures { display: grid; grid-template-columns: 1fr 1fr; gap: 8mm; break-inside: avoid; }
  .methods { font-size: 8.5pt; break-inside: auto; }
  .stones { display: block; }
  .stone { break-before: page; break-inside: avoid; }
  .stone-name { margin: 0 0 4mm; font-size: 15pt; }
  .stone-name small { font: 9pt sans-serif; color: var(--muted); margin-left: 4mm; }
  .stone-top { display: flex; gap: 6mm; align-items: flex-start; }
  .lights { display: flex; flex-wrap: wrap; gap: 2.5mm; width: 70mm; flex: none; }
  .light { text-align: center; font-size: 8pt; }
  .light .swatch { display: block; width: 15mm; height: 12mm; border: 1px solid #0003; border-radius: 2px; }
  table.numbers { border-collapse: collapse; font-size: 8.5pt; font-variant-numeric: tabular-nums; flex: 1; }
  table.numbers th, table.numbers td { padding: 1px 5px; border-bottom: 1px solid #e4ded0; text-align: right; }
  table.numbers th:first-child, table.numbers td:first-child { text-align: left; }
  table.bands td:last-child, table.bands th:last-child { text-align: left; }
  .stone dl.facts { margin: 3mm 0; font-size: 9pt; }
  .stone .legend { margin: 0 0 3mm; }
  .stone-charts { display: grid; grid-template-columns: 1fr 1fr; gap: 3mm 6mm; }
  .stone-charts svg.plot { max-height: 60mm; }
  * { -webkit-print-color-adjust: exact; print-color-adjust: exact; }
}
`;

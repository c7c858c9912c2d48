/** The report's stylesheet: warm paper, slate ink, teal for daylight, amber for lamplight. */
export const REPORT_CSS = `
:root { --paper: #f6f3ec; --card: #fffdf8; --ink: #1e2a32; --muted: #5d6b73; --rule: #d9d2c3;
  --day: #2c6e73; --lamp: #b5651d; --pass: #2f7d4f; --fail: #a33b2b; }
* { box-sizing: border-box; }
body { margin: 0; background: var(--paper); color: var(--ink);
  font: 15px/1.45 "Source Sans 3", "Segoe UI", system-ui, sans-serif; }
header.lot { padding: 28px 40px 18px; border-bottom: 3px double var(--rule); }
header.lot h1 { font: 600 28px/1.2 Georgia, "Iowan Old Style", serif; margin: 0 0 6px; letter-spacing: .01em; }
header.lot .meta { color: var(--muted); font-size: 13px; }
main { padding: 18px 40px 40px; max-width: 1400px; }
h2 { font: 600 19px/1.3 Georgia, serif; margin: 28px 0 10px; border-bottom: 1px solid var(--rule); padding-bottom: 4px; }
.card { background: var(--card); border: 1px solid var(--rule); border-radius: 6px; padding: 14px 16px; margin: 12px 0; }
.grid2 { display: grid; grid-template-columns: repeat(auto-fit, minmax(420px, 1fr)); gap: 14px; }
.chart { position: relative; height: 320px; }
table.summary { border-collapse: collapse; width: 100%; font-variant-numeric: tabular-nums; font-size: 13.5px; }
table.summary th { text-align: left; font-weight: 600; color: var(--muted); border-bottom: 2px solid var(--rule);
  padding: 6px 8px; cursor: pointer; white-space: nowrap; user-select: none; }
table.summary th[aria-sort="ascending"]::after { content: " ▲"; }
table.summary th[aria-sort="descending"]::after { content: " ▼"; }
table.summary td { padding: 5px 8px; border-bottom: 1px solid #ebe5d8; vertical-align: middle; }
table.summary tbody tr:hover { background: #f1ece1; }
table.summary tbody tr.open { background: #e8f0ef; }
td.num { text-align: right; white-space: nowrap; }
.swatches { display: inline-flex; border: 1px solid #0002; border-radius: 3px; overflow: hidden; }
.swatches span { display: inline-block; width: 26px; height: 18px; }
.big .swatches span { width: 90px; height: 60px; }
.pass { color: var(--pass); font-weight: 600; }
.fail { color: var(--fail); font-weight: 600; }
.tag { display: inline-block; font-size: 11px; padding: 0 6px; border-radius: 9px; background: #efe7d6; color: #6b5526; }
.day { color: var(--day); } .lamp { color: var(--lamp); }
button.detail { font: inherit; font-size: 12px; border: 1px solid var(--rule); background: #fff; border-radius: 4px; padding: 2px 8px; cursor: pointer; }
dl.facts { display: grid; grid-template-columns: max-content 1fr; gap: 2px 14px; margin: 0; font-size: 13.5px; }
dl.facts dt { color: var(--muted); }
.errors li { margin: 4px 0; font-family: ui-monospace, "SFMono-Regular", monospace; font-size: 12.5px; }
.caution { border-left: 4px solid var(--lamp); }
footer { color: var(--muted); font-size: 12.5px; padding: 10px 40px 40px; }
@media print {
  body { background: #fff; } button.detail { display: none; } .chart { height: 260px; }
  .card { break-inside: avoid; } header.lot { padding: 10px 0; } main, footer { padding: 0; }
}
`;

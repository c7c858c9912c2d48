/**
 * The static HTML report: a pure function from report data (and the chart.js bundle text)
 * to one self-contained HTML string that works offline. Every user string is escaped.
 *
 * @module
 */
import { escapeHtml as e, jsonForScriptParts, scriptForInline } from "./escape.ts";
import type { ReportInput, ReportRow } from "./report_data.ts";
import { REPORT_CSS } from "./report_style.ts";
import { REPORT_SCRIPT } from "./report_script.ts";
import { MARKS } from "./marks.ts";
import { scriptHash } from "./script_hash.ts";
import { renderStonePage, xyTitle } from "./stone_page.ts";
import { SvgDefs } from "./svg_chart.ts";
import { renderLotFigures } from "./lot_figures.ts";

/** Cautions for a grower's own (internal) report: measurement limits and workshop hazards. */
const CAUTIONS_INTERNAL = [
  "Colour numbers are measurement aids for comparing and controlling production, not a grading, identification or appraisal of a gemstone.",
  "UV inspection lamps harm eyes and skin; furnaces, flame-fusion burners, flux melts and cleaning acids (HF above all) are dangerous; some specimens are radioactive or toxic when worked. Follow local regulations, your institution's safety rules and licensed practice.",
];

/** The caution a client's colour statement carries. */
const CAUTIONS_CLIENT = [
  "These colour figures are a measurement aid: they describe the measured spectrum under the stated lights and observers. They are not a grading, identification, origin determination or appraisal of the stone.",
];

const METHODS = [
  "Tristimulus values per CIE 15:2018 on the 1 nm grid 360–830 nm (Y = 100 for a perfect transmitter); measured data carried to 1 nm by Sprague (uniform steps, CIE 167:2005), monotone cubic (irregular steps) or cubic Lagrange (10/20 nm, the ASTM E2022 construction of E308 weights); end values extended as constants outside the measured range.",
  "CIE 1931 2° and CIE 1964 10° observers (CIE 15:2018 Tables 1–2); illuminant A from its definition, D65 and C tabulated, other D-series from the daylight recipe.",
  "CIELAB relative to the white of the illuminant used; the colour change compares each light under its own white (or after CAT16/Bradford adaptation when set). ΔE00 per Sharma, Wu & Dalal, Color Res. Appl. 30, 21 (2005).",
  "Path-length rescaling by Beer–Lambert on the measured absorbance, or with both Fresnel surfaces removed and restored using the host's refractive index (incoherent slab formula).",
  `Swatches: Bradford adaptation to D65, sRGB (IEC 61966-2-1); colours outside sRGB are marked ${MARKS.outOfGamut.symbol} and shown with reduced CIELAB chroma at constant L* and hue.`,
  "Bands: fitted in wavenumber only where the measurement carries information (photometric floor, absorbance limit and clipped stretches left out and greyed), as Gaussians (Lorentzian below 150 cm⁻¹ FWHM) plus a baseline with a λ⁻⁴ scatter term and an Urbach-type edge term, by separable least squares (variable projection, Golub & Pereyra 1973); a band is added or split only where the residual shows structure and the BIC prefers it; 1σ standard errors from the covariance, parameters at a bound held. Assignments are hints from a catalogue whose figures are marked published or from memory.",
  "Inputs: delimited text of many layouts and JCAMP-DX 4.24 (McDonald & Wilks, Appl. Spectrosc. 42, 151, 1988; AFFN and the SQZ/DIF/DUP forms, Y-checks verified). Each result names its file and where its thickness, path, host and polarisation came from (option > sample sheet > file > settings > default); files written by crystint convert record the conversion and resampling in labelled ##$ records.",
  "A marked colour change (tag) means |Δh| at or above the threshold in the settings with C*ab above a floor under both lights — common-practice thresholds, not a standard.",
];

/** Summary rows shown in the page; larger batches are summarised in results.csv/json. */
export const ROW_LIMIT = 5000;
/**
 * Above this many rows the summary table is shown in pages of {@linkcode PAGE_ROWS} on screen
 * (our choice, from the layout time measured in Chromium: see DEVELOPERS.md).
 */
export const PAGED_ABOVE_ROWS = 300;
/** Rows on one screen page of a long summary table (our choice). */
export const PAGE_ROWS = 250;

/** Most stones given a printed page of their own (the rest stay in results.json). */
export const STONE_PAGE_LIMIT = 1000;

/** A CSS string literal for any text: every character but plain letters and digits escaped. */
export function cssString(text: string): string {
  return `"${
    [...text].map((c) => /[A-Za-z0-9 .,_-]/.test(c) ? c : `\\${c.codePointAt(0)!.toString(16)} `)
      .join("")
  }"`;
}

/** The uncertainty method, said when any sample carries uncertainties. */
const UNCERTAINTY_METHOD =
  "Uncertainties: standard uncertainties (k = 1, shown as ± σ) by first-order propagation (GUM, JCGM 100:2008) of photometric noise, a zero/100 % level error correlated across wavelengths, a wavelength-scale shift and the thickness and path tolerances, through the linear weight route to L*a*b*; the a*b* charts draw the 95 % coverage ellipse of each light's (a*, b*) (JCGM 102:2011). The target verdict weighs the probability that the true colour lies within the tolerance.";

/** Text of a value with its standard uncertainty, when there is one. */
function pm(v: number, digits: number, sd: number | null | undefined, sdDigits = digits): string {
  const shown = v.toFixed(digits);
  return typeof sd === "number" && Number.isFinite(sd)
    ? `${shown} ± ${sd.toFixed(sdDigits)}`
    : shown;
}

function lch([L, C, h]: [number, number, number], sd?: [number, number, number] | null): string {
  // the hue's σ keeps a decimal: a whole-degree σ would often read "± 0"
  return `${pm(L, 1, sd?.[0])} · ${pm(C, 1, sd?.[1])} · ${pm(h, 0, sd?.[2], 1)}°`;
}

/** Sort weight of a target cell: passes first, then undecided, then fails. */
function targetWeight(t: NonNullable<ReportRow["target"]>): number {
  const verdict = t.verdict ?? (t.pass ? "pass" : "fail");
  return (verdict === "pass" ? 0 : verdict === "undecided" ? 500 : 1000) + t.dE00;
}

/** The tooltip of a target cell: what was missed, and the pass probability. */
export function targetTitle(t: NonNullable<ReportRow["target"]>): string {
  return t.passProbability === undefined
    ? t.words
    : `${t.words}; probability of passing ${(100 * t.passProbability).toFixed(1)} %`;
}

/** A table cell sorted by `value`, which is written out only where the text differs from it. */
function sortCell(cls: string, value: number | string, text: string): string {
  return `<td class="${cls}"${String(value) === text ? "" : ` data-value="${e(String(value))}"`}>${
    e(text)
  }</td>`;
}

/** Page buttons of a long summary table (one set above it, one below). */
function pager(rows: number): string {
  return `<span class="pager"><button type="button" class="page-prev" disabled>‹ previous</button> ` +
    `<span class="page-info">rows 1–${PAGE_ROWS} of ${rows}</span> ` +
    `<button type="button" class="page-next">next ›</button></span>`;
}

function row(r: ReportRow, hasDetail: boolean, offPage = false): string {
  const t = r.target;
  const target = t
    ? `<span class="${t.pass ? "pass" : "fail"}">${t.pass ? "pass" : "fail"}</span> ${
      t.dE00.toFixed(2)
    }${t.verdict ? ` · <span class="${t.verdict}">${t.verdict}</span>` : ""}`
    : "—";
  return `<tr data-index="${r.index}"${offPage ? ` class="off-page"` : ""}>
<td${r.outOfGamut ? ` data-value="${e(r.sample)}"` : ""}>${e(r.sample)}${
    r.outOfGamut
      ? ` <span class="mark" title="${e(MARKS.outOfGamut.hint)}">${MARKS.outOfGamut.symbol}</span>`
      : ""
  }</td>
<td data-value="${r.index}"><span class="swatches"><span style="background:${
    e(r.swatchFrom)
  }" title="${e(r.from)}"></span><span style="background:${e(r.swatchTo)}" title="${
    e(r.to)
  }"></span></span></td>
${sortCell("num", r.pathMm ?? "", r.pathMm === null ? "—" : r.pathMm.toFixed(1))}
<td class="num day" data-value="${r.lchFrom[0]}">${lch(r.lchFrom, r.lchFromSd)}</td>
<td class="num lamp" data-value="${r.lchTo[0]}">${lch(r.lchTo, r.lchToSd)}</td>
${sortCell("num", r.dE00, pm(r.dE00, 2, r.dE00Sd))}
<td class="num" data-value="${r.dh}">${r.dh.toFixed(1)}°${
    r.marked
      ? ` <span class="tag" title="${e(MARKS.marked.hint)}">${MARKS.marked.symbol}</span>`
      : ""
  }</td>
<td data-value="${t ? targetWeight(t) : ""}" title="${e(t ? targetTitle(t) : "")}">${target}</td>
<td data-value="${r.dopant ? parseFloat(r.dopant) : ""}">${e(r.dopant ?? "—")}</td>
<td>${hasDetail ? `<button class="detail" data-index="${r.index}">details</button>` : ""}</td>
</tr>`;
}

function lotHeader(input: ReportInput, count: number, title: string): string {
  const rep = input.report;
  const who: [string, string | undefined][] = [
    ["lab", rep?.lab],
    ["client", rep?.client],
    ["operator", rep?.operator],
    ["date", rep?.date],
  ];
  const facts = who.filter(([, v]) => v).map(([k, v]) =>
    `<div><dt>${e(k)}</dt><dd>${e(v)}</dd></div>`
  ).join("");
  return `<header class="lot">
<p class="kicker">crystint colour report · ${count} sample${count === 1 ? "" : "s"}</p>
<h1>${e(title)}</h1>
${facts ? `<dl class="who">${facts}</dl>` : ""}
${rep?.note ? `<p class="note">${e(rep.note)}</p>` : ""}
</header>`;
}

/**
 * Renders the report in consecutive parts: written one after another they are the page (the
 * largest, stone pages and page data, are never joined into one string).
 *
 * @param input Report data (see report_data.ts).
 * @param chartJs Source of chart.js's UMD bundle, inlined so the page works offline.
 */
export function renderReportParts(input: ReportInput, chartJs: string): string[] {
  const first = input.rows[0];
  const from = first?.from ?? "D65", to = first?.to ?? "A", obs = first?.observer ?? "10";
  const settings = Object.entries(input.settingsSummary).map(([k, v]) => `${e(k)}: ${e(v)}`).join(
    " · ",
  );
  const totals = input.totals ?? {
    samples: input.rows.length,
    targeted: input.rows.filter((r) => r.target).length,
    passed: input.rows.filter((r) => r.target?.pass).length,
  };
  const { passed, targeted } = totals;
  const count = totals.samples;
  const calibrations = input.calibrations ?? [];
  const title = input.report?.title || "Colour report";
  const client = input.report?.audience === "client";
  const uncertain = (input.uncertaintyNotes?.length ?? 0) > 0;
  const data = {
    rows: input.rows.slice(0, ROW_LIMIT),
    details: input.details,
    loci: input.loci,
    xyObserver: input.xyObserver,
    calibrations,
  };
  const limited = count > Object.keys(input.details).length;
  const printedStones = input.rows.filter((r) => r.index in input.details).slice(
    0,
    STONE_PAGE_LIMIT,
  );
  // the stone pages' chart frames and spectral locus, each defined once and drawn by reference
  const svgDefs = new SvgDefs();
  const stonePages = svgDefs.resolveAll(
    printedStones.map((r) => renderStonePage(r, input.details[r.index]!, input, svgDefs)),
  );
  const chartScript = scriptForInline(chartJs);
  // A long table is shown a page of rows at a time (filter and sort still act on all of it):
  // laying out 5000 rows took Chromium here 2.2 s; print shows every row.
  const tableRows = input.rows.slice(0, ROW_LIMIT);
  const pagedTable = tableRows.length > PAGED_ABOVE_ROWS;
  const csp = `default-src 'none'; script-src ${scriptHash(chartScript)} ${
    scriptHash(REPORT_SCRIPT)
  }; style-src 'unsafe-inline'; img-src data:`;
  const pageCss = `@page { size: A4; margin: 16mm 14mm 17mm;
  @top-left { content: ${cssString(title)}; font: 9pt Georgia, serif; color: #5d6b73; }
  @top-right { content: ${
    cssString(input.report?.date ?? "")
  }; font: 9pt Georgia, serif; color: #5d6b73; }
  @bottom-right { content: "page " counter(page) " of " counter(pages); font: 9pt sans-serif; color: #5d6b73; } }`;
  const head = `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="${csp}">
<title>${e(title)} — ${count} samples</title>
<style>${REPORT_CSS}
${pageCss}</style>${
    pagedTable
      ? "\n<noscript><style>tr.off-page { display: table-row; } .pager { display: none; }</style></noscript>"
      : ""
  }
</head>
<body>
<section class="cover">
${lotHeader(input, count, title)}
<div class="meta">crystint ${e(input.version)} · ${settings}${
    targeted ? ` · target met by ${passed} of ${targeted}` : ""
  }${
    input.verdicts
      ? ` (with uncertainty: ${input.verdicts.pass} pass, ${input.verdicts.undecided} undecided, ${input.verdicts.fail} fail)`
      : ""
  }${input.errors.length ? ` · ${input.errors.length} file(s) not processed` : ""}</div>
<main>
<section class="card caution"><strong>Read with care.</strong> ${
    (client ? CAUTIONS_CLIENT : CAUTIONS_INTERNAL).map(e).join(" ")
  }</section>

<h2>Summary</h2>
<div class="card summary-card">
<div class="tools"><label>Filter <input type="search" id="filter" placeholder="sample, file, pass, fail, dopant…" autocomplete="off"></label>
<span id="filter-count" aria-live="polite">${Math.min(count, ROW_LIMIT)} shown</span>
<span class="hint">Click a column heading to sort.</span>${
    pagedTable ? pager(tableRows.length) : ""
  }</div>
<div class="table-box">
<table class="summary" id="summary"${pagedTable ? ` data-page-rows="${PAGE_ROWS}"` : ""}>
<thead><tr>
<th data-key="sample">sample</th><th data-key="swatch">${e(from)} | ${
    e(to)
  }</th><th data-key="path">path (mm)</th>
<th data-key="from" class="day">L* · C* · h (${
    e(from)
  })</th><th data-key="to" class="lamp">L* · C* · h (${e(to)})</th>
<th data-key="dE00">ΔE00 ${e(from)}→${
    e(to)
  }</th><th data-key="dh">Δh</th><th data-key="target" title="sorts passes first, then by ΔE00">target (pass/fail, ΔE00${
    uncertain ? ", verdict" : ""
  })</th>
<th data-key="dopant">dopant</th><th class="noprint"></th>
</tr></thead>
<tbody>
${
    tableRows.map((r, k) => row(r, r.index in input.details, pagedTable && k >= PAGE_ROWS)).join(
      "\n",
    )
  }
</tbody>
</table>
</div>${pagedTable ? `\n<div class="tools">${pager(tableRows.length)}</div>` : ""}
<p class="legend">Colours computed for the ${
    e(obs)
  }° observer in the change columns. <span class="mark">${MARKS.outOfGamut.symbol}</span> ${
    e(MARKS.outOfGamut.text)
  }. <span class="tag">${MARKS.marked.symbol}</span> ${e(MARKS.marked.text)}.${
    uncertain
      ? " ± is one standard uncertainty (k = 1); the target verdict (pass, fail or undecided) follows the rule under Methods, its probability of passing in the cell's tooltip."
      : ""
  }</p>
${
    count > ROW_LIMIT
      ? `<p>The table shows the first ${ROW_LIMIT} of ${count} samples; results.csv and results.json hold all of them.</p>`
      : ""
  }
${
    limited
      ? `<p>Charts are included for the first ${input.detailLimit} samples; results.json holds all of them.</p>`
      : ""
  }
${
    printedStones.length < Object.keys(input.details).length
      ? `<p class="print-only">Pages are printed for the first ${printedStones.length} stones.</p>`
      : ""
  }
</div>

<h2>Lot overview</h2>
<div class="grid2 screen-only">
<div class="card"><h3>${
    e(xyTitle(input.xyObserver))
  }</h3><div class="chart"><canvas id="xy-all" aria-label="chromaticity diagram"></canvas></div></div>
<div class="card"><h3>a* b*, ${e(from)} → ${e(to)} (${
    e(obs)
  }° observer)</h3><p class="hint">Faint points: every stone. Hover a point or a summary row, or open a stone's details, to see its arrow and name.</p><div class="chart"><canvas id="ab-all" aria-label="a*b* plane"></canvas></div></div>
</div>
${renderLotFigures(input, from, to, obs)}

<section class="screen-only" id="detail-box">
<h2>Sample detail: <span id="detail-name"></span></h2>
<section id="detail" hidden>
<div class="grid2">
<div class="card big"><p><span class="swatches"><span id="detail-swatch-from"></span><span id="detail-swatch-to"></span></span></p>
<p><small id="detail-file"></small></p><dl class="facts" id="detail-facts"></dl></div>
<div class="card"><h3>Transmittance</h3><div class="chart"><canvas id="chart-spectrum"></canvas></div></div>
<div class="card"><h3>Absorption bands (fit in wavenumber)</h3><div class="chart"><canvas id="chart-bands"></canvas></div>
<div class="table-box"><table class="summary"><thead><tr><th>centre</th><th>FWHM</th><th>height</th><th>assignment hint</th></tr></thead><tbody id="bands-table"></tbody></table></div></div>
<div class="card"><h3>${
    e(xyTitle(input.xyObserver))
  }</h3><div class="chart"><canvas id="chart-xy"></canvas></div></div>
<div class="card"><h3>a* b*, ${e(from)} → ${e(to)} (${
    e(obs)
  }° observer)</h3><div class="chart"><canvas id="chart-ab"></canvas></div></div>
<div class="card"><h3>Thickness series (${
    e(from)
  })</h3><div class="chart"><canvas id="chart-series"></canvas></div><p id="series-note"></p></div>
</div>
</section>
</section>

${
    calibrations.length
      ? `<h2>Calibration</h2><div class="grid2">${
        calibrations.map((c, i) =>
          `<div class="card"><h3>${e(c.name)}: ${e(c.metric)} vs concentration (${
            e(c.unit)
          })</h3>` +
          `<div class="chart"><canvas id="chart-cal-${i}"></canvas></div>` +
          `<p>slope ${c.slope.toPrecision(4)}, intercept ${c.intercept.toPrecision(3)}, r² ${
            c.r2.toFixed(4)
          }, LOD ${c.lod.toPrecision(2)} ${e(c.unit)}</p></div>`
        ).join("")
      }</div>`
      : ""
  }
${
    input.errors.length
      ? `<h2>Files not processed</h2><div class="card"><ul class="errors">${
        input.errors.map((x) => `<li>${e(x.message)}</li>`).join("")
      }</ul></div>`
      : ""
  }
${
    input.manifestNotes.length
      ? `<h2>Sample sheet</h2><div class="card"><ul>${
        input.manifestNotes.map((n) => `<li>${e(n)}</li>`).join("")
      }</ul></div>`
      : ""
  }

<h2>Methods and sources</h2>
<div class="card methods"><ul>${
    [...METHODS, ...(uncertain ? [UNCERTAINTY_METHOD, ...input.uncertaintyNotes!] : [])].map((m) =>
      `<li>${e(m)}</li>`
    ).join("")
  }</ul></div>
</main>
</section>
<section class="stones" aria-label="one page per stone">
${stonePages.defs}
`;
  // in parts (a stone page, a table row, a stone's chart data), so no joined copy of the stone
  // pages or the page data is ever held
  return [
    head,
    ...stonePages.texts.map((page, k) => k ? `\n${page}` : page),
    `\n</section>\n<footer>Generated by crystint ${
      e(input.version)
    }. Charts drawn with Chart.js (MIT licence), inlined.</footer>\n` +
    `<script type="application/json" id="crystint-data">`,
    ...jsonForScriptParts(data),
    `</script>\n<script>${chartScript}</script>\n<script>${REPORT_SCRIPT}</script>\n</body>\n</html>\n`,
  ];
}

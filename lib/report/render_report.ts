/**
 * The static HTML report: a pure function from report data (and the chart.js bundle text)
 * to one self-contained HTML string that works offline. Every user string is escaped.
 *
 * @module
 */
import { escapeHtml as e, jsonForScript, scriptForInline } from "./escape.ts";
import type { ReportInput, ReportRow } from "./report_data.ts";
import { REPORT_CSS } from "./report_style.ts";
import { REPORT_SCRIPT } from "./report_script.ts";

const CAUTIONS = [
  "Colour numbers are measurement aids for comparing and controlling production, not a grading, identification or appraisal of a gemstone.",
  "UV inspection lamps harm eyes and skin; furnaces, flame-fusion burners, flux melts and cleaning acids (HF above all) are dangerous; some specimens are radioactive or toxic when worked. Follow local regulations, your institution's safety rules and licensed practice.",
];

const METHODS = [
  "Tristimulus values per CIE 15:2018 on the 1 nm grid 360–830 nm (Y = 100 for a perfect transmitter); measured data carried to 1 nm by Sprague (uniform steps, CIE 167:2005), monotone cubic (irregular steps) or cubic Lagrange (10/20 nm, the ASTM E2022 construction of E308 weights); end values extended as constants outside the measured range.",
  "CIE 1931 2° and CIE 1964 10° observers (CIE 15:2018 Tables 1–2); illuminant A from its definition, D65 and C tabulated, other D-series from the daylight recipe.",
  "CIELAB relative to the white of the illuminant used; the colour change compares each light under its own white (or after CAT16/Bradford adaptation when set). ΔE00 per Sharma, Wu & Dalal, Color Res. Appl. 30, 21 (2005).",
  "Path-length rescaling by Beer–Lambert on the measured absorbance, or with both Fresnel surfaces removed and restored using the host's refractive index (incoherent slab formula).",
  "Swatches: Bradford adaptation to D65, sRGB (IEC 61966-2-1); colours outside sRGB are marked ◆ and shown with reduced CIELAB chroma at constant L* and hue.",
  "Bands: sum of Gaussians in wavenumber (Lorentzian below 150 cm⁻¹ FWHM) plus a baseline with a λ⁻⁴ scatter term, bounded Levenberg–Marquardt, 1σ standard errors from the covariance; assignments are hints from a catalogue whose figures are marked published or from memory.",
  "A marked colour change (tag) means |Δh| at or above the threshold in the settings with C*ab above a floor under both lights — common-practice thresholds, not a standard.",
];

/** Summary rows shown in the page; larger batches are summarised in results.csv/json. */
export const ROW_LIMIT = 5000;

function lch([L, C, h]: [number, number, number]): string {
  return `${L.toFixed(1)} · ${C.toFixed(1)} · ${h.toFixed(0)}°`;
}

function row(r: ReportRow, hasDetail: boolean): string {
  const target = r.target
    ? `<span class="${r.target.pass ? "pass" : "fail"}">${r.target.pass ? "pass" : "fail"}</span> ${
      r.target.dE00.toFixed(2)
    }`
    : "—";
  return `<tr data-index="${r.index}">
<td data-value="${e(r.sample)}">${e(r.sample)}${
    r.outOfGamut ? ' <span title="outside sRGB: swatch chroma-reduced">◆</span>' : ""
  }</td>
<td data-value="${r.index}"><span class="swatches"><span style="background:${
    e(r.swatchFrom)
  }" title="${e(r.from)}"></span><span style="background:${e(r.swatchTo)}" title="${
    e(r.to)
  }"></span></span></td>
<td class="num" data-value="${r.pathMm ?? ""}">${r.pathMm === null ? "—" : r.pathMm.toFixed(1)}</td>
<td class="num day" data-value="${r.lchFrom[0]}">${lch(r.lchFrom)}</td>
<td class="num lamp" data-value="${r.lchTo[0]}">${lch(r.lchTo)}</td>
<td class="num" data-value="${r.dE00}">${r.dE00.toFixed(2)}</td>
<td class="num" data-value="${r.dh}">${r.dh.toFixed(1)}°${
    r.marked ? ' <span class="tag">marked</span>' : ""
  }</td>
<td data-value="${r.target ? r.target.dE00 : ""}" title="${e(r.target?.words ?? "")}">${target}</td>
<td data-value="${e(r.dopant ?? "")}">${e(r.dopant ?? "—")}</td>
<td>${hasDetail ? `<button class="detail" data-index="${r.index}">details</button>` : ""}</td>
</tr>`;
}

/**
 * Renders the report.
 *
 * @param input Report data (see report_data.ts).
 * @param chartJs Source of chart.js's UMD bundle, inlined so the page works offline.
 */
export function renderReport(input: ReportInput, chartJs: string): string {
  const first = input.rows[0];
  const from = first?.from ?? "D65", to = first?.to ?? "A";
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
  const data = {
    rows: input.rows.slice(0, ROW_LIMIT),
    details: input.details,
    locus: input.locus,
    calibrations,
  };
  const limited = count > Object.keys(input.details).length;
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="Content-Security-Policy" content="default-src 'none'; script-src 'unsafe-inline'; style-src 'unsafe-inline'; img-src data:">
<title>crystint colour report — ${count} samples</title>
<style>${REPORT_CSS}</style>
</head>
<body>
<header class="lot">
<h1>Colour report · ${count} sample${count === 1 ? "" : "s"}</h1>
<div class="meta">crystint ${e(input.version)} · ${settings}${
    targeted ? ` · target met by ${passed} of ${targeted}` : ""
  }${input.errors.length ? ` · ${input.errors.length} file(s) not processed` : ""}</div>
</header>
<main>
<section class="card caution"><strong>Read with care.</strong> ${
    CAUTIONS.map(e).join(" ")
  }</section>

<h2>Summary</h2>
<div class="card">
<table class="summary" id="summary">
<thead><tr>
<th data-key="sample">sample</th><th data-key="swatch">${e(from)} | ${
    e(to)
  }</th><th data-key="path">path (mm)</th>
<th data-key="from" class="day">L* · C* · h (${
    e(from)
  })</th><th data-key="to" class="lamp">L* · C* · h (${e(to)})</th>
<th data-key="dE00">ΔE00 ${e(from)}→${
    e(to)
  }</th><th data-key="dh">Δh</th><th data-key="target">target ΔE00</th>
<th data-key="dopant">dopant</th><th></th>
</tr></thead>
<tbody>
${input.rows.slice(0, ROW_LIMIT).map((r) => row(r, r.index in input.details)).join("\n")}
</tbody>
</table>
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
</div>

<h2>Lot overview</h2>
<div class="grid2">
<div class="card"><h3>Chromaticity, CIE 1931 x, y</h3><div class="chart"><canvas id="xy-all" aria-label="chromaticity diagram"></canvas></div></div>
<div class="card"><h3>a* b* under ${e(from)} → ${
    e(to)
  }</h3><div class="chart"><canvas id="ab-all" aria-label="a*b* plane"></canvas></div></div>
</div>

<h2>Sample detail: <span id="detail-name"></span></h2>
<section id="detail" hidden>
<div class="grid2">
<div class="card big"><p><span class="swatches"><span id="detail-swatch-from"></span><span id="detail-swatch-to"></span></span></p>
<p><small id="detail-file"></small></p><dl class="facts" id="detail-facts"></dl></div>
<div class="card"><h3>Transmittance</h3><div class="chart"><canvas id="chart-spectrum"></canvas></div></div>
<div class="card"><h3>Absorption bands (fit in wavenumber)</h3><div class="chart"><canvas id="chart-bands"></canvas></div>
<table class="summary"><thead><tr><th>centre</th><th>FWHM</th><th>height</th><th>assignment hint</th></tr></thead><tbody id="bands-table"></tbody></table></div>
<div class="card"><h3>Chromaticity</h3><div class="chart"><canvas id="chart-xy"></canvas></div></div>
<div class="card"><h3>a* b*, ${e(from)} → ${
    e(to)
  }</h3><div class="chart"><canvas id="chart-ab"></canvas></div></div>
<div class="card"><h3>Thickness series</h3><div class="chart"><canvas id="chart-series"></canvas></div><p id="series-note"></p></div>
</div>
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
<div class="card"><ul>${METHODS.map((m) => `<li>${e(m)}</li>`).join("")}</ul></div>
</main>
<footer>Generated by crystint ${
    e(input.version)
  }. Charts drawn with Chart.js (MIT licence), inlined.</footer>
<script type="application/json" id="crystint-data">${jsonForScript(data)}</script>
<script>${scriptForInline(chartJs)}</script>
<script>${REPORT_SCRIPT}</script>
</body>
</html>
`;
}

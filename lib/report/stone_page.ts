/**
 * One printed page per stone: name, a swatch under each light, the numbers per illuminant and
 * observer, the change, the target verdict, the dopant estimate, and four static charts
 * (transmittance, band fit, chromaticity point, a*b* shift). Pure HTML + SVG, no script.
 *
 * @module
 */
import { escapeHtml as e } from "./escape.ts";
import type { ReportDetail, ReportInput, ReportRow } from "./report_data.ts";
import { paddedRange, svgChart, type SvgDefs, type SvgSeries } from "./svg_chart.ts";
import { MARKS } from "./marks.ts";
import { axisValues, curveValues } from "../analysis/chart_curves.ts";

/** Colours of the two lights and the ink (the report's own palette). */
export const PALETTE = { day: "#2c6e73", lamp: "#b5651d", ink: "#1e2a32", other: "#7b5ea7" };

/** The colour a light is drawn in: the first change light teal, the second amber. */
export function lightColor(illuminant: string, from: string, to: string): string {
  return illuminant === from ? PALETTE.day : illuminant === to ? PALETTE.lamp : PALETTE.other;
}

const n = (v: number | null | undefined, d: number) =>
  typeof v === "number" && Number.isFinite(v) ? v.toFixed(d) : "—";

/** Title of a chromaticity chart for an observer. */
export function xyTitle(observer: string): string {
  return observer === "10"
    ? "Chromaticity x₁₀, y₁₀ (CIE 1964 10° observer)"
    : `Chromaticity x, y (CIE 1931 ${observer}° observer)`;
}

function swatches(d: ReportDetail): string {
  return d.color.map((c) =>
    `<figure class="light"><span class="swatch" style="background:${e(c.srgb)}"></span>` +
    `<figcaption>${e(c.illuminant)} · ${e(c.observer)}°${
      c.outOfGamut
        // a printed page has no hover: the legend just below explains the mark
        ? ` <span class="mark">${MARKS.outOfGamut.symbol}</span>`
        : ""
    }</figcaption></figure>`
  ).join("") + (d.color.some((c) =>
      c.outOfGamut
    )
    ? `<p class="legend">${MARKS.outOfGamut.symbol} ${e(MARKS.outOfGamut.text)}</p>`
    : "");
}

/** A value with its standard uncertainty, when there is one. */
const pm = (v: number | null | undefined, d: number, sd: number | null | undefined) =>
  typeof sd === "number" && Number.isFinite(sd) && typeof v === "number" && Number.isFinite(v)
    ? `${n(v, d)} ± ${n(sd, d)}`
    : n(v, d);

function numbers(d: ReportDetail): string {
  return `<table class="numbers"><thead><tr><th>light</th><th>observer</th><th>L*</th><th>C*ab</th><th>h (°)</th><th>a*</th><th>b*</th><th>λd / λc (nm)</th></tr></thead><tbody>${
    d.color.map((c) =>
      `<tr><td>${e(c.illuminant)}</td><td>${e(c.observer)}°</td><td>${
        pm(c.L, 2, c.sd?.L)
      }</td><td>${pm(c.C, 2, c.sd?.C)}</td><td>${pm(c.h, 1, c.sd?.h)}</td><td>${
        pm(c.a, 2, c.sd?.a)
      }</td><td>${pm(c.b, 2, c.sd?.b)}</td><td>${
        c.dominantNm === null ? "—" : `${c.complementary ? "c " : ""}${n(c.dominantNm, 1)}`
      }</td></tr>`
    ).join("")
  }</tbody></table>`;
}

function facts(row: ReportRow, d: ReportDetail): string {
  const items: [string, string][] = [];
  items.push([
    `change ${row.from} → ${row.to} (${row.observer}°)`,
    `ΔE00 ${pm(row.dE00, 2, row.dE00Sd)}, Δh ${n(row.dh, 1)}°${
      row.marked ? ` — ${MARKS.marked.symbol}` : ""
    }`,
  ]);
  const t = row.target;
  if (t) {
    items.push([
      t.name === "target" ? "target" : `target ${t.name}`,
      `${t.pass ? "pass" : "fail"} (ΔE00 ${n(t.dE00, 2)}; ${t.words})`,
    ]);
    if (t.verdict) {
      items.push([
        "verdict with uncertainty",
        `${t.verdict}${
          t.passProbability === undefined
            ? ""
            : ` (probability of passing ${(100 * t.passProbability).toFixed(1)} %)`
        }`,
      ]);
    }
  }
  if (row.dopant) items.push(["dopant estimate (± 1σ)", row.dopant]);
  items.push(["path for colour", row.pathMm === null ? "as measured" : `${row.pathMm} mm`]);
  items.push(["measured thickness", d.thicknessMm === null ? "not given" : `${d.thicknessMm} mm`]);
  if (d.polarisation) items.push(["polarisation", d.polarisation]);
  if (d.host) items.push(["host", d.host]);
  for (const [k, v] of Object.entries(d.extra ?? {})) if (v) items.push([k, v]);
  if (row.notes) items.push(["notes", row.notes]);
  for (const w of row.warnings) items.push(["note", w]);
  return `<dl class="facts">${
    items.map(([k, v]) => `<dt>${e(k)}</dt><dd>${e(v)}</dd>`).join("")
  }</dl>${
    row.marked ? `<p class="legend">${MARKS.marked.symbol}: ${e(MARKS.marked.text)}</p>` : ""
  }`;
}

/** The fixed frame of every chromaticity chart (so the locus is drawn alike on all of them). */
const XY_FRAME = { x: [0, 0.8] as [number, number], y: [0, 0.9] as [number, number], square: true };

/** The spectral locus of an observer, closed by the purple line, as a page-shared line. */
function locusSeries(locus: { x: number[]; y: number[] }): SvgSeries {
  return {
    points: [...locus.x.map((x, i) => [x, locus.y[i]!] as [number, number]), [
      locus.x[0]!,
      locus.y[0]!,
    ]],
    color: PALETTE.ink,
    kind: "line",
    size: 1,
    label: "spectral locus",
    shared: true,
  };
}

function charts(row: ReportRow, d: ReportDetail, input: ReportInput, defs?: SvgDefs): string {
  const id = `s${row.index}`;
  const out: string[] = [];
  const path = row.pathMm === null ? "measured path" : `${row.pathMm} mm`;
  const tNm = axisValues(d.plot.nm);
  const t = curveValues(d.plot.t);
  const tPoints = tNm.map((x, i) => [x, t[i]!] as [number, number]);
  out.push(figure(
    `Transmittance at ${path}`,
    svgChart({
      id: `${id}-t`,
      title: `transmittance of ${row.sample}`,
      xLabel: "wavelength (nm)",
      yLabel: "transmittance",
      x: paddedRange(tNm, 0),
      y: [0, 1],
      series: [{ points: tPoints, color: PALETTE.ink, kind: "line" }],
    }, defs),
  ));
  if (d.bands) {
    const b = d.bands;
    const bNm = axisValues(b.nm), data = curveValues(b.data), model = curveValues(b.model);
    const pts = (arr: number[]) => bNm.map((x, i) => [x, arr[i]!] as [number, number]);
    const excluded = b.excluded ?? [];
    out.push(figure(
      "Absorption bands (fit in wavenumber)",
      svgChart({
        id: `${id}-b`,
        title: `band fit of ${row.sample}`,
        xLabel: "wavelength (nm)",
        yLabel: b.ordinate,
        x: paddedRange(bNm, 0),
        y: paddedRange([...data, ...model]),
        spans: excluded.map((x) => ({ from: x.fromNm, to: x.toNm })),
        series: [
          { points: pts(data), color: PALETTE.ink, kind: "line", label: `measured`, size: 1.2 },
          {
            points: pts(model),
            color: PALETTE.lamp,
            kind: "line",
            dash: "5 3",
            label: "fit (bands + baseline)",
          },
        ],
      }, defs) + (excluded.length
        ? `<p class="legend">grey: left out of the fit — ${
          e(excluded.map((x) => `${n(x.fromNm, 0)}–${n(x.toNm, 0)} nm (${x.reason})`).join("; "))
        }</p>`
        : ""),
    ));
  }
  const obs = input.xyObserver;
  const locus = input.loci[obs];
  const xy = d.xy.filter((p) => p.observer === obs);
  out.push(figure(
    xyTitle(obs),
    svgChart({
      id: `${id}-xy`,
      title: `chromaticity of ${row.sample}`,
      xLabel: obs === "10" ? "x₁₀" : "x",
      yLabel: obs === "10" ? "y₁₀" : "y",
      ...XY_FRAME,
      series: [
        ...(locus ? [locusSeries(locus)] : []),
        ...xy.map((p) => ({
          points: [[p.wx, p.wy]] as [number, number][],
          color: "#9aa5ab",
          kind: "points" as const,
          size: 2.5,
        })),
        ...xy.map((p) => ({
          points: [[p.x, p.y]] as [number, number][],
          color: lightColor(p.illuminant, row.from, row.to),
          kind: "points" as const,
          size: 4.5,
          label: `under ${p.illuminant}`,
        })),
      ],
    }, defs) + `<p class="legend">grey dots: the illuminants' whites</p>`,
  ));
  const ellipses = [
    { points: d.ellipseFrom, color: PALETTE.day, light: row.from },
    { points: d.ellipseTo, color: PALETTE.lamp, light: row.to },
  ].filter((x) => x.points && x.points.length > 1);
  const lim = Math.ceil(
    Math.max(
      10,
      ...[...d.abFrom, ...d.abTo, ...ellipses.flatMap((x) => x.points!.flat())].map((v) =>
        Math.abs(v) || 0
      ),
    ) * 1.1 / 10,
  ) * 10;
  out.push(figure(
    `a* b* shift, ${row.from} → ${row.to} (${row.observer}°)`,
    svgChart({
      id: `${id}-ab`,
      title: `a*b* shift of ${row.sample}`,
      xLabel: "a*",
      yLabel: "b*",
      x: [-lim, lim],
      y: [-lim, lim],
      square: true,
      series: [
        { points: [[0, -lim], [0, lim]], color: "#c9c1b0", kind: "line", size: 0.8 },
        { points: [[-lim, 0], [lim, 0]], color: "#c9c1b0", kind: "line", size: 0.8 },
        { points: [d.abFrom, d.abTo], color: PALETTE.ink, kind: "arrow" },
        { points: [d.abFrom], color: PALETTE.day, kind: "points", label: `under ${row.from}` },
        { points: [d.abTo], color: PALETTE.lamp, kind: "points", label: `under ${row.to}` },
        ...ellipses.map((x, i) => ({
          points: x.points!,
          color: x.color,
          kind: "line" as const,
          size: 1,
          dash: "3 2",
          ...(i === 0 ? { label: "95 % region" } : {}),
        })),
      ],
    }, defs) + (ellipses.length
      ? `<p class="legend">dashed: the 95 % coverage ellipse of (a*, b*) under each light; semi-axes ${
        e(
          ellipses.map((x) =>
            `${x.light} ${semiAxes(x.points!)}`
          ).join(", "),
        )
      }</p>`
      : ""),
  ));
  return `<div class="stone-charts">${out.join("")}</div>`;
}

/** The semi-axes of a closed ellipse's points, "major × minor" (half its widest and narrowest spans). */
function semiAxes(points: [number, number][]): string {
  const m = points.length - 1; // the last point closes the curve
  const half = points.slice(0, m).map((p, i) => {
    const q = points[(i + m / 2) % m] ?? p;
    return Math.hypot(p[0] - q[0], p[1] - q[1]) / 2;
  });
  return `${n(Math.max(...half), 2)} × ${n(Math.min(...half), 2)}`;
}

function figure(caption: string, svg: string): string {
  return `<figure class="plot-box"><figcaption>${e(caption)}</figcaption>${svg}</figure>`;
}

function bandTable(d: ReportDetail): string {
  if (!d.bands || d.bands.table.length === 0) return "";
  return `<table class="numbers bands"><thead><tr><th>band centre (nm)</th><th>FWHM (cm⁻¹)</th><th>height</th><th>assignment hint</th></tr></thead><tbody>${
    d.bands.table.slice(0, 8).map((b) =>
      `<tr><td>${n(b.centerNm, 1)} ± ${n(b.centerNmSigma, 1)}</td><td>${n(b.fwhmCm1, 0)}</td><td>${
        e(String(b.height))
      }</td><td>${e(b.assignment || "—")}</td></tr>`
    ).join("")
  }</tbody></table>`;
}

/** The printed page of one stone. */
export function renderStonePage(
  row: ReportRow,
  d: ReportDetail,
  input: ReportInput,
  defs?: SvgDefs,
): string {
  return `<section class="stone" id="stone-${row.index}" data-index="${row.index}">
<h2 class="stone-name">${e(row.sample)} <small>${e(d.file)}</small></h2>
<div class="stone-top"><div class="lights">${swatches(d)}</div>${numbers(d)}</div>
${facts(row, d)}
${charts(row, d, input, defs)}
${bandTable(d)}
</section>`;
}

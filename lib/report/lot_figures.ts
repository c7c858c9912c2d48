/**
 * The cover's static lot charts for print: every stone's chromaticity under each light, and
 * every stone's a*b* shift as a thin arrow (screens get the interactive canvases instead).
 *
 * @module
 */
import { escapeHtml as e } from "./escape.ts";
import type { ReportInput } from "./report_data.ts";
import { svgChart, type SvgSeries } from "./svg_chart.ts";
import { lightColor, PALETTE, xyTitle } from "./stone_page.ts";

/** Two static figures (print only) summarising the lot. */
export function renderLotFigures(
  input: ReportInput,
  from: string,
  to: string,
  observer: string,
): string {
  const details = Object.values(input.details);
  const obs = input.xyObserver;
  const locus = input.loci[obs];
  const byLight = new Map<string, [number, number][]>();
  for (const d of details) {
    for (const p of d.xy) {
      if (p.observer !== obs) continue;
      const list = byLight.get(p.illuminant) ?? [];
      byLight.set(p.illuminant, list);
      list.push([p.x, p.y]);
    }
  }
  const xySeries: SvgSeries[] = [];
  if (locus) {
    xySeries.push({
      points: [
        ...locus.x.map((x, i) => [x, locus.y[i]!] as [number, number]),
        [locus.x[0]!, locus.y[0]!],
      ],
      color: PALETTE.ink,
      kind: "line",
      size: 1,
      label: "spectral locus",
    });
  }
  for (const [ill, points] of byLight) {
    xySeries.push({
      points,
      color: lightColor(ill, from, to),
      kind: "points",
      size: 2.2,
      label: `under ${ill}`,
    });
  }
  let lim = 10;
  for (const d of details) {
    for (const v of [...d.abFrom, ...d.abTo]) if (Math.abs(v) > lim) lim = Math.abs(v);
  }
  lim = Math.ceil(lim * 1.05 / 10) * 10;
  const abSeries: SvgSeries[] = [
    ...details.map((d) => ({
      points: [d.abFrom, d.abTo] as [number, number][],
      color: "#b9b2a4",
      kind: "arrow" as const,
      size: 0.8,
    })),
    {
      points: details.map((d) => d.abFrom),
      color: PALETTE.day,
      kind: "points",
      size: 2.2,
      label: `under ${from}`,
    },
    {
      points: details.map((d) => d.abTo),
      color: PALETTE.lamp,
      kind: "points",
      size: 2.2,
      label: `under ${to}`,
    },
  ];
  return `<div class="lot-figures print-only">
<figure class="plot-box"><figcaption>${e(xyTitle(obs))}</figcaption>${
    svgChart({
      id: "lot-xy",
      title: "chromaticity of the lot",
      xLabel: obs === "10" ? "x₁₀" : "x",
      yLabel: obs === "10" ? "y₁₀" : "y",
      x: [0, 0.8],
      y: [0, 0.9],
      square: true,
      series: xySeries,
    })
  }</figure>
<figure class="plot-box"><figcaption>a* b*, ${e(from)} → ${e(to)} (${
    e(observer)
  }° observer)</figcaption>${
    svgChart({
      id: "lot-ab",
      title: "a*b* shifts of the lot",
      xLabel: "a*",
      yLabel: "b*",
      x: [-lim, lim],
      y: [-lim, lim],
      square: true,
      series: abSeries,
    })
  }</figure>
</div>`;
}

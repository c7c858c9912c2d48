// The printed stone page's uncertainty parts and the band chart's excluded ranges, from plain
// report data: ± in the numbers and the change, the verdict with its probability, the 95 %
// ellipse as a dashed line, grey spans where the fit left the spectrum out, every text escaped.
import { describe, it } from "node:test";
import { expect } from "expect";
import { pathVertices } from "./_svg_path.ts";
import { renderStonePage } from "../../lib/report/stone_page.ts";
import { svgChart } from "../../lib/report/svg_chart.ts";
import { coverageEllipse } from "../../lib/report/ellipse.ts";
import type { ReportDetail, ReportInput, ReportRow } from "../../lib/report/report_data.ts";

const ellipse = coverageEllipse([12, -4], [[0.09, 0.02], [0.02, 0.04]]);

const row: ReportRow = {
  index: 0,
  sample: "R-7",
  file: "r7.csv",
  from: "D65",
  to: "A",
  observer: "2",
  pathMm: 6,
  lchFrom: [48.2, 12.6, 341],
  lchTo: [50.1, 18.0, 12],
  lchFromSd: [0.31, 0.22, 1.1],
  lchToSd: [0.29, 0.25, 0.8],
  swatchFrom: "#9a7f90",
  swatchTo: "#a77d77",
  dE00: 7.43,
  dE00Sd: 0.12,
  dh: 31,
  marked: true,
  target: {
    name: "rose <std>",
    pass: true,
    dE00: 1.8,
    words: "b* +1.2",
    verdict: "undecided",
    passProbability: 0.637,
  },
  dopant: null,
  warnings: [],
  notes: "",
  outOfGamut: false,
};

const detail: ReportDetail = {
  sample: "R-7",
  file: "r7.csv",
  plot: { nm: [400, 500, 600, 700], t: [0.5, 0.6, 0.4, 0.7] },
  bands: {
    nm: [300, 400, 500, 600, 700, 800],
    data: [1, 0.8, 0.5, 0.9, 0.3, 0.2],
    model: [1, 0.8, 0.5, 0.9, 0.3, 0.2],
    ordinate: "absorbance",
    excluded: [
      { fromNm: 300, toNm: 350, reason: "photometric floor" },
      { fromNm: 760, toNm: 800, reason: "clipped <&>" },
    ],
    table: [],
  },
  series: null,
  xy: [],
  abFrom: [12, -4],
  abTo: [15, 5],
  ellipseFrom: ellipse,
  ellipseTo: null,
  color: [{
    illuminant: "D65",
    observer: "2",
    L: 48.2,
    a: 12,
    b: -4,
    C: 12.65,
    h: 341.6,
    srgb: "#9a7f90",
    outOfGamut: false,
    dominantNm: null,
    complementary: false,
    purity: null,
    sd: { L: 0.31, C: 0.22, h: 1.1, a: 0.3, b: 0.2 },
  }],
  extra: {},
  thicknessMm: 2,
  polarisation: null,
  host: null,
};

const input = { loci: {}, xyObserver: "2" } as unknown as ReportInput;

describe("stone page with uncertainties", () => {
  it("shows ± σ, the verdict with its probability, escaped names", () => {
    const html = renderStonePage(row, detail, input);
    expect(html).toContain("<td>48.20 ± 0.31</td>");
    expect(html).toContain("<td>341.6 ± 1.1</td>");
    expect(html).toContain("ΔE00 7.43 ± 0.12");
    expect(html).toContain(
      "<dt>verdict with uncertainty</dt><dd>undecided (probability of passing 63.7 %)</dd>",
    );
    expect(html).toContain("target rose &lt;std&gt;");
    expect(html).not.toContain("<std>");
  });

  it("draws the from-light's ellipse as a dashed closed line, and says so", () => {
    const html = renderStonePage(row, detail, input);
    const ab = html.slice(html.indexOf('aria-label="a*b* shift'));
    const lines = [...ab.matchAll(/<path[^>]*stroke-dasharray="3 2" d="([^"]+)"/g)];
    expect(lines.length).toBe(1);
    const pts = pathVertices(lines[0]![1]!);
    // simplified to the drawing tolerance: fewer vertices, still closed
    expect(pts.length).toBeGreaterThan(3);
    expect(pts.length).toBeLessThanOrEqual(ellipse.length);
    expect(pts[0]).toEqual(pts[pts.length - 1]);
    expect(ab).toContain("95 % coverage ellipse");
    // semi-axes k·√λ of the covariance's eigenvalues, k² = −2 ln 0.05 (JCGM 102:2011 §6.5)
    const k = Math.sqrt(-2 * Math.log(0.05));
    const root = Math.hypot((0.09 - 0.04) / 2, 0.02);
    const major = k * Math.sqrt(0.065 + root), minor = k * Math.sqrt(0.065 - root);
    expect(ab).toContain(`semi-axes D65 ${major.toFixed(2)} × ${minor.toFixed(2)}</p>`);
    // without uncertainties: no ellipse and no legend for it
    const plain = renderStonePage(
      { ...row, lchFromSd: null, lchToSd: null, dE00Sd: null },
      { ...detail, ellipseFrom: null },
      input,
    );
    expect(plain).not.toContain('stroke-dasharray="3 2"');
    expect(plain).not.toContain("coverage ellipse");
  });

  it("greys the band chart's excluded ranges and names them in its legend", () => {
    const html = renderStonePage(row, detail, input);
    const bands = html.slice(
      html.indexOf('aria-label="band fit'),
      html.indexOf("</figure>", html.indexOf('aria-label="band fit')),
    );
    const rects = [
      ...bands.matchAll(/<rect class="excluded" x="([\d.]+)" y="[\d.]+" width="([\d.]+)"/g),
    ];
    expect(rects.length).toBe(2);
    // the plot area is 300 px wide from x = 46 over 300–800 nm (svg_chart.ts layout):
    // 300–350 nm is 30 px from the left edge, 760–800 nm 24 px ending at the right one
    expect(Number(rects[0]![1])).toBeCloseTo(46, 1);
    expect(Number(rects[0]![2])).toBeCloseTo(30, 1);
    expect(Number(rects[1]![1]) + Number(rects[1]![2])).toBeCloseTo(346, 1);
    expect(bands).toContain("300–350 nm (photometric floor); 760–800 nm (clipped &lt;&amp;&gt;)");
  });

  it("svgChart clips spans to the axis range and skips empty ones", () => {
    const svg = svgChart({
      id: "t",
      title: "t",
      xLabel: "x",
      yLabel: "y",
      x: [0, 10],
      y: [0, 1],
      spans: [{ from: -5, to: 2 }, { from: 12, to: 20 }, { from: 6, to: 6 }],
      series: [],
    });
    const rects = [
      ...svg.matchAll(/<rect class="excluded" x="([\d.]+)" y="[\d.]+" width="([\d.]+)"/g),
    ];
    expect(rects.length).toBe(1);
    expect(Number(rects[0]![1])).toBeCloseTo(46, 1);
    expect(Number(rects[0]![2])).toBeCloseTo(60, 1);
  });
});

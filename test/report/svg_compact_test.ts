import { describe, it } from "node:test";
import { expect } from "expect";
import {
  pathData,
  simplifyLine,
  svgChart,
  SvgDefs,
  type SvgPlot,
} from "../../lib/report/svg_chart.ts";
import { pathVertices } from "./_svg_path.ts";

/** Distance from p to the segment a–b (closed form: projection clamped to the segment). */
function segmentDistance(p: [number, number], a: [number, number], b: [number, number]): number {
  const dx = b[0] - a[0], dy = b[1] - a[1], l2 = dx * dx + dy * dy;
  const t = l2 ? Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / l2)) : 0;
  return Math.hypot(a[0] + t * dx - p[0], a[1] + t * dy - p[1]);
}

describe("printed lines drawn to a tolerance (Ramer–Douglas–Peucker)", () => {
  it("a circle of radius R keeps about as many chords as the sagitta R(1 − cos θ/2) ≤ τ allows", () => {
    const R = 80, tol = 0.2, n = 2000;
    const circle = Array.from({ length: n + 1 }, (_, i) => {
      const a = (2 * Math.PI * i) / n;
      return [R * Math.cos(a), R * Math.sin(a)] as [number, number];
    });
    const kept = simplifyLine(circle, tol);
    // any polyline within τ of the circle needs chords of angle ≤ 2·acos(1 − τ/R)
    const fewest = (2 * Math.PI) / (2 * Math.acos(1 - tol / R));
    expect(kept.length - 1).toBeGreaterThanOrEqual(Math.floor(fewest));
    expect(kept.length - 1).toBeLessThanOrEqual(2 * Math.ceil(fewest));
    expect(kept[0]).toEqual(circle[0]);
    expect(kept[kept.length - 1]).toEqual(circle[n]);
  });

  it("every dropped point of a noisy line lies within the tolerance of the kept line", () => {
    let seed = 7;
    const rnd = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32);
    const line = Array.from(
      { length: 500 },
      (_, i) => [i * 0.6, 100 + 40 * Math.sin(i / 30) + 2 * (rnd() - 0.5)] as [number, number],
    );
    const tol = 0.2;
    const kept = simplifyLine(line, tol);
    expect(kept.length).toBeLessThan(line.length);
    let k = 0;
    for (const p of line) {
      while (k < kept.length - 2 && kept[k + 1]![0] <= p[0]) k++;
      expect(segmentDistance(p, kept[k]!, kept[k + 1]!)).toBeLessThanOrEqual(tol + 1e-12);
    }
  });

  it("keeps a straight line's two ends only, and short lines as they are", () => {
    const straight = Array.from({ length: 50 }, (_, i) => [i, 2 * i + 1] as [number, number]);
    expect(simplifyLine(straight, 0.2)).toEqual([straight[0], straight[49]]);
    expect(simplifyLine([[0, 0], [1, 5]], 0.2)).toEqual([[0, 0], [1, 5]]);
  });
});

describe("path data of printed lines", () => {
  it("relative steps between rounded points give back every rounded point exactly", () => {
    let seed = 11;
    const rnd = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32);
    const pts = Array.from(
      { length: 400 },
      (_, i) => [46 + i * 0.75 + rnd() * 0.2, 10 + 184 * rnd()] as [number, number],
    );
    pts.push([46, 194], [45.95, 10.04], [100, 100]); // a step of zero, of −0.1, a long one
    const d = pathData(pts);
    expect(d.startsWith("M")).toBe(true);
    expect(pathVertices(d)).toEqual(
      pts.map(([x, y]) => [Math.round(x * 10), Math.round(y * 10)]),
    );
  });
});

describe("chart parts shared on a page", () => {
  const plot = (id: string, y: [number, number]): SvgPlot => ({
    id,
    title: id,
    xLabel: "x",
    yLabel: "y",
    x: [0, 10],
    y,
    series: [
      { points: [[0, 0], [5, 1], [10, 0]], color: "#123456", kind: "line", shared: true },
      { points: [[2, 0.5]], color: "#654321", kind: "points" },
    ],
  });

  it("defines what repeats once and draws it by reference; what occurs once stays inline", () => {
    const defs = new SvgDefs();
    const pages = [plot("a", [0, 1]), plot("b", [0, 1]), plot("c", [0, 2])]
      .map((p) => svgChart(p, defs)).join("\n");
    const { text, defs: defined } = defs.resolve(pages);
    expect(text).not.toContain("<!--svg-def");
    // a, b and c share the box and x axis; a and b also their y axis and line: three
    // definitions, drawn 3 + 2 + 2 times by reference
    expect(defined.match(/<g id="svg-def-\d+">/g)!.length).toBe(3);
    expect(text.match(/<use href="#svg-def-\d+"\/>/g)!.length).toBe(7);
    // resolved by reference, every chart draws what it would draw alone
    const expand = (svg: string) =>
      svg.replace(/<use href="#(svg-def-\d+)"\/>/g, (_, id: string) => {
        const start = defined.indexOf(`<g id="${id}">`) + `<g id="${id}">`.length;
        return defined.slice(start, defined.indexOf("</g>", start));
      });
    const charts = text.split("\n");
    expect(expand(charts[0]!)).toBe(svgChart(plot("a", [0, 1])));
    expect(expand(charts[1]!)).toBe(svgChart(plot("b", [0, 1])));
    expect(expand(charts[2]!)).toBe(svgChart(plot("c", [0, 2])));
    // what occurs once (c's y axis and line) stays inline
    expect(charts[2]!.match(/<use /g)!.length).toBe(1);
  });

  it("without repeats there is nothing to define", () => {
    const defs = new SvgDefs();
    const { text, defs: defined } = defs.resolve(svgChart(plot("a", [0, 1]), defs));
    expect(defined).toBe("");
    expect(text).toBe(svgChart(plot("a", [0, 1])));
  });
});

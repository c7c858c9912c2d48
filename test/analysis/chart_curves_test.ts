import { describe, it } from "node:test";
import { expect } from "expect";
import {
  axisValues,
  curveValues,
  packSteps,
  type TextCurve,
  thinBandCurve,
  thinTransmittance,
} from "../../lib/analysis/chart_curves.ts";
import { REPORT_SCRIPT } from "../../lib/report/report_script.ts";
import { roundTo } from "../../lib/numeric/round.ts";

describe("stored chart curves (lib/analysis/chart_curves.ts)", () => {
  const t = (n: number) => Array.from({ length: n }, (_, i) => 0.5 + 0.4 * Math.sin(i / 30));

  it("an axis of equal steps is stored as from/step/count and gives back every value", () => {
    // 0.5 nm steps from 359.5 nm, thinned to every 2nd point: 1 nm steps
    const nm = Array.from({ length: 941 }, (_, i) => 359.5 + 0.5 * i);
    const stored = thinTransmittance(nm, t(941));
    expect(Array.isArray(stored.nm)).toBe(false);
    const expected = nm.filter((_, i) => i % 4 === 0).map((v) => roundTo(v, 2));
    expect(axisValues(stored.nm)).toEqual(expected);
    expect(curveValues(stored.t).length).toBe(expected.length);
  });

  it("a descending wavenumber grid turned into nm keeps its list (the steps are not equal)", () => {
    const cm1 = Array.from({ length: 200 }, (_, i) => 12000 + 50 * i);
    const stored = thinBandCurve(cm1, t(200), t(200));
    expect(Array.isArray(stored.nm)).toBe(true);
    expect(axisValues(stored.nm)).toEqual(cm1.map((k) => roundTo(1e7 / k, 2)));
  });

  it("an irregular grid (a spectrometer's own steps) keeps its list", () => {
    const nm = [400, 400.7, 401.5, 402.2, 403.1, 404, 404.6];
    const stored = thinTransmittance(nm, t(nm.length));
    expect(stored.nm).toEqual(nm);
  });

  it("values are stored as integer steps that give back the rounded values bit for bit", () => {
    let seed = 5;
    const rnd = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32);
    const nm = Array.from({ length: 300 }, (_, i) => 360 + 1.5 * i);
    const values = nm.map(() => rnd() * (rnd() < 0.5 ? 1 : 40));
    const stored = thinTransmittance(nm, values);
    expect(Array.isArray(stored.t)).toBe(false);
    // the same doubles as Number(v.toFixed(5)), the stored precision (Object.is per value)
    expect(curveValues(stored.t)).toEqual(values.map((v) => roundTo(v, 5)));
    const band = thinBandCurve(nm.map((x) => 1e7 / x), values, values.map((v) => v / 3));
    expect(curveValues(band.model)).toEqual(values.map((v) => roundTo(v / 3, 5)));
    // a gap keeps the list, as older results hold it
    const gap = thinTransmittance([400, 401, 402], [0.1, NaN, 0.3]);
    expect(Array.isArray(gap.t)).toBe(true);
    expect(curveValues([0.1, 0.2])).toEqual([0.1, 0.2]);
  });
});

describe("curves as step text, and the older forms", () => {
  let seed = 9;
  const rnd = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32);

  it("a noisy curve and a smooth one give back exactly the values rounded to 5 decimals", () => {
    const noisy = Array.from(
      { length: 236 },
      (_, i) => 0.6 + 0.2 * Math.sin(i / 40) + 0.002 * rnd(),
    );
    const smooth = Array.from({ length: 236 }, (_, i) => 0.8 * Math.exp(-(((i - 120) / 30) ** 2)));
    for (const values of [noisy, smooth, [3.14159], [], [-2.5, 1e4, -1e4]]) {
      const rounded = values.map((v) => roundTo(v, 5));
      const packed = packSteps(rounded, 5);
      expect(Array.isArray(packed)).toBe(false);
      expect(curveValues(packed)).toEqual(rounded);
    }
    // values too large for safe integer steps at 5 decimals stay a list (no throw)
    expect(packSteps([1e12, -3e11, 5], 5)).toEqual([1e12, -3e11, 5]);
    // a smooth curve takes steps of steps (shorter than plain steps)
    expect((packSteps(smooth.map((v) => roundTo(v, 5)), 5) as TextCurve).order).toBeGreaterThan(1);
  });

  it("reads the integer steps older results hold ({q, d}) and lists, and refuses a bad order", () => {
    expect(curveValues({ q: 100000, d: [66529, -785, -1055] })).toEqual([
      0.66529,
      0.65744,
      0.64689,
    ]);
    expect(curveValues([0.1, 0.2])).toEqual([0.1, 0.2]);
    expect(() => curveValues({ q: 10, order: 4, text: "A" })).toThrow(SyntaxError);
  });

  it("the page's own script reads the text the same way (report_script.ts)", () => {
    const source = REPORT_SCRIPT;
    const start = source.indexOf("  function curveValues(c)");
    const end = source.indexOf("  function roundTo(");
    const pageCurveValues = new Function(`${source.slice(start, end)}; return curveValues;`)() as (
      c: unknown,
    ) => number[];
    for (const order of [1, 2, 3]) {
      const values = Array.from(
        { length: 50 },
        (_, i) => roundTo(Math.sin(i / 7) + rnd() * order / 100, 5),
      );
      const packed = packSteps(values, 5);
      expect(pageCurveValues(packed)).toEqual(curveValues(packed));
    }
    expect(pageCurveValues({ q: 100, d: [5, 1] })).toEqual([0.05, 0.06]);
  });
});

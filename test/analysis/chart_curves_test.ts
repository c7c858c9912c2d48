import { describe, it } from "node:test";
import { expect } from "expect";
import { axisValues, thinBandCurve, thinTransmittance } from "../../lib/analysis/chart_curves.ts";
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
    expect(stored.t.length).toBe(expected.length);
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
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { curveValues } from "../../lib/analysis/chart_curves.ts";
import { packCurve, packFitCurves } from "../../lib/report/packed_curve.ts";

describe("page curves packed as integer steps", () => {
  it("give back each value rounded to 4 significant digits of the largest (half a unit at most)", () => {
    let seed = 3;
    const rnd = () => ((seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0) / 2 ** 32);
    for (const scale of [1, 0.05, 37, 2e-4]) {
      const values = Array.from({ length: 300 }, (_, i) => scale * (Math.sin(i / 20) + rnd()));
      const packed = packCurve(values);
      expect(Array.isArray(packed)).toBe(false);
      const back = curveValues(packed);
      const max = Math.max(...values.map(Math.abs));
      const unit = 10 ** (Math.floor(Math.log10(max)) - 3); // 4th significant digit of max
      back.forEach((v, i) =>
        expect(Math.abs(v - values[i]!)).toBeLessThanOrEqual(unit / 2 + 1e-15)
      );
      // the same number as rounding the decimal text (Number(toFixed)), exactly
      const decimals = -Math.round(Math.log10(unit));
      back.forEach((v, i) => expect(v).toBe(Number(values[i]!.toFixed(decimals))));
    }
  });

  it("keeps a curve with a gap (NaN, null) as it is", () => {
    const values = [0.1, NaN, 0.3];
    expect(packCurve(values)).toBe(values);
    expect(curveValues([1, 2])).toEqual([1, 2]);
  });

  it("rounds halves as Number(toFixed) does, negative ones too (stored values have 5 decimals)", () => {
    // largest 1.5 → 3 decimals; −0.0625 and 0.0625 are exact halves at that precision
    const values = [1.5, -0.0625, 0.0625, -1.2345, 0.00005];
    expect(curveValues(packCurve(values))).toEqual(values.map((v) => Number(v.toFixed(3))));
    // (−1.2345 is 1.23449999… as a double, so it goes down)
    expect(curveValues(packCurve(values))).toEqual([1.5, -0.063, 0.063, -1.234, 0]);
  });

  it("packs a fit's data and model alike, fine enough for their difference", () => {
    // absorbance near 1.5 with a residual of a few 1e-4: 4 digits of 1.5 would step by 1e-3
    const model = Array.from({ length: 50 }, (_, i) => 1.5 * Math.exp(-(((i - 25) / 8) ** 2)));
    const data = model.map((m, i) => Number((m + 3e-4 * Math.sin(i)).toFixed(5)));
    const packed = packFitCurves(data, model.map((m) => Number(m.toFixed(5))));
    const d = curveValues(packed.data), m = curveValues(packed.model);
    expect((packed.data as { q: number }).q).toBe((packed.model as { q: number }).q);
    // 3 significant digits of the largest difference (3e-4): steps of 1e-6, capped at 1e-5
    d.forEach((v, i) => expect(Math.abs(v - m[i]! - (data[i]! - model[i]!))).toBeLessThan(2e-5));
  });
});

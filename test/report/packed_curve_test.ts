import { describe, it } from "node:test";
import { expect } from "expect";
import { curveValues, packCurve } from "../../lib/report/packed_curve.ts";

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
});

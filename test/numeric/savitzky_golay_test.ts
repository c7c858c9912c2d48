import { describe, it } from "node:test";
import { expect } from "expect";
import { savitzkyGolayWeights } from "../../lib/numeric/mod.ts";

describe("Savitzky–Golay weights", () => {
  it("5-point quadratic smoothing is (−3, 12, 17, 12, −3)/35 (Savitzky & Golay 1964, Table I)", () => {
    const w = savitzkyGolayWeights(2, 2, 0);
    [-3, 12, 17, 12, -3].forEach((v, i) => expect(w[i]!).toBeCloseTo(v / 35, 12));
  });
  it("closed form: the second-derivative filter of a cubic gives its exact second derivative", () => {
    const w = savitzkyGolayWeights(4, 3, 2);
    const f = (t: number) => 0.2 * t ** 3 - 1.5 * t * t + 3;
    const d2 = [...w].reduce((s, v, i) => s + v * f(i - 4), 0);
    expect(d2).toBeCloseTo(-3, 10);
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { bandSeparableModel } from "../../lib/bands/_fit_model.ts";
import { curvatureAgreement } from "../_curvature_check.ts";

describe("band model second derivatives (for the Newton steps of the band fit)", () => {
  it("Gaussian, Lorentzian and edge terms agree with central differences of the first derivatives", () => {
    const x = Float64Array.from({ length: 300 }, (_, i) => 12000 + 50 * i);
    const { model, start } = bandSeparableModel(x, {
      bands: [
        { centerCm1: 16500, fwhmCm1: 2600, shape: "gaussian" },
        { centerCm1: 14400, fwhmCm1: 120, shape: "lorentzian" },
      ],
      baselineTerms: ["b0", "b1", "scatter"],
      edgeWidthCm1: 1800,
      minFwhmCm1: () => 50,
    });
    const n = x.length;
    // pairs (centre, centre), (centre, width), (width, width) per band, then (edge, edge)
    const pairs = [[0, 0], [0, 1], [1, 1], [2, 2], [2, 3], [3, 3], [4, 4]];
    for (const { worst, scale } of curvatureAgreement(model, start, pairs, n)) {
      expect(scale).toBeGreaterThan(0);
      expect(worst).toBeLessThan(1e-5 * scale);
    }
  });
});

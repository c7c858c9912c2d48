import { describe, it } from "node:test";
import { expect } from "expect";
import { coverageEllipse } from "../../lib/report/ellipse.ts";

describe("coverage ellipse (χ² with 2 degrees of freedom)", () => {
  it("every point has Mahalanobis distance² −2 ln(0.05) = 5.991 for p = 0.95", () => {
    const cov: [[number, number], [number, number]] = [[0.09, 0.05], [0.05, 0.16]];
    const det = cov[0][0] * cov[1][1] - cov[0][1] ** 2;
    const inv = [[cov[1][1] / det, -cov[0][1] / det], [-cov[0][1] / det, cov[0][0] / det]];
    for (const [x, y] of coverageEllipse([3, -2], cov)) {
      const dx = x - 3, dy = y + 2;
      const m2 = dx * (inv[0]![0]! * dx + inv[0]![1]! * dy) +
        dy * (inv[1]![0]! * dx + inv[1]![1]! * dy);
      expect(m2).toBeCloseTo(5.9915, 3); // χ²₂(0.95) = 5.9915 (statistical tables)
    }
  });
  it("a circle of radius k·σ for an isotropic covariance", () => {
    for (const [x, y] of coverageEllipse([0, 0], [[4, 0], [0, 4]], 0.3935)) {
      expect(Math.hypot(x, y)).toBeCloseTo(2, 3); // p = 1 − e^(−1/2): k = 1, radius σ = 2
    }
  });
});

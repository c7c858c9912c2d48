import { describe, it } from "node:test";
import { expect } from "expect";
import { deltaE2000 } from "../../lib/cie/delta_e.ts";
import type { Lab } from "../../lib/cie/spaces.ts";
import {
  targetPassProbability,
  targetPassProbabilityFromDraws,
  verdictFor,
} from "../../lib/dopant/target_probability.ts";
import { dopantLevelUncertainty } from "../../lib/dopant/dopant_level_uncertainty.ts";
import { fitCalibration, predictConcentration } from "../../lib/dopant/linear_calibration.ts";
import { seededNormal } from "../_random.ts";

const TARGET: Lab = { L: 45, a: 28, b: 6 };

/** The colour at exactly ΔE00 = tol from the target along a direction (bisection). */
function onBoundary(direction: [number, number, number], tol: number): Lab {
  let lo = 0, hi = 20;
  const at = (s: number) => ({
    L: TARGET.L + s * direction[0],
    a: TARGET.a + s * direction[1],
    b: TARGET.b + s * direction[2],
  });
  for (let k = 0; k < 200; k++) {
    const mid = (lo + hi) / 2;
    if (deltaE2000(TARGET, at(mid)) < tol) lo = mid;
    else hi = mid;
  }
  return at((lo + hi) / 2);
}

const COV: number[][] = [[0.01, 0.002, 0], [0.002, 0.012, -0.003], [0, -0.003, 0.009]];

describe("probability of being within tolerance", () => {
  for (const direction of [[0, 1, 0], [1, 0, 0], [0.3, -0.5, 0.8]] as [number, number, number][]) {
    it(`a colour exactly on the ΔE00 = 2 boundary (direction ${direction}) passes with 50 % ± 2 %`, () => {
      const lab = onBoundary(direction, 2);
      expect(deltaE2000(TARGET, lab)).toBeCloseTo(2, 9);
      const small = COV.map((row) => row.map((v) => v / 4)); // σ ≈ 0.05 in L*, a*, b*
      const r = targetPassProbability(lab, small, TARGET, { draws: 100000, seed: 3 });
      // check value: 1/2 by symmetry of the normal distribution about a locally flat boundary.
      // The ΔE00 = 2 surface is convex, which lowers P by about φ(0)·s_t²/(2·R·s_n) (s_t, s_n
      // the spread along and across the surface in ΔE00 units, R = 2): measured ≈ 1 % here,
      // ≈ 2.4 % with four times this covariance (the curvature, not the sampling)
      expect(Math.abs(r.passProbability - 0.5)).toBeLessThanOrEqual(0.02);
      expect(r.verdict).toBe("undecided");
      expect(r.probabilitySe).toBeCloseTo(Math.sqrt(0.25 / 100000), 3);
    });
  }

  it("guard bands: well inside passes, well outside fails, near the edge is undecided", () => {
    const inside = onBoundary([0, 1, 0], 1.2), outside = onBoundary([0, 1, 0], 2.8);
    const edge = onBoundary([0, 1, 0], 1.97);
    expect(targetPassProbability(inside, COV, TARGET).verdict).toBe("pass");
    expect(targetPassProbability(outside, COV, TARGET).verdict).toBe("fail");
    expect(targetPassProbability(edge, COV, TARGET).verdict).toBe("undecided");
    // the example: 0.9 ΔE00 from the target with σ 0.6 is not a pass at tolerance 1
    const near = onBoundary([0, 1, 0], 0.9);
    const big = COV.map((row) => row.map((v) => v * 100)); // σ ≈ 1 in a*, ≈ 0.5 in ΔE00
    const r = targetPassProbability(near, big, TARGET, { toleranceDE00: 1 });
    expect(r.verdict).toBe("undecided");
    expect(r.rule).toContain("ISO 14253-1");
  });

  it("thresholds are settings", () => {
    const edge = onBoundary([0, 1, 0], 1.97);
    const p = targetPassProbability(edge, COV, TARGET).passProbability;
    expect(p).toBeGreaterThan(0.6);
    expect(targetPassProbability(edge, COV, TARGET, { passAt: 0.6 }).verdict).toBe("pass");
    expect(verdictFor(0.5, 0.9, 0.5)).toBe("fail");
    expect(() => verdictFor(0.5, 0.3, 0.6)).toThrow(RangeError);
  });

  it("the first-order normal approximation agrees with Monte Carlo within 2 % away from ΔE00 = 0", () => {
    for (const d of [1.7, 1.85, 2, 2.15, 2.3]) {
      const lab = onBoundary([0.2, 1, 0.4], d);
      const mc = targetPassProbability(lab, COV, TARGET, { draws: 40000 });
      const normal = targetPassProbability(lab, COV, TARGET, { method: "normal" });
      expect(Math.abs(mc.passProbability - normal.passProbability)).toBeLessThan(0.02);
    }
  });

  it("from draws of the colour itself gives the same probability as from its covariance", () => {
    const lab = onBoundary([0, 1, 0], 1.95);
    const normal = seededNormal(8);
    const l = [0.1, 0.11, 0.095];
    const draws = Float64Array.from({ length: 3 * 40000 }, (_, i) => {
      const c = i % 3;
      return [lab.L, lab.a, lab.b][c]! + l[c]! * normal();
    });
    const diag = [[0.01, 0, 0], [0, 0.0121, 0], [0, 0, 0.009025]];
    const a = targetPassProbabilityFromDraws(draws, lab, TARGET);
    const b = targetPassProbability(lab, diag, TARGET, { draws: 40000 });
    expect(Math.abs(a.passProbability - b.passProbability)).toBeLessThan(0.02);
    expect(a.method).toBe("draws");
  });

  it("rejects a zero tolerance", () => {
    expect(() => targetPassProbability(TARGET, COV, TARGET, { toleranceDE00: 0 })).toThrow(
      RangeError,
    );
  });
});

describe("dopant level uncertainty budget (GUM, independent inputs)", () => {
  // invented standards (demo-like numbers, not check values)
  const cal = fitCalibration([
    { x: 0.01, y: 0.52 },
    { x: 0.02, y: 1.07 },
    { x: 0.04, y: 2.02 },
    { x: 0.08, y: 4.11 },
  ]);

  it("adds calibration, band-fit and thickness parts in quadrature; thickness part = y·u(d)/(d·b)", () => {
    const u = dopantLevelUncertainty(cal, { value: 2.5, sigma: 0.04 }, {
      thicknessMm: 2,
      sdMm: 0.02,
    });
    // closed form: α ∝ 1/d, so u(y) from the thickness is y·u(d)/d = 2.5·0.01 = 0.025
    expect(u.budget.thickness).toBeCloseTo(0.025 / cal.slope, 12);
    expect(u.budget.bandFit).toBeCloseTo(0.04 / cal.slope, 12);
    expect(u.budget.calibration).toBeCloseTo(predictConcentration(cal, 2.5).sigma, 12);
    expect(u.sigma).toBeCloseTo(
      Math.hypot(u.budget.calibration, u.budget.bandFit, u.budget.thickness),
      12,
    );
    expect(u.x).toBeCloseTo((2.5 - cal.intercept) / cal.slope, 12);
  });

  it("without a thickness σ it is the calibration's own prediction", () => {
    const u = dopantLevelUncertainty(cal, { value: 2.5, sigma: 0.04 });
    expect(u.sigma).toBeCloseTo(predictConcentration(cal, 2.5, 0.04).sigma, 12);
    expect(() => dopantLevelUncertainty(cal, { value: 1, sigma: 0 }, { thicknessMm: 0, sdMm: 0 }))
      .toThrow(RangeError);
  });
});

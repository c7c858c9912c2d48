import { describe, it } from "node:test";
import { expect } from "expect";
import { fitCalibration, predictConcentration } from "../../lib/dopant/mod.ts";
import { studentTQuantile } from "../../lib/numeric/mod.ts";
import { seededNormal } from "../_random.ts";

const MX = [0, 2, 4, 6, 8, 10, 12];
const MY = [2.1, 5.0, 9.0, 12.6, 17.3, 21.0, 24.7];

describe("straight-line calibration", () => {
  const points = MX.map((x, i) => ({ x, y: MY[i]! }));
  it("matches the Miller & Miller worked example to its printed precision", () => {
    const c = fitCalibration(points);
    expect(c.slope).toBeCloseTo(1.93, 2);
    expect(c.intercept).toBeCloseTo(1.52, 2);
    expect(Math.sqrt(c.r2)).toBeCloseTo(0.9989, 4);
    expect(Math.abs(c.syx - 0.4329)).toBeLessThan(1e-4);
    expect(c.slopeSigma).toBeCloseTo(0.0409, 4);
    expect(c.interceptSigma).toBeCloseTo(0.295, 3);
    const p = predictConcentration(c, 13.5);
    expect(p.x).toBeCloseTo(6.21, 2);
    expect(p.sigma).toBeCloseTo(0.24, 2);
  });

  it("equals closed-form OLS, origin and weighted least squares computed here (1e-9 relative)", () => {
    const n = MX.length;
    const mx = MX.reduce((a, b) => a + b) / n, my = MY.reduce((a, b) => a + b) / n;
    const sxx = MX.reduce((s, x) => s + (x - mx) ** 2, 0);
    const b = MX.reduce((s, x, i) => s + (x - mx) * (MY[i]! - my), 0) / sxx;
    const c = fitCalibration(points);
    expect(c.slope / b).toBeCloseTo(1, 9);
    expect(c.intercept / (my - b * mx)).toBeCloseTo(1, 9);
    const origin = fitCalibration(points, "origin");
    const b0 = MX.reduce((s, x, i) => s + x * MY[i]!, 0) / MX.reduce((s, x) => s + x * x, 0);
    expect(origin.slope / b0).toBeCloseTo(1, 9);
    expect(origin.intercept).toBe(0);
    const sig = MY.map((y) => 0.02 * y + 0.1);
    const weighted = fitCalibration(points.map((p, i) => ({ ...p, sigmaY: sig[i]! })), "weighted");
    const w = sig.map((s) => 1 / (s * s));
    const sw = w.reduce((a, b) => a + b),
      wx = w.reduce((s, v, i) => s + v * MX[i]!, 0) / sw,
      wy = w.reduce((s, v, i) => s + v * MY[i]!, 0) / sw;
    const bw = w.reduce((s, v, i) => s + v * (MX[i]! - wx) * (MY[i]! - wy), 0) /
      w.reduce((s, v, i) => s + v * (MX[i]! - wx) ** 2, 0);
    expect(weighted.slope / bw).toBeCloseTo(1, 9);
    expect(weighted.intercept / (wy - bw * wx)).toBeCloseTo(1, 9);
  });

  it("LOD/LOQ follow the stated 3σ/10σ convention; predictions outside the range are flagged", () => {
    const c = fitCalibration(points);
    expect(c.lod).toBeCloseTo((3 * c.syx) / c.slope, 12);
    expect(c.loq).toBeCloseTo((10 * c.syx) / c.slope, 12);
    expect(c.lodConvention).toMatch(/3·s_y\/x/);
    expect(predictConcentration(c, 40).outsideRange).toBe(true);
    expect(predictConcentration(c, 10).outsideRange).toBe(false);
  });

  it("Student t quantiles: t(0.975, 5) = 2.5706, t(0.975, 10) = 2.2281 (standard tables)", () => {
    expect(studentTQuantile(0.975, 5)).toBeCloseTo(2.5706, 4);
    expect(studentTQuantile(0.975, 10)).toBeCloseTo(2.2281, 4);
  });
});

describe("inverse prediction from a weighted calibration (regression: σ was of unit weight)", () => {
  it("σ of x̂ matches a Monte Carlo of refitted lines and new responses (GUM propagation)", () => {
    const xs = [0.05, 0.1, 0.2, 0.35, 0.5], sy = xs.map((x) => 0.02 + 0.05 * x);
    const line = (x: number) => 0.01 + 4 * x; // invented true line
    const normal = seededNormal(99);
    const y0 = line(0.22), sy0 = 0.03;
    const fit = (noise: boolean) =>
      fitCalibration(
        xs.map((x, i) => ({ x, y: line(x) + (noise ? sy[i]! * normal() : 0), sigmaY: sy[i]! })),
        "weighted",
      );
    const predicted = predictConcentration(fit(false), y0, sy0);
    const draws: number[] = [];
    for (let k = 0; k < 3000; k++) {
      draws.push(predictConcentration(fit(true), y0 + sy0 * normal(), sy0).x);
    }
    const mean = draws.reduce((a, v) => a + v, 0) / draws.length;
    const sd = Math.sqrt(draws.reduce((a, v) => a + (v - mean) ** 2, 0) / (draws.length - 1));
    expect(predicted.sigma / sd).toBeGreaterThan(0.9);
    expect(predicted.sigma / sd).toBeLessThan(1.1);
  });
});

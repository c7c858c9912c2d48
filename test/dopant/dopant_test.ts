import { describe, it } from "node:test";
import { expect } from "expect";
import {
  aimDoping,
  type AimProblem,
  bpsEffectiveK,
  checkTarget,
  fitCalibration,
  fitScheil,
  predictConcentration,
  predictLab,
  scheilRatio,
  SMAKULA_K_INTEGRAL,
  smakulaDexter,
} from "../../lib/dopant/mod.ts";
import { studentTQuantile } from "../../lib/numeric/mod.ts";
import { seededNormal } from "../_random.ts";

// Miller & Miller, Statistics and Chemometrics for Analytical Chemistry, worked example of a
// fluorescence calibration (x pg/ml, y intensity): b = 1.93, a = 1.52, r = 0.9989,
// s_y/x = 0.4329, s_b = 0.0409, s_a = 0.2950; x0 for y0 = 13.5 is 6.21 with s_x0 = 0.24.
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

describe("Smakula–Dexter", () => {
  it("the constant from CODATA 2018 constants is 8.20e16 (∫α dE), 0.873e17 Gaussian, 1.288e17 Lorentzian", () => {
    // derived here: N·f = 36 ε0 m_e c/(h e) · n/(n²+2)² · ∫α dE, converted to cm units
    const k = (36 * 8.8541878128e-12 * 9.1093837015e-31 * 299792458) /
      (6.62607015e-34 * 1.602176634e-19) * 1e-4;
    expect(SMAKULA_K_INTEGRAL / k).toBeCloseTo(1, 12);
    expect(Number(SMAKULA_K_INTEGRAL.toPrecision(3))).toBe(8.2e16);
    const n = 1.76, field = n / (n * n + 2) ** 2;
    expect(Number((smakulaDexter(1, 1, n) / field).toPrecision(3))).toBe(8.73e16);
    expect(Number((smakulaDexter(1, 1, n, { shape: "lorentzian" }) / field).toPrecision(3))).toBe(
      1.29e17,
    );
  });
  it("n 1.76, W 0.5 eV, f 1e-4 gives σ_peak = α/N = 3.38e-20 cm² (calculated check)", () => {
    const nf = smakulaDexter(1, 0.5, 1.76);
    expect(Number((1 / (nf / 1e-4)).toPrecision(3))).toBe(3.38e-20);
  });
});

describe("Scheil segregation fit", () => {
  it("recovers k_eff and C0 from noise-free data within 1 %", () => {
    for (const [k, c0] of [[0.18, 0.5], [1.2, 0.2], [0.6, 1.0]]) {
      const pts = [0.05, 0.15, 0.3, 0.45, 0.6, 0.75, 0.9].map((g) => ({
        fraction: g,
        concentration: c0! * scheilRatio(g, k!),
      }));
      const f = fitScheil(pts);
      expect(Math.abs(f.k - k!) / k!).toBeLessThan(0.01);
      expect(Math.abs(f.c0 - c0!) / c0!).toBeLessThan(0.01);
    }
  });
  it("closed form: Scheil ratios for k 0.18 at g 0, 0.5, 0.9 are 0.180, 0.318, 1.189 (calculated)", () => {
    expect(scheilRatio(0, 0.18)).toBeCloseTo(0.18, 3);
    expect(scheilRatio(0.5, 0.18)).toBeCloseTo(0.318, 3);
    expect(scheilRatio(0.9, 0.18)).toBeCloseTo(1.189, 3);
    expect(scheilRatio(0.5, 1.2)).toBeCloseTo(1.045, 3);
  });
  it("with 2 % noise the reported σ is sensible: over 60 profiles k lies within 2σ about 95 % of the time", () => {
    const normal = seededNormal(42);
    let inside = 0;
    for (let r = 0; r < 60; r++) {
      const pts = Array.from({ length: 12 }, (_, i) => {
        const g = 0.04 + 0.075 * i, c = 0.3 * scheilRatio(g, 0.4);
        return { fraction: g, concentration: c * (1 + 0.02 * normal()), sigma: 0.02 * c };
      });
      const f = fitScheil(pts);
      expect(f.kSigma).toBeGreaterThan(0);
      if (Math.abs(f.k - 0.4) <= 2 * f.kSigma) inside++;
    }
    expect(inside / 60).toBeGreaterThan(0.85);
  });
  it("Burton–Prim–Slichter: k_eff → k0 for slow growth and → 1 for fast growth", () => {
    expect(bpsEffectiveK(0.2, 1e-9, 0.01, 1e-5)).toBeCloseTo(0.2, 5);
    expect(bpsEffectiveK(0.2, 1, 0.01, 1e-5)).toBeCloseTo(1, 5);
  });
});

describe("target check", () => {
  it("passes inside the tolerance and says the direction of a miss", () => {
    expect(checkTarget({ L: 50, a: 30, b: 10 }, { L: 50, a: 30, b: 10 }).words).toBe("on target");
    const miss = checkTarget({ L: 44, a: 22, b: 14 }, { L: 50, a: 30, b: 10 }, 2);
    expect(miss.pass).toBe(false);
    expect(miss.words).toMatch(/darker/);
    expect(miss.words).toMatch(/less chroma/);
    expect(miss.words).toMatch(/hue toward yellow/);
  });
});

describe("inverse doping (aim)", () => {
  const nm = Float64Array.from({ length: 471 }, (_, i) => 360 + i);
  const K = 2 * Math.sqrt(2 * Math.LN2);
  const band = (c: number, f: number, h: number) =>
    nm.map((w) => h * Math.exp(-0.5 * ((1e7 / w - c) / (f / K)) ** 2));
  const cr = band(18000, 2800, 10).map((v, i) => v + band(24500, 3200, 13)[i]!);
  const ti = band(20300, 5000, 6);
  const fe = band(26500, 3000, 4).map((v, i) => v + band(22200, 1500, 1.5)[i]!);
  const dopants = [{ name: "Cr", alphaPerUnit: cr }, { name: "Ti", alphaPerUnit: ti }, {
    name: "Fe",
    alphaPerUnit: fe,
  }];

  function problemFor(
    levels: number[],
    path: number,
    free?: { minMm: number; maxMm: number },
    base?: Float64Array,
  ): AimProblem {
    const p: AimProblem = {
      wavelengthNm: nm,
      dopants: dopants.slice(0, levels.length),
      path,
      targets: [{ lab: { L: 0, a: 0, b: 0 }, illuminant: "D65", observer: "10" }, {
        lab: { L: 0, a: 0, b: 0 },
        illuminant: "A",
        observer: "10",
      }],
    };
    if (base) p.baseAlpha = base;
    const labs = predictLab(p, levels, path);
    p.targets.forEach((t, j) => (t.lab = labs[j]!));
    if (free) p.path = free;
    return p;
  }

  for (const levels of [[0.4, 0.15], [0.25, 0.3, 0.6], [0.08, 0.02]]) {
    it(`recovers levels ${levels.join(", ")} within 2 % and ΔE00 ≤ 0.05 (D65 + A targets)`, () => {
      const r = aimDoping(problemFor(levels, 5));
      levels.forEach((v, k) =>
        expect(Math.abs(r.levels[dopants[k]!.name]! - v) / v).toBeLessThan(0.02)
      );
      expect(Math.max(...r.dE00All)).toBeLessThanOrEqual(0.05);
      expect(r.reachable).toBe(true);
      expect(Object.keys(r.sensitivity)).toEqual(
        dopants.slice(0, levels.length).map((d) => d.name),
      );
    });
  }

  it("with the path free and a fixed host absorption, recovers the path too", () => {
    const base = nm.map((w) => 0.15 + 0.05 * (500 / w) ** 4);
    const r = aimDoping(problemFor([0.3, 0.2], 6.5, { minMm: 2, maxMm: 12 }, base));
    expect(Math.abs(r.pathMm - 6.5) / 6.5).toBeLessThan(0.02);
    expect(Math.abs(r.levels["Cr"]! - 0.3) / 0.3).toBeLessThan(0.02);
    expect(r.dE00).toBeLessThanOrEqual(0.05);
  });

  it("reports unreachable for a hue none of the dopants can produce", () => {
    const p: AimProblem = {
      wavelengthNm: nm,
      dopants: [dopants[0]!],
      path: 5,
      targets: [{ lab: { L: 60, a: -45, b: 25 }, illuminant: "D65", observer: "10" }],
    };
    const r = aimDoping(p);
    expect(r.reachable).toBe(false);
    expect(r.message).toMatch(/unreachable/);
  });
});

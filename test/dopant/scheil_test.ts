import { describe, it } from "node:test";
import { expect } from "expect";
import { bpsEffectiveK, fitScheil, scheilRatio } from "../../lib/dopant/mod.ts";
import { seededNormal } from "../_random.ts";

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

import { describe, it } from "node:test";
import { expect } from "expect";
import { aimDoping, type AimProblem, predictLab } from "../../lib/dopant/mod.ts";

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

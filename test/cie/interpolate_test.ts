import { describe, it } from "node:test";
import { expect } from "expect";
import { chooseMethod, GRID_NM, resampleTo1nm } from "../../lib/cie/mod.ts";

const grid = (start: number, end: number, step: number) =>
  Float64Array.from({ length: Math.round((end - start) / step) + 1 }, (_, i) => start + i * step);

describe("resampleTo1nm()", () => {
  it("chooses Sprague for uniform 1–5 nm, ASTM E2022 Lagrange for 10/20 nm, PCHIP for irregular", () => {
    expect(chooseMethod(grid(380, 780, 5))).toBe("sprague");
    expect(chooseMethod(grid(380, 780, 1))).toBe("sprague");
    expect(chooseMethod(grid(380, 780, 10))).toBe("astm-e2022-lagrange");
    expect(chooseMethod(grid(380, 780, 20))).toBe("astm-e2022-lagrange");
    expect(chooseMethod(Float64Array.of(380, 381.5, 383.7, 386, 390, 395))).toBe("pchip");
  });

  it("closed form: Sprague reproduces a quartic exactly outside the two end intervals", () => {
    const nm = grid(360, 830, 5);
    const f = (x: number) => ((x - 600) / 100) ** 4 - 0.3 * ((x - 500) / 100) ** 3 + 0.5;
    const r = resampleTo1nm(nm, nm.map(f), "sprague");
    GRID_NM.forEach((x, g) => {
      if (x > 370 && x < 820) expect(r.values[g]!).toBeCloseTo(f(x), 10);
    });
  });

  it("matches the published Sprague example of the colour-science library (SpragueInterpolator docs)", () => {
    // y at x = 0…6; f(0.25) = 6.7295161…, f(0.5) = 7.2185025…, f(0.75) = 7.8140625…
    // (uses the CIE 167:2005 Table V end points). Scaled here onto a 5 nm axis from 360 nm.
    const y = Float64Array.of(5.92, 9.37, 10.8135, 4.51, 69.59, 27.8007, 86.05);
    const nm = Float64Array.from(y, (_, i) => 360 + 20 * i);
    const r = resampleTo1nm(nm, y, "sprague");
    expect(r.values[5]!).toBeCloseTo(6.7295161, 6);
    expect(r.values[10]!).toBeCloseTo(7.2185025, 6);
    expect(r.values[15]!).toBeCloseTo(7.8140625, 6);
  });

  it("closed form: the Lagrange route reproduces a quadratic exactly over the whole range", () => {
    const nm = grid(360, 830, 10);
    const f = (x: number) => 3e-6 * (x - 550) ** 2 + 0.2;
    const r = resampleTo1nm(nm, nm.map(f), "astm-e2022-lagrange");
    GRID_NM.forEach((x, g) => expect(r.values[g]!).toBeCloseTo(f(x), 10));
  });

  it("identity: every method passes through the measured points", () => {
    const nm = grid(380, 780, 5);
    const v = nm.map((x) => Math.sin(x / 37) ** 2);
    for (const method of ["sprague", "pchip", "linear"] as const) {
      const r = resampleTo1nm(nm, v, method);
      nm.forEach((x, i) => expect(r.values[x - 360]!).toBeCloseTo(v[i]!, 12));
    }
  });

  it("PCHIP never overshoots a step (monotone data stay monotone and in range)", () => {
    const nm = Float64Array.of(360, 400, 401.3, 450, 452.1, 600, 830);
    const v = Float64Array.of(0, 0, 0.2, 0.9, 1, 1, 1);
    const r = resampleTo1nm(nm, v, "pchip").values;
    for (let g = 1; g < r.length; g++) {
      expect(r[g]!).toBeGreaterThanOrEqual(r[g - 1]! - 1e-12);
      expect(r[g]!).toBeLessThanOrEqual(1);
      expect(r[g]!).toBeGreaterThanOrEqual(0);
    }
  });

  it("extends end values as constants and flags it (CIE 15:2018 §7.2.2)", () => {
    const nm = grid(400, 700, 5);
    const v = nm.map((x) => x / 1000);
    const r = resampleTo1nm(nm, v);
    expect(r.extrapolatedBelow).toBe(true);
    expect(r.extrapolatedAbove).toBe(true);
    expect(r.values[0]).toBeCloseTo(0.4, 12);
    expect(r.values[470]).toBeCloseTo(0.7, 12);
    const full = resampleTo1nm(grid(360, 830, 1), new Float64Array(471).fill(0.5));
    expect(full.extrapolatedBelow || full.extrapolatedAbove).toBe(false);
  });
});

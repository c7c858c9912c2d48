import { describe, it } from "node:test";
import { expect } from "expect";
import { bandSeparableModel } from "../../lib/bands/_fit_model.ts";

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
    const n = x.length, q = start.length, m = model.linearCount;
    // pairs (centre, centre), (centre, width), (width, width) per band, then (edge, edge)
    const pairs = [[0, 0], [0, 1], [1, 1], [2, 2], [2, 3], [3, 3], [4, 4]];
    const phi = new Float64Array(m * n), d2 = new Float64Array(pairs.length * n);
    const up = new Float64Array(q * n),
      down = new Float64Array(q * n),
      scratch = new Float64Array(m * n);
    model.basis(start, phi);
    model.curvature!(start, phi, d2);
    pairs.forEach(([k, l], p) => {
      const h = 1e-6 * Math.abs(start[l!]!);
      const tp = start.slice(), tm = start.slice();
      tp[l!] = tp[l!]! + h;
      tm[l!] = tm[l!]! - h;
      model.basis(tp, scratch, up);
      model.basis(tm, scratch, down);
      let worst = 0, scale = 0;
      for (let i = 0; i < n; i++) {
        const fd = (up[k! * n + i]! - down[k! * n + i]!) / (2 * h);
        worst = Math.max(worst, Math.abs(fd - d2[p * n + i]!));
        scale = Math.max(scale, Math.abs(d2[p * n + i]!));
      }
      expect(scale).toBeGreaterThan(0);
      expect(worst).toBeLessThan(1e-5 * scale);
    });
  });
});

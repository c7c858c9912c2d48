import { describe, it } from "node:test";
import { expect } from "expect";
import { thicknessSeries } from "../../lib/cie/thickness_series.ts";
import type { Spectrum } from "../../lib/spectrum/spectrum.ts";

/** A slab with one green-absorbing band (α in cm⁻¹, natural log): chroma rises, then falls. */
function slab(): Spectrum {
  const nm = Float64Array.from({ length: 95 }, (_, i) => 360 + 5 * i);
  return {
    wavelengthNm: nm,
    values: nm.map((w) => 3 * Math.exp(-0.5 * ((w - 550) / 45) ** 2)),
    quantity: "alpha",
    meta: { sample: "band" },
  };
}

describe("thickness series: where chroma peaks", () => {
  it("a maximum inside the range is a maximum (C* lower on both sides)", () => {
    const s = thicknessSeries(slab(), { fromMm: 0.5, toMm: 60, steps: 60 });
    expect(s.maxChromaAtRangeEnd).toBe(false);
    const c = (p: number) =>
      thicknessSeries(slab(), { fromMm: p, toMm: p + 1e-6, steps: 1 }).points[0]!.C;
    expect(c(s.maxChromaPathMm)).toBeGreaterThan(c(s.maxChromaPathMm * 0.8));
    expect(c(s.maxChromaPathMm)).toBeGreaterThan(c(s.maxChromaPathMm * 1.25));
  });
  it("a range that ends while chroma still rises says so (regression: reported as a maximum)", () => {
    const s = thicknessSeries(slab(), { fromMm: 0.2, toMm: 1, steps: 8 });
    expect(s.maxChromaAtRangeEnd).toBe(true);
    expect(s.maxChromaPathMm).toBeCloseTo(1, 6);
  });
});

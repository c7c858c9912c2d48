import { describe, it } from "node:test";
import { expect } from "expect";
import {
  absorbanceToAlphaPerCm,
  alphaPerCmToAbsorbance,
  axisToNm,
  nmToEv,
  type Spectrum,
  transmittanceAtPath,
  transmittanceToAbsorbance,
} from "../../lib/spectrum/mod.ts";

const spectrum = (
  values: number[],
  quantity: Spectrum["quantity"],
  thicknessMm?: number,
): Spectrum => ({
  wavelengthNm: Float64Array.from(values, (_, i) => 400 + 10 * i),
  values: Float64Array.from(values),
  quantity,
  ...(thicknessMm === undefined ? {} : { thicknessMm }),
  meta: { sample: "s" },
});

describe("ordinate conversions (Beer–Lambert)", () => {
  it("closed form: T 0.1 is A 1; α = A ln10 / d", () => {
    expect(transmittanceToAbsorbance(0.1)).toBeCloseTo(1, 12);
    // A = 1 over 2 mm = 0.2 cm → α = ln 10 / 0.2 = 11.5129… cm⁻¹
    expect(absorbanceToAlphaPerCm(1, 2)).toBeCloseTo(Math.LN10 / 0.2, 12);
    expect(alphaPerCmToAbsorbance(Math.LN10 / 0.2, 2)).toBeCloseTo(1, 12);
  });

  it("identity: doubling the path squares the transmittance", () => {
    const s = spectrum([0.9, 0.5, 0.2, 0.05, 0.7], "transmittance", 2);
    const t4 = transmittanceAtPath(s, 4);
    s.values.forEach((t, i) => expect(t4[i]!).toBeCloseTo(t * t, 12));
  });

  it("α spectra rescale to any path; T at path 0 is 1", () => {
    const s = spectrum([1, 2, 5, 10, 0], "alpha");
    const t = transmittanceAtPath(s, 10);
    s.values.forEach((alpha, i) => expect(t[i]!).toBeCloseTo(Math.exp(-alpha * 1), 12));
    expect([...transmittanceAtPath(s, 0)]).toEqual([1, 1, 1, 1, 1]);
  });

  it("refuses to rescale without a known thickness", () => {
    expect(() => transmittanceAtPath(spectrum([0.5, 0.5, 0.5], "transmittance"), 3)).toThrow(
      /thickness/,
    );
  });
});

describe("axis conversions", () => {
  it("closed form: 20000 cm⁻¹ is 500 nm; 2 eV is 619.92 nm (CODATA 2018 hc)", () => {
    expect(axisToNm(20000, "cm-1")).toBe(500);
    expect(axisToNm(0.5, "um")).toBe(500);
    expect(axisToNm(2, "ev")).toBeCloseTo(619.920992, 5);
    expect(nmToEv(619.920992166)).toBeCloseTo(2, 9);
  });
});

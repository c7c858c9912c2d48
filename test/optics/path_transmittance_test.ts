import { describe, it } from "node:test";
import { expect } from "expect";
import {
  pathRescaling,
  transmittanceForPath,
  unpolarisedTransmittance,
} from "../../lib/optics/mod.ts";
import type { Spectrum } from "../../lib/spectrum/mod.ts";

const slab = (
  values: number[],
  thicknessMm: number,
  quantity: Spectrum["quantity"] = "transmittance",
): Spectrum => ({
  wavelengthNm: Float64Array.from(values, (_, i) => 400 + 50 * i),
  values: Float64Array.from(values),
  quantity,
  thicknessMm,
  meta: { sample: "slab" },
});

describe("pathRescaling(): one spectrum, many paths", () => {
  it("closed form (Beer–Lambert, Fresnel slab): each path as a fresh call, in any order", () => {
    const s = slab([0.8, 0.4, 0.1, 0.6, 0.84], 2);
    for (
      const settings of [
        { reflection: "none" as const },
        { reflection: "host" as const, host: "corundum" },
        { reflection: "host" as const, n: 1.76, surfaces: false },
      ]
    ) {
      const rescale = pathRescaling(s, settings);
      for (const path of [3, 0.5, 6, 2, 3]) {
        const fresh = transmittanceForPath(s, path, settings);
        expect(Array.from(rescale(path).values)).toEqual(Array.from(fresh.values));
        expect(rescale(path).warnings).toEqual(fresh.warnings);
      }
      // A(2d) = 2·A(d) for the internal part (Beer–Lambert) through the reused rescaler
      if (settings.reflection === "none") {
        const a3 = rescale(3).values, a6 = rescale(6).values;
        a3.forEach((t, i) => expect(-Math.log10(a6[i]!)).toBeCloseTo(-2 * Math.log10(t), 12));
      }
    }
    expect(() => pathRescaling(s)(-1)).toThrow(RangeError);
  });
});

describe("transmittanceForPath()", () => {
  it("identity: with reflection off, doubling the path doubles the absorbance exactly", () => {
    const s = slab([0.8, 0.4, 0.1, 0.6, 0.9], 2);
    const a1 = transmittanceForPath(s, 3).values.map((t) => -Math.log10(t));
    const a2 = transmittanceForPath(s, 6).values.map((t) => -Math.log10(t));
    a1.forEach((a, i) => expect(a2[i]!).toBeCloseTo(2 * a, 12));
  });

  it("with host surfaces: the measured path gives back the measurement; α is path-independent", () => {
    const s = slab([0.8, 0.4, 0.1, 0.6, 0.84], 2);
    const settings = { reflection: "host" as const, host: "corundum" };
    const same = transmittanceForPath(s, 2, settings).values;
    s.values.forEach((t, i) => expect(same[i]!).toBeCloseTo(t, 12));
    const t4 = transmittanceForPath(s, 4, settings).values;
    const t4internal = transmittanceForPath(s, 4, { ...settings, surfaces: false }).values;
    const t2internal = transmittanceForPath(s, 2, { ...settings, surfaces: false }).values;
    t4internal.forEach((x, i) => expect(x).toBeCloseTo(t2internal[i]! ** 2, 12));
    t4.forEach((t, i) => expect(t).toBeLessThan(s.values[i]!));
  });

  it("an α spectrum needs no thickness and gets the surfaces from the constant n", () => {
    const s = slab([2, 2, 2, 2, 2], 1, "alpha");
    const t = transmittanceForPath(s, 10, { reflection: "host", n: 1.768 }).values;
    expect(t[0]!).toBeCloseTo(0.115313, 6);
  });

  it("unpolarised light averages the transmittances, not the absorbances", () => {
    const t = unpolarisedTransmittance([0.9, 0.1], [0.1, 0.9]);
    expect([...t]).toEqual([0.5, 0.5]);
  });
});

describe("rescaling a spectrum measured down to the photometric floor", () => {
  it("says so when the path is shorter than the measured slab, not when it is longer", async () => {
    const { photometricFloorWarning } = await import("../../lib/optics/path_transmittance.ts");
    // absorbance 4.5 is T = 3e-5: at the floor of most spectrophotometers (common practice)
    const s = slab([0.00003, 0.00003, 0.4, 0.6, 0.9], 4);
    expect(photometricFloorWarning(s, 1).join(" ")).toMatch(/2 point\(s\) between 400 and 450 nm/);
    expect(photometricFloorWarning(s, 6)).toEqual([]);
    expect(transmittanceForPath(s, 1).warnings.join(" ")).toMatch(/photometric floor/);
  });
});

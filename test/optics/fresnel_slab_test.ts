import { describe, it } from "node:test";
import { expect } from "expect";
import {
  fresnelReflectance,
  internalFromSlab,
  losslessSlabTransmittance,
  slabTransmittance,
} from "../../lib/optics/mod.ts";

describe("Fresnel surfaces and the incoherent slab", () => {
  it("closed form: R = ((n−1)/(n+1))², lossless T₀ = 2n/(n²+1), worked by hand", () => {
    // n = 1.768: R = (0.768/2.768)² = 0.2774566² = 0.0769822…; T₀ = 3.536 / 4.125824 = 0.857041…
    expect(fresnelReflectance(1.768)).toBeCloseTo(0.0769822, 7);
    expect(losslessSlabTransmittance(fresnelReflectance(1.768))).toBeCloseTo(
      3.536 / (1.768 ** 2 + 1),
      12,
    );
    expect(slabTransmittance(1, fresnelReflectance(1.5))).toBeCloseTo(3 / 3.25, 12);
  });

  it("closed form: n 1.768, d 1 cm, α 2 cm⁻¹ gives T 0.115313 and inverts to α 2.0000", () => {
    const r = fresnelReflectance(1.768);
    const t = slabTransmittance(Math.exp(-2), r);
    // by hand: (1−R)² e⁻² / (1 − R² e⁻⁴) = 0.851961·0.135335 / (1 − 0.005926·0.018316)
    expect(t).toBeCloseTo(0.115313, 6);
    expect(-Math.log(internalFromSlab(t, r))).toBeCloseTo(2, 12);
    // the shortcut −ln(T/T₀)/d is biased (2.0058), which is why the inversion is used
    expect(-Math.log(t / losslessSlabTransmittance(r))).toBeCloseTo(2.0058, 4);
  });

  it("identity: T → internal → T round trip to 1e-12 over a range of T and R", () => {
    for (const r of [0, 0.01, 0.0458, 0.0770, 0.2]) {
      for (const x of [1e-6, 0.01, 0.3, 0.7, 0.999, 1]) {
        const t = slabTransmittance(x, r);
        expect(Math.abs(internalFromSlab(t, r) - x)).toBeLessThan(1e-12);
      }
    }
  });
});

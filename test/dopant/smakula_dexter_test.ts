import { describe, it } from "node:test";
import { expect } from "expect";
import { SMAKULA_K_INTEGRAL, smakulaDexter } from "../../lib/dopant/mod.ts";

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

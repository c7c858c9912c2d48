/**
 * CIE daylight illuminants from correlated colour temperature (CIE 15:2018 §3.1, eq. 3.3–3.5).
 *
 * @module
 */
import { table as components } from "./data/daylight_components.ts";
import { tabulatedTo1nm } from "./_tabulated.ts";

/** Chromaticity (x_D, y_D) of CIE daylight at a correlated colour temperature in K (4000–25000). */
export function daylightChromaticity(cctK: number): { x: number; y: number } {
  if (!(cctK >= 4000 && cctK <= 25000)) {
    throw new RangeError(`Cannot build daylight for ${cctK} K: valid range is 4000–25000 K`);
  }
  const t = cctK;
  const x = t <= 7000
    ? -4.607e9 / t ** 3 + 2.9678e6 / t ** 2 + 0.09911e3 / t + 0.244063
    : -2.0064e9 / t ** 3 + 1.9018e6 / t ** 2 + 0.24748e3 / t + 0.23704;
  return { x, y: -3 * x * x + 2.87 * x - 0.275 };
}

/** The factors M1, M2 for a daylight chromaticity, rounded to 3 decimals as CIE 15 prescribes. */
export function daylightFactors(x: number, y: number): { m1: number; m2: number } {
  const m = 0.0241 + 0.2562 * x - 0.7341 * y;
  const round3 = (v: number) => Math.round(v * 1000) / 1000;
  return {
    m1: round3((-1.3515 - 1.7703 * x + 5.9114 * y) / m),
    m2: round3((0.03 - 31.4424 * x + 30.0717 * y) / m),
  };
}

/**
 * Relative SPD of CIE daylight at 5 nm, 300–830 nm: S = S0 + M1·S1 + M2·S2.
 *
 * @param cctK Correlated colour temperature in K on the current scale (D65 ≈ 6504 K,
 *   i.e. the nominal 6500 K × 1.4388/1.4380).
 */
export function daylightSpd5nm(cctK: number): Float64Array<ArrayBuffer> {
  const { x, y } = daylightChromaticity(cctK);
  const { m1, m2 } = daylightFactors(x, y);
  const { s0, s1, s2 } = components.columns;
  return s0!.map((v, i) => v + m1 * s1![i]! + m2 * s2![i]!);
}

/**
 * Daylight SPD on the 360–830 nm 1 nm grid, Sprague-interpolated from the 5 nm recipe values
 * (CIE 167); this reproduces the ASTM E308-01 white points of D50 to the third decimal.
 * D65 itself uses the CIE's tabulated values (see illuminants.ts).
 */
export function daylightSpd(cctK: number): Float64Array<ArrayBuffer> {
  return tabulatedTo1nm(components.startNm, components.stepNm, daylightSpd5nm(cctK), "sprague");
}

/** A nominal D-series temperature (e.g. 5000 for D50) on the current c2 scale. */
export function nominalToCct(nominalK: number): number {
  return (nominalK * 1.4388) / 1.438;
}

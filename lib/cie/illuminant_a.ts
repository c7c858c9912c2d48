/**
 * CIE standard illuminant A from its definition (CIE 15:2018 §3.1, eq. 3.1):
 * S_A(λ) = 100 (560/λ)^5 [exp(1.435e7/(2848·560)) − 1] / [exp(1.435e7/(2848·λ)) − 1], λ in nm.
 *
 * @module
 */
import { GRID_NM } from "./grid.ts";

/** Relative spectral power of illuminant A at a wavelength in nm (S(560) = 100). */
export function illuminantA(wavelengthNm: number): number {
  const c = 1.435e7 / 2848;
  return (100 * (560 / wavelengthNm) ** 5 * Math.expm1(c / 560)) / Math.expm1(c / wavelengthNm);
}

/** Illuminant A on the 360–830 nm 1 nm grid. */
export function illuminantASpd(): Float64Array<ArrayBuffer> {
  return GRID_NM.map(illuminantA);
}

/**
 * Figure of merit of titanium-doped sapphire laser crystals: absorption at the pump band over
 * the residual near-infrared absorption, same polarisation (common practice; Aggarwal et al.,
 * IEEE J. Quantum Electron. 24, 1003 (1988), from memory). Typical 100–300, best annealed
 * crystals several hundred (from memory).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { spectrumAbsorbance } from "../spectrum/ordinate.ts";

/** Value of a spectrum's absorbance (or α) at a wavelength, by linear interpolation. */
function valueAt(nm: Float64Array, y: Float64Array, at: number): number {
  if (at < nm[0]! || at > nm[nm.length - 1]!) {
    throw new RangeError(`Cannot read ${at} nm: outside the data`);
  }
  let j = 0;
  while (j < nm.length - 2 && nm[j + 1]! < at) j++;
  const f = (at - nm[j]!) / (nm[j + 1]! - nm[j]!);
  return y[j]! * (1 - f) + y[j + 1]! * f;
}

/** α(pump) / α(residual) from a spectrum (absorbance or α; the ratio needs no thickness). */
export function figureOfMerit(spectrum: Spectrum, pumpNm = 490, residualNm = 820): number {
  const y = spectrum.quantity === "alpha" ? spectrum.values : spectrumAbsorbance(spectrum);
  return valueAt(spectrum.wavelengthNm, y, pumpNm) / valueAt(spectrum.wavelengthNm, y, residualNm);
}

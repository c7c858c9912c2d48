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
import { valueAt } from "../spectrum/linear_resample.ts";

/** α(pump) / α(residual) from a spectrum (absorbance or α; the ratio needs no thickness). */
export function figureOfMerit(spectrum: Spectrum, pumpNm = 490, residualNm = 820): number {
  const y = spectrum.quantity === "alpha" ? spectrum.values : spectrumAbsorbance(spectrum);
  return valueAt(spectrum.wavelengthNm, y, pumpNm) / valueAt(spectrum.wavelengthNm, y, residualNm);
}

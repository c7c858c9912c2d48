/**
 * Smakula–Dexter estimate of the absorbing-centre density times oscillator strength
 * (Smakula, Z. Phys. 59, 603 (1930); Dexter, Phys. Rev. 101, 48 (1956)):
 *   N·f = K · n/(n² + 2)² · ∫α dE,   K = 36 ε0 m_e c / (h e) = 8.20×10¹⁶ cm⁻³ (cm⁻¹ eV)⁻¹,
 * with ∫α dE = α_max·W·√(π/(4 ln 2)) for a Gaussian band (K_G = 0.873×10¹⁷) or α_max·W·π/2
 * for a Lorentzian (1.288×10¹⁷), W the FWHM in eV. The factor 9/(n²+2)² is the local-field
 * correction; some authors drop it for ions in crystals, so it is a switch. An order-of-
 * magnitude estimate that needs the oscillator strength f from the literature.
 *
 * @module
 */

/** CODATA 2018 constants (SI, exact where defined). */
const EPSILON0 = 8.8541878128e-12, ELECTRON_MASS = 9.1093837015e-31, C = 299792458;
const PLANCK = 6.62607015e-34, ELEMENTARY_CHARGE = 1.602176634e-19;

/** K for ∫α dE in cm⁻³ per (cm⁻¹·eV), from CODATA constants. */
export const SMAKULA_K_INTEGRAL: number =
  ((36 * EPSILON0 * ELECTRON_MASS * C) / (PLANCK * ELEMENTARY_CHARGE)) * 1e-4;

/** Options of {@linkcode smakulaDexter}. */
export interface SmakulaOptions {
  /** Band shape (default gaussian). */
  shape?: "gaussian" | "lorentzian";
  /** Include the local-field factor 9/(n²+2)² (default true). */
  localField?: boolean;
}

/** N·f in cm⁻³ from peak α (cm⁻¹), FWHM (eV) and refractive index n at the band. */
export function smakulaDexter(
  alphaMaxPerCm: number,
  fwhmEv: number,
  n: number,
  options: SmakulaOptions = {},
): number {
  const { shape = "gaussian", localField = true } = options;
  const integral = alphaMaxPerCm * fwhmEv *
    (shape === "gaussian" ? Math.sqrt(Math.PI / (4 * Math.LN2)) : Math.PI / 2);
  const field = localField ? (9 * n) / (n * n + 2) ** 2 : n;
  return (SMAKULA_K_INTEGRAL / 9) * field * integral;
}

/** Number density N (cm⁻³) from a fitted band and the oscillator strength f the user supplies. */
export function densityFromBand(
  alphaMaxPerCm: number,
  fwhmCm1: number,
  n: number,
  f: number,
  options: SmakulaOptions = {},
): number {
  const fwhmEv = fwhmCm1 * 1.239841984e-4;
  return smakulaDexter(alphaMaxPerCm, fwhmEv, n, options) / f;
}

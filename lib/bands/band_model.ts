/**
 * The band model in wavenumber: Σ bands (Gaussian or Lorentzian in energy) + baseline
 * b0 + b1·t + b2·t² + s·(ν̃/20000)⁴, with t = (ν̃ − ν̃mid)/ν̃half the scaled position and the
 * last term a λ⁻⁴ (Rayleigh-type) scatter. Absorption bands of ions in crystals are
 * Gaussian in energy (configurational-coordinate model; Henderson & Imbusch, Optical
 * Spectroscopy of Inorganic Solids, 1989, ch. 5), so the fit runs in cm⁻¹, not nm.
 *
 * @module
 */

/** Band line shape. */
export type BandShape = "gaussian" | "lorentzian";

/** Conversion FWHM ↔ σ of a Gaussian: FWHM = 2√(2 ln 2) σ. */
export const FWHM_PER_SIGMA: number = 2 * Math.sqrt(2 * Math.LN2);

/** Area under one band over cm⁻¹: Gaussian h·FWHM·√(π/(4 ln 2)); Lorentzian h·FWHM·π/2. */
export function bandArea(height: number, fwhm: number, shape: BandShape): number {
  return shape === "gaussian"
    ? height * fwhm * Math.sqrt(Math.PI / (4 * Math.LN2))
    : (height * fwhm * Math.PI) / 2;
}

/** Layout of the parameter vector: 3 per band (height, centre, FWHM), then 4 baseline terms. */
export interface ModelLayout {
  shapes: BandShape[];
  mid: number;
  half: number;
  /** Baseline terms in use (a term left out is held at zero). */
  baselineTerms: ("b0" | "b1" | "b2" | "scatter")[];
}

/** Number of parameters of a layout. */
export function parameterCount(layout: ModelLayout): number {
  return 3 * layout.shapes.length + layout.baselineTerms.length;
}

/**
 * Evaluates the model and (optionally) its Jacobian at wavenumbers `x`, into preallocated
 * arrays: `out[i]`, `jac[i * p + k]` = ∂model/∂param k at x[i]. No allocation.
 */
export function evaluateModel(
  x: Float64Array,
  params: Float64Array,
  layout: ModelLayout,
  out: Float64Array,
  jac?: Float64Array,
): void {
  const nb = layout.shapes.length;
  const p = parameterCount(layout);
  const n = x.length;
  for (let i = 0; i < n; i++) {
    const nu = x[i]!;
    let y = 0;
    const row = i * p;
    for (let b = 0; b < nb; b++) {
      const h = params[3 * b]!, c = params[3 * b + 1]!, f = params[3 * b + 2]!;
      const d = nu - c;
      if (layout.shapes[b] === "gaussian") {
        const s = f / FWHM_PER_SIGMA;
        const g = Math.exp(-0.5 * (d / s) ** 2);
        y += h * g;
        if (jac) {
          jac[row + 3 * b] = g;
          jac[row + 3 * b + 1] = (h * g * d) / (s * s);
          jac[row + 3 * b + 2] = (h * g * d * d) / (s * s * s) / FWHM_PER_SIGMA;
        }
      } else {
        const hw = f / 2;
        const q = 1 / (1 + (d / hw) ** 2);
        y += h * q;
        if (jac) {
          jac[row + 3 * b] = q;
          jac[row + 3 * b + 1] = (h * q * q * 2 * d) / (hw * hw);
          jac[row + 3 * b + 2] = (h * q * q * d * d) / (hw * hw * hw);
        }
      }
    }
    const t = (nu - layout.mid) / layout.half;
    let k = 3 * nb;
    for (const term of layout.baselineTerms) {
      const basis = term === "b0"
        ? 1
        : term === "b1"
        ? t
        : term === "b2"
        ? t * t
        : (nu / 20000) ** 4;
      y += params[k]! * basis;
      if (jac) jac[row + k] = basis;
      k++;
    }
    out[i] = y;
  }
}

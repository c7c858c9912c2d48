/**
 * Exact first derivatives of the path transmittance of {@linkcode transmittanceForPath} with
 * respect to each measured value, the measured thickness, the target path and a shift of the
 * wavelength scale — the sensitivity coefficients of GUM (JCGM 100:2008 §5.1.3) for the
 * Beer–Lambert rescaling T_path = T^(p/d) and for the incoherent slab with its closed-form
 * inversion (see slab.ts).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { MAX_ABSORBANCE, spectrumAbsorbance } from "../spectrum/ordinate.ts";
import {
  type ReflectionSettings,
  surfaceReflectance,
  transmittanceForPath,
} from "./path_transmittance.ts";
import { internalFromSlab } from "./slab.ts";

/** Path transmittance and its derivatives, one entry per point of the spectrum's grid. */
export interface PathTransmittanceSensitivity {
  /** T at the path, the same values {@linkcode transmittanceForPath} returns. */
  transmittance: Float64Array<ArrayBuffer>;
  /** ∂T_i/∂v_i, v_i the measured value in the spectrum's own ordinate. */
  perValue: Float64Array<ArrayBuffer>;
  /** ∂T_i/∂d, d the measured thickness in mm (zero when the path is not rescaled). */
  perThicknessMm: Float64Array<ArrayBuffer>;
  /** ∂T_i/∂p, p the target path in mm (zero when no path is given). */
  perPathMm: Float64Array<ArrayBuffer>;
  /**
   * ∂T_i/∂s for a wavelength-scale shift s in nm: the reading labelled λ was taken at λ + s,
   * so the value belonging to λ_i is v(λ_i − s) and ∂T_i/∂s = −dT/dλ (three-point differences).
   */
  perShiftNm: Float64Array<ArrayBuffer>;
  warnings: string[];
}

/** dT/dλ by the three-point formula for unequal steps, one-sided at the ends. */
function slopePerNm(nm: Float64Array, t: Float64Array): Float64Array<ArrayBuffer> {
  const n = nm.length;
  const out = new Float64Array(n);
  if (n < 2) return out;
  out[0] = (t[1]! - t[0]!) / (nm[1]! - nm[0]!);
  out[n - 1] = (t[n - 1]! - t[n - 2]!) / (nm[n - 1]! - nm[n - 2]!);
  for (let i = 1; i < n - 1; i++) {
    const hm = nm[i]! - nm[i - 1]!, hp = nm[i + 1]! - nm[i]!;
    out[i] = (hm * hm * t[i + 1]! - hp * hp * t[i - 1]! + (hp * hp - hm * hm) * t[i]!) /
      (hm * hp * (hm + hp));
  }
  return out;
}

/** ∂T_measured/∂v for transmittance or absorbance data (the clamp of the absorbance reading). */
function measuredPerValue(quantity: Spectrum["quantity"], v: number, tMeasured: number): number {
  if (quantity === "absorbance") return -Math.LN10 * tMeasured;
  return v > 10 ** -MAX_ABSORBANCE ? 1 : 0;
}

/**
 * Path transmittance of a spectrum and its sensitivity to every input quantity.
 *
 * @param spectrum The measured spectrum (transmittance, absorbance, α or reflectance).
 * @param pathMm Target path in mm; when omitted the measured slab is used as it is.
 * @param settings Surface treatment, as for {@linkcode transmittanceForPath}.
 * @returns Values and derivatives on the spectrum's grid.
 * @throws {RangeError} When the rescaling needs a thickness, host or index that is missing.
 *
 * @example Beer–Lambert: ∂T/∂d = −T·ln(T)/d (closed form)
 * ```ts
 * import { pathTransmittanceSensitivity } from "./path_transmittance_sensitivity.ts";
 * const s = pathTransmittanceSensitivity({
 *   wavelengthNm: Float64Array.of(500, 600), values: Float64Array.of(0.5, 0.8),
 *   quantity: "transmittance", thicknessMm: 2, meta: { sample: "x" },
 * }, 6);
 * const t = s.transmittance[0]!;
 * if (Math.abs(s.perThicknessMm[0]! + t * Math.log(t) / 2) > 1e-12) throw new Error("slope");
 * ```
 */
export function pathTransmittanceSensitivity(
  spectrum: Spectrum,
  pathMm: number | undefined,
  settings: ReflectionSettings = { reflection: "none" },
): PathTransmittanceSensitivity {
  const { values: transmittance, warnings } = transmittanceForPath(spectrum, pathMm, settings);
  const n = transmittance.length;
  const perValue = new Float64Array(n);
  const perThicknessMm = new Float64Array(n);
  const perPathMm = new Float64Array(n);
  const q = spectrum.quantity;
  const v = spectrum.values;
  const d = spectrum.thicknessMm;
  if (q === "reflectance") {
    perValue.fill(1);
  } else if (settings.reflection === "none") {
    if (q === "alpha") {
      // T = exp(−α·L/10), L = p when given, else the measured thickness
      const path = pathMm ?? d!;
      for (let i = 0; i < n; i++) {
        const t = transmittance[i]!;
        perValue[i] = (-path / 10) * t;
        if (pathMm === undefined) perThicknessMm[i] = (-v[i]! / 10) * t;
        else perPathMm[i] = (-v[i]! / 10) * t;
      }
    } else if (pathMm === undefined) {
      for (let i = 0; i < n; i++) {
        perValue[i] = q === "absorbance" ? -Math.LN10 * transmittance[i]! : 1;
      }
    } else {
      // T = 10^(−A·p/d): ln T = −ln10·A·p/d
      const a = spectrumAbsorbance(spectrum);
      const scale = pathMm / d!;
      for (let i = 0; i < n; i++) {
        const t = transmittance[i]!;
        const dTdA = -Math.LN10 * scale * t;
        const dAdv = q === "absorbance"
          ? 1
          : v[i]! > 10 ** -MAX_ABSORBANCE
          ? -1 / (v[i]! * Math.LN10)
          : 0;
        perValue[i] = dTdA * dAdv;
        perThicknessMm[i] = (t * Math.LN10 * a[i]! * pathMm) / (d! * d!);
        perPathMm[i] = (-t * Math.LN10 * a[i]!) / d!;
      }
    }
  } else {
    const { r } = surfaceReflectance(spectrum.wavelengthNm, settings, spectrum.polarisation);
    const surfaces = settings.surfaces ?? true;
    const path = pathMm ?? d!;
    const a = q === "alpha" ? undefined : spectrumAbsorbance(spectrum);
    for (let i = 0; i < n; i++) {
      const ri = r[i]!;
      let k: number, dxdv: number, dxdd: number;
      let x: number;
      if (q === "alpha") {
        k = -v[i]! / 10;
        x = Math.exp(k * path);
        dxdv = (-path / 10) * x;
        dxdd = pathMm === undefined ? k * x : 0;
      } else {
        const tm = 10 ** -a![i]!;
        const xm = Math.max(internalFromSlab(tm, ri), 1e-300);
        k = Math.log(xm) / d!;
        x = Math.exp(k * path);
        // implicit derivative of T R² x² + (1−R)² x − T = 0; zero where x is clamped to 1
        const dxmdT = xm >= 1 || tm <= 0
          ? 0
          : (1 - ri * ri * xm * xm) / ((1 - ri) ** 2 + 2 * tm * ri * ri * xm);
        dxdv = ((path / d!) * x / xm) * dxmdT * measuredPerValue(q, v[i]!, tm);
        dxdd = pathMm === undefined ? 0 : -x * k * path / d!;
      }
      const dxdp = pathMm === undefined ? 0 : k * x;
      const dTdx = surfaces
        ? ((1 - ri) ** 2 * (1 + ri * ri * x * x)) / (1 - ri * ri * x * x) ** 2
        : 1;
      perValue[i] = dTdx * dxdv;
      perThicknessMm[i] = dTdx * dxdd;
      perPathMm[i] = dTdx * dxdp;
    }
  }
  const perShiftNm = slopePerNm(spectrum.wavelengthNm, transmittance).map((s) => -s);
  return { transmittance, perValue, perThicknessMm, perPathMm, perShiftNm, warnings };
}

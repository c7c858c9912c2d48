/**
 * Conversions between transmittance, absorbance (log10) and absorption coefficient.
 * Beer–Lambert law: T = 10^(−A), A = α·d / ln 10 with d in cm.
 *
 * @module
 */
import type { Spectrum } from "./spectrum.ts";
import { NeedsValueError } from "./needs_value_error.ts";

/** Absorbance assigned to T ≤ 0 (a reading at or below the dark level). */
export const MAX_ABSORBANCE = 10;

/** Decadic absorbance from transmittance (fraction); T ≤ 0 maps to {@linkcode MAX_ABSORBANCE}. */
export function transmittanceToAbsorbance(t: number): number {
  return t > 10 ** -MAX_ABSORBANCE ? -Math.log10(t) : MAX_ABSORBANCE;
}

/** Transmittance (fraction) from decadic absorbance. */
export function absorbanceToTransmittance(a: number): number {
  return 10 ** -a;
}

/** Absorption coefficient α in cm⁻¹ from decadic absorbance over a path in mm. */
export function absorbanceToAlphaPerCm(a: number, pathMm: number): number {
  return (a * Math.LN10) / (pathMm / 10);
}

/** Decadic absorbance over a path in mm from α in cm⁻¹. */
export function alphaPerCmToAbsorbance(alphaPerCm: number, pathMm: number): number {
  return (alphaPerCm * (pathMm / 10)) / Math.LN10;
}

/**
 * Decadic absorbance of a spectrum as measured (for α, over `thicknessMm`).
 *
 * @throws {RangeError} When the spectrum holds α but no thickness is known, or holds reflectance.
 */
export function spectrumAbsorbance(spectrum: Spectrum): Float64Array<ArrayBuffer> {
  const { values, quantity } = spectrum;
  switch (quantity) {
    case "absorbance":
      return values.slice();
    case "transmittance":
      return values.map(transmittanceToAbsorbance);
    case "alpha": {
      const d = spectrum.thicknessMm;
      if (d === undefined || !(d > 0)) {
        throw new RangeError(
          `Cannot convert α of "${spectrum.meta.sample}" to absorbance: no thickness is known`,
        );
      }
      return values.map((v) => alphaPerCmToAbsorbance(v, d));
    }
    case "reflectance":
      throw new RangeError(
        `Cannot convert reflectance of "${spectrum.meta.sample}" to absorbance`,
      );
  }
}

/**
 * Whether {@linkcode transmittanceAtPath} gives the spectrum's values unchanged (a copy):
 * reflectance, or transmittance at its measured path.
 */
export function transmittanceIsValues(
  spectrum: Pick<Spectrum, "quantity">,
  pathMm?: number,
): boolean {
  return spectrum.quantity === "reflectance" ||
    (pathMm === undefined && spectrum.quantity === "transmittance");
}

/**
 * Transmittance of a spectrum rescaled to another path length by Beer–Lambert
 * (absorbance proportional to path; surface reflections are not separated here).
 *
 * @param pathMm Target path in mm; when omitted the measured thickness is kept.
 * @throws {RangeError} When the rescaling needs a thickness that is not known.
 */
export function transmittanceAtPath(
  spectrum: Spectrum,
  pathMm?: number,
): Float64Array<ArrayBuffer> {
  if (transmittanceIsValues(spectrum, pathMm)) return spectrum.values.slice();
  if (pathMm === undefined) return spectrumAbsorbance(spectrum).map(absorbanceToTransmittance);
  if (!(pathMm >= 0)) throw new RangeError(`Cannot use path ${pathMm} mm: must be ≥ 0`);
  if (spectrum.quantity === "alpha") {
    return spectrum.values.map((v) => absorbanceToTransmittance(alphaPerCmToAbsorbance(v, pathMm)));
  }
  const d = spectrum.thicknessMm;
  if (d === undefined || !(d > 0)) {
    throw new NeedsValueError(
      `Cannot rescale "${spectrum.meta.sample}" to ${pathMm} mm: the measured thickness is not known`,
      "thickness",
    );
  }
  const scale = pathMm / d;
  return spectrumAbsorbance(spectrum).map((a) => absorbanceToTransmittance(a * scale));
}

/**
 * A spectrum as it is written to a file: the x axis in the chosen unit (ascending in that
 * unit) and the ordinate in the chosen presentation (T or %T, R or %R, A, α in base e or 10).
 * λ ↔ ν̃ ↔ E by λ[nm] = 10⁷ / ν̃[cm⁻¹] = hc / E (CODATA 2018); α₁₀ = α / ln 10 (IUPAC Gold Book,
 * decadic vs napierian absorption coefficient).
 *
 * @module
 */
import { type AxisUnit, HC_EV_NM, nmToWavenumber } from "../spectrum/axis.ts";
import type { Quantity, Spectrum } from "../spectrum/spectrum.ts";
import type { OrdinateKind } from "./header_units.ts";

/** Base of the logarithm in an absorption coefficient: napierian (e) or decadic (10). */
export type AlphaBase = "e" | "10";

/** How to present a spectrum in a file. */
export interface ColumnOptions {
  /** Unit of the written x axis. @default "nm" */
  axis?: AxisUnit;
  /** Ordinate as written; must present the spectrum's own quantity. @default that quantity */
  ordinate?: OrdinateKind;
  /** Base of α when the ordinate is alpha. @default "e" */
  alphaBase?: AlphaBase;
}

/** The columns to write. */
export interface SpectrumColumns {
  /** x values in `axis` units, ascending. */
  x: Float64Array<ArrayBuffer>;
  /** Ordinate values in the `ordinate` presentation, in the order of `x`. */
  y: Float64Array<ArrayBuffer>;
  axis: AxisUnit;
  ordinate: OrdinateKind;
  alphaBase: AlphaBase;
}

/** A wavelength in nm expressed on another axis (the inverse of `axisToNm`). */
export function nmToAxis(nm: number, unit: AxisUnit): number {
  switch (unit) {
    case "nm":
      return nm;
    case "um":
      return nm / 1000;
    case "cm-1":
      return nmToWavenumber(nm);
    case "ev":
      return HC_EV_NM / nm;
  }
}

const PRESENTS: Record<OrdinateKind, Quantity> = {
  transmittance: "transmittance",
  percent: "transmittance",
  absorbance: "absorbance",
  alpha: "alpha",
  reflectance: "reflectance",
  "percent-reflectance": "reflectance",
};

/** The quantity an ordinate presentation shows (percent → transmittance, …). */
export function quantityOfOrdinate(kind: OrdinateKind): Quantity {
  return PRESENTS[kind];
}

/**
 * Presents a spectrum for writing.
 *
 * @throws {RangeError} When the ordinate does not present the spectrum's quantity (change
 *   the quantity first, e.g. with `convertSpectrum`), or a base is given for a non-α ordinate.
 */
export function spectrumColumns(spectrum: Spectrum, options: ColumnOptions = {}): SpectrumColumns {
  const axis = options.axis ?? "nm";
  const ordinate = options.ordinate ?? (spectrum.quantity as OrdinateKind);
  const alphaBase = options.alphaBase ?? "e";
  if (PRESENTS[ordinate] !== spectrum.quantity) {
    throw new RangeError(
      `Cannot write ${spectrum.quantity} of "${spectrum.meta.sample}" as ${ordinate}: convert it first`,
    );
  }
  if (alphaBase !== "e" && ordinate !== "alpha") {
    throw new RangeError(`Cannot use alpha base ${alphaBase} for a ${ordinate} ordinate`);
  }
  const scale = ordinate === "percent" || ordinate === "percent-reflectance"
    ? 100
    : ordinate === "alpha" && alphaBase === "10"
    ? 1 / Math.LN10
    : 1;
  const n = spectrum.wavelengthNm.length;
  const reversed = axis === "cm-1" || axis === "ev";
  const x = new Float64Array(n), y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const k = reversed ? n - 1 - i : i;
    x[i] = nmToAxis(spectrum.wavelengthNm[k]!, axis);
    y[i] = spectrum.values[k]! * scale;
  }
  return { x, y, axis, ordinate, alphaBase };
}

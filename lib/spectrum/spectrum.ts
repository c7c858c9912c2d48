/**
 * The spectrum model shared by every layer.
 *
 * @module
 */

/** What the ordinate of a spectrum measures. */
export type Quantity = "transmittance" | "absorbance" | "alpha" | "reflectance";

/** Light polarisation of a measurement relative to the optic axis. */
export type Polarisation = "o" | "e" | "unpolarised";

/** Where a spectrum came from and what the instrument file said about it. */
export interface SpectrumMeta {
  /** Sample name, from the column header or the file name. */
  sample: string;
  /** Path of the source file as given by the user. */
  sourceFile?: string;
  /** Key/value lines of the file's preamble, kept verbatim. */
  fields?: Record<string, string>;
  /** Notes produced while reading (clipping, inferred units). */
  warnings?: string[];
}

/** One measured spectrum on an ascending wavelength axis in nanometres. */
export interface Spectrum {
  /** Wavelengths in nm, strictly ascending. */
  wavelengthNm: Float64Array<ArrayBuffer>;
  /** Ordinate values in the unit named by `quantity` (T as a fraction 0..1, A in log10). */
  values: Float64Array<ArrayBuffer>;
  /** What the values are. */
  quantity: Quantity;
  /** Thickness of the measured slab in mm, when known. */
  thicknessMm?: number;
  /** Polarisation of the measurement, when known. */
  polarisation?: Polarisation;
  /** Where it came from. */
  meta: SpectrumMeta;
}

/**
 * Checks that a value is a well-formed {@linkcode Spectrum}.
 *
 * @throws {TypeError} When arrays are missing, of unequal length, or hold non-finite values.
 * @throws {RangeError} When the wavelength axis is not strictly ascending or too short.
 */
export function assertSpectrum(spectrum: Spectrum): void {
  const { wavelengthNm, values } = spectrum;
  if (!(wavelengthNm instanceof Float64Array) || !(values instanceof Float64Array)) {
    throw new TypeError("Cannot use spectrum: wavelengthNm and values must be Float64Arrays");
  }
  if (wavelengthNm.length !== values.length) {
    throw new TypeError(
      `Cannot use spectrum: ${wavelengthNm.length} wavelengths but ${values.length} values`,
    );
  }
  if (wavelengthNm.length < 2) {
    throw new RangeError("Cannot use spectrum: at least 2 points are needed");
  }
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i]!) || !Number.isFinite(wavelengthNm[i]!)) {
      throw new TypeError(`Cannot use spectrum: non-finite value at index ${i}`);
    }
    if (i > 0 && !(wavelengthNm[i]! > wavelengthNm[i - 1]!)) {
      throw new RangeError(`Cannot use spectrum: wavelengths not ascending at index ${i}`);
    }
  }
}

/**
 * The spectrum model shared by every layer.
 *
 * @module
 */
import type { AxisUnit } from "./axis.ts";

/** What the ordinate of a spectrum measures. */
export type Quantity = "transmittance" | "absorbance" | "alpha" | "reflectance";

/** Light polarisation of a measurement relative to the optic axis. */
export type Polarisation = "o" | "e" | "unpolarised";

/** An ordinate as written in a file, before conversion to the model's quantities. */
export type OrdinateKind =
  | "transmittance"
  | "percent"
  | "absorbance"
  | "alpha"
  | "reflectance"
  | "percent-reflectance";

/** Where an input value came from; precedence option > sheet > file > settings > default. */
export type ValueSource = "option" | "sheet" | "file" | "settings" | "default";

/** One value as the file states it, with where in the file it was read. */
export interface FileValue<T> {
  /** The value. */
  value: T;
  /** Always `file`. */
  source: "file";
  /** 1-based line the value was read from, when it came from one line. */
  line?: number;
  /** The key or header cell it was read from, verbatim. */
  key?: string;
  /** `range` when the file only implies it (an axis read from the span of its values). */
  how?: "header" | "field" | "range";
}

/** What the file itself says about the values the analysis layer reconciles. */
export interface FileValues {
  /** Thickness the file states, mm. */
  thicknessMm?: FileValue<number>;
  /** Polarisation the file states. */
  polarisation?: FileValue<Polarisation>;
  /** Host the file names (free text). */
  host?: FileValue<string>;
  /** Ordinate the file states. */
  ordinate?: FileValue<OrdinateKind>;
  /** Axis unit the file states or implies. */
  axis?: FileValue<AxisUnit>;
}

/** A note from reading a file, said once per file; `need` names what would settle it. */
export interface ReadWarning {
  /** The note, in words. */
  message: string;
  /** What would settle it (a machine hint). */
  need?: "axis" | "ordinate" | "thickness" | "polarisation";
}

/** Where a spectrum came from and what the instrument file said about it. */
export interface SpectrumMeta {
  /** Sample name, from the column header or the file name. */
  sample: string;
  /** Path of the source file as given by the user. */
  sourceFile?: string;
  /** Key/value lines of the file's preamble, comments and footer, kept verbatim. */
  fields?: Record<string, string>;
  /** Notes about this spectrum alone (clipped values). */
  warnings?: string[];
  /** Notes about the whole file (inferred units, conflicting metadata); one array shared by
   * every spectrum of the file, so a caller says them once per file. */
  fileWarnings?: ReadWarning[];
  /** Values the file states (thickness, polarisation, host, ordinate, axis), with their line. */
  fileValues?: FileValues;
  /** Where the value used for each of thickness, polarisation, ordinate and axis came from. */
  sources?: Partial<Record<"thicknessMm" | "polarisation" | "ordinate" | "axis", ValueSource>>;
  /** Host crystal named by the file (`Host: corundum`). */
  host?: string;
  /** Operator named by the file. */
  operator?: string;
  /** Measurement date as written in the file. */
  date?: string;
  /** Instrument named by the file. */
  instrument?: string;
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

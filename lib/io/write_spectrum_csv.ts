/**
 * Writer for one spectrum as a two-column CSV with a `Key: value` metadata preamble, in the
 * layout our reader reads back without options: header `wavelength (nm),T` (or the chosen axis
 * and ordinate), then one row per point at the precision of the data (coarsest exact power of
 * ten, at most the requested significant digits, as JCAMP-DX XFACTOR/YFACTOR, McDonald & Wilks
 * 1988 §5.2).
 *
 * @module
 */
import type { AxisUnit } from "../spectrum/axis.ts";
import type { Spectrum } from "../spectrum/spectrum.ts";
import { decimalExponent, formatFixed } from "./_precision.ts";
import type { OrdinateKind } from "./header_units.ts";
import { type ColumnOptions, type SpectrumColumns, spectrumColumns } from "./spectrum_columns.ts";

/** Options of {@linkcode writeSpectrumCsv}. */
export interface SpectrumCsvOptions extends ColumnOptions {
  /** Most significant digits kept for y (of its largest magnitude). @default 7 */
  ySignificantDigits?: number;
  /** Most significant digits kept for x. @default 9 */
  xSignificantDigits?: number;
  /** Host crystal, written as `Host: …`. */
  host?: string;
  /** Further `Key: value` preamble lines, in this order. */
  records?: Record<string, string>;
}

const AXIS_HEADER: Record<AxisUnit, string> = {
  nm: "wavelength (nm)",
  um: "wavelength (um)",
  "cm-1": "wavenumber (cm-1)",
  ev: "energy (eV)",
};

function ordinateHeader(columns: SpectrumColumns): string {
  const headers: Record<OrdinateKind, string> = {
    transmittance: "T",
    percent: "%T",
    absorbance: "A",
    reflectance: "R",
    "percent-reflectance": "%R",
    alpha: columns.alphaBase === "10" ? "alpha (cm-1; decadic)" : "alpha (cm-1)",
  };
  return headers[columns.ordinate];
}

/** A preamble value on one line, without the comma that would split it into cells. */
function preambleText(value: string): string {
  return value.replace(/[\r\n]+/g, " ").replace(/,/g, ";").trim();
}

/**
 * Writes one spectrum as CSV text (LF line ends).
 *
 * @param spectrum The spectrum, on its nm axis, in its own quantity.
 * @param options Presentation (axis, ordinate, α base), precision and metadata.
 * @returns The file's text.
 * @throws {RangeError} When the ordinate does not present the spectrum's quantity.
 *
 * @example Percent transmittance on a wavenumber axis
 * ```ts
 * import { writeSpectrumCsv } from "./write_spectrum_csv.ts";
 * const wavelengthNm = Float64Array.from([400, 500]);
 * const values = Float64Array.from([0.25, 0.5]);
 * const text = writeSpectrumCsv(
 *   { wavelengthNm, values, quantity: "transmittance", meta: { sample: "s1" } },
 *   { axis: "cm-1", ordinate: "percent" },
 * );
 * if (!text.endsWith("wavenumber (cm-1),%T\n20000,50\n25000,25\n")) throw new Error(text);
 * ```
 */
export function writeSpectrumCsv(spectrum: Spectrum, options: SpectrumCsvOptions = {}): string {
  const columns = spectrumColumns(spectrum, options);
  const xExp = decimalExponent(columns.x, options.xSignificantDigits ?? 9);
  const yExp = decimalExponent(columns.y, options.ySignificantDigits ?? 7);
  const lines = [`Sample: ${preambleText(spectrum.meta.sample)}`];
  if (spectrum.thicknessMm !== undefined) lines.push(`Thickness (mm): ${spectrum.thicknessMm}`);
  if (spectrum.polarisation) lines.push(`Polarisation: ${spectrum.polarisation}`);
  if (options.host) lines.push(`Host: ${preambleText(options.host)}`);
  for (const [key, value] of Object.entries(options.records ?? {})) {
    lines.push(`${preambleText(key).replace(/[:=]/g, " ")}: ${preambleText(value)}`);
  }
  lines.push(`${AXIS_HEADER[columns.axis]},${ordinateHeader(columns)}`);
  for (let i = 0; i < columns.x.length; i++) {
    lines.push(`${formatFixed(columns.x[i]!, xExp)},${formatFixed(columns.y[i]!, yExp)}`);
  }
  return lines.join("\n") + "\n";
}

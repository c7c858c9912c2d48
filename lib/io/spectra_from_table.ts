/**
 * Builds spectra from the located table of an export: one x column and one or more ordinate columns,
 * units from the header (or the preamble, or the caller's override), validated point by point.
 *
 * @module
 */
import { axisToNm, type AxisUnit } from "../spectrum/axis.ts";
import type {
  FileValue,
  FileValues,
  Quantity,
  ReadWarning,
  Spectrum,
  SpectrumMeta,
} from "../spectrum/spectrum.ts";
import { InputError } from "./input_error.ts";
import {
  axisFromText,
  type HeaderReading,
  ordinateFromText,
  type OrdinateKind,
  readAxisHeader,
  readOrdinateHeader,
} from "./header_units.ts";
import type { TextTable } from "./read_table.ts";
import type { ReadLimits } from "./read_limits.ts";
import { readFileMetadata } from "./read_metadata.ts";

export { parseThicknessMm } from "./read_metadata.ts";

/** Overrides a user can give when the file does not say, or says it wrongly. */
export interface ReadOptions {
  /** What the values are, when the file does not say (or says wrongly). */
  ordinate?: OrdinateKind;
  /** The x axis unit, when the file does not say. */
  axis?: AxisUnit;
  /** Thickness of the measured slab in mm (overrides the file's metadata). */
  thicknessMm?: number;
  /**
   * Base of α values: `10` (decadic, A = α·d) is multiplied by ln 10 into the natural α of the
   * model (T = exp(−α·d)); a header that names its base outranks it. @default "e"
   */
  alphaBase?: "e" | "10";
  /** Caps on the file (defaults in `read_limits.ts`). */
  limits?: Partial<ReadLimits>;
  /** `general` reads every table line cell by cell, for checking the fast path against it. */
  tableReader?: "auto" | "general";
}

/** The least number of points a spectrum must have (our choice: fewer cannot carry a band or an interpolation). */
export const MIN_POINTS = 5;
/** Transmittance noise tolerated below 0 and above 1 before a value counts as wrong (common practice). */
export const T_NOISE = 0.02;
/** Most negative absorbance accepted (our choice: A = −0.3 is T ≈ 2, beyond any baseline drift). */
export const MIN_ABSORBANCE = -0.3;

function baseName(file: string): string {
  const name = file.split(/[\\/]/).pop() ?? file;
  return name.replace(/\.[^.]+$/, "") || name;
}

/** Words of a header that only names a quantity or unit, never a sample (our list). */
const GENERIC_WORDS = new Set(
  "a abs absorbance absorption alpha arb au coeff coefficient cm data decadic e fraction intensity ln log mm natural nm od pct per percent r refl reflectance signal t trans transmission transmittance u um unit units value values y µm 1 10"
    .split(" "),
);

/** True when a header reading's name is made only of quantity and unit words, e.g. `alpha_cm-1`. */
function isGenericName(name: string): boolean {
  const words = name.toLowerCase().split(/[^a-z0-9µ]+/).filter(Boolean);
  return words.length > 0 && words.every((w) => GENERIC_WORDS.has(w));
}

function findField(fields: Record<string, string>, pattern: RegExp): string | undefined {
  const key = Object.keys(fields).find((k) => pattern.test(k));
  return key === undefined ? undefined : fields[key];
}

/** Keys of preamble lines that may name the ordinate. */
const ORDINATE_KEYS = /y\s*-?\s*units?|ordinate|data\s*type|quantity|mode|measurement/i;

/** The ordinate named by any preamble line that talks about it (the first one that reads). */
function ordinateFromFields(
  fields: Record<string, string>,
): { kind: OrdinateKind; key: string } | undefined {
  for (const [key, v] of Object.entries(fields)) {
    if (!ORDINATE_KEYS.test(key)) continue;
    const kind = ordinateFromText(v);
    if (kind) return { kind, key };
  }
  return undefined;
}

/** Smallest and largest of the values, by a loop (no spread: files may hold a million). */
function extent(xs: ArrayLike<number>): [number, number] {
  let min = Infinity, max = -Infinity;
  for (let i = 0; i < xs.length; i++) {
    const v = xs[i]!;
    if (v < min) min = v;
    if (v > max) max = v;
  }
  return [min, max];
}

function inferAxis(
  xs: ArrayLike<number>,
  file: string,
  line: number | undefined,
  warnings: ReadWarning[],
): AxisUnit {
  const [min, max] = extent(xs);
  if (min >= 150 && max <= 3300) {
    warnings.push({
      message: "axis read as nm from the range of its values (the file names no unit)",
      need: "axis",
    });
    return "nm";
  }
  if (min >= 3300 && max <= 70000) {
    warnings.push({
      message: "axis read as cm-1 from the range of its values (the file names no unit)",
      need: "axis",
    });
    return "cm-1";
  }
  throw new InputError(
    "ambiguous-axis",
    file,
    line,
    `Cannot tell the unit of the x axis (${min}–${max}); it needs to be stated (nm, um, cm-1 or ev)`,
    { need: "axis", choices: ["nm", "um", "cm-1", "ev"] },
  );
}

interface Ordinate {
  quantity: Quantity;
  scale: number;
}

function toQuantity(kind: OrdinateKind): Ordinate {
  switch (kind) {
    case "transmittance":
      return { quantity: "transmittance", scale: 1 };
    case "percent":
      return { quantity: "transmittance", scale: 0.01 };
    case "absorbance":
      return { quantity: "absorbance", scale: 1 };
    case "alpha":
      return { quantity: "alpha", scale: 1 };
    case "reflectance":
      return { quantity: "reflectance", scale: 1 };
    case "percent-reflectance":
      return { quantity: "reflectance", scale: 0.01 };
  }
}

/**
 * Builds validated spectra from a located table.
 *
 * @throws {InputError} For duplicate or non-monotonic x, too few points, out-of-range T, or
 *   an ordinate or axis the file does not determine.
 */
export function spectraFromTable(
  table: TextTable,
  file: string,
  options: ReadOptions = {},
): Spectrum[] {
  const layout = tableSpectra(table, file, options, table.columns.length);
  const spectra: Spectrum[] = [];
  for (let c = 1; c < table.columns.length; c++) {
    spectra.push(layout.spectrum(c, table.columns[c]!));
  }
  layout.finish();
  return spectra;
}

/** How the values of one ordinate column become the values of its spectrum. */
export interface ColumnOrdinate {
  /** What the column holds, as the file or the options say. */
  kind: OrdinateKind;
  quantity: Quantity;
  /** Factor from the values as written to the model's values. */
  scale: number;
}

/**
 * The spectra of a table before their values: the grid (x validated), and for each ordinate
 * column its quantity, sample and metadata, so a table read a stretch of rows at a time gives
 * the same spectra as one read whole.
 */
export interface TableSpectra {
  /** The wavelengths, ascending, nm. */
  wavelengthNm: Float64Array<ArrayBuffer>;
  /** Whether the file lists x descending. */
  descending: boolean;
  /**
   * The ordinate of column c (1-based).
   *
   * @throws {InputError} `ambiguous-ordinate` when neither file nor options say it.
   */
  ordinate(c: number): ColumnOrdinate;
  /**
   * The model's values of column c for data rows `from … from + count − 1` (ascending files
   * only), written to `out` from index `at`; returns how many were clipped to 0..1.
   *
   * @throws {InputError} For a value out of range (with its line).
   */
  values(
    c: number,
    column: Float64Array,
    from: number,
    count: number,
    out: Float64Array,
    at: number,
  ): number;
  /** The spectrum of column c with its values (or, for `spectrum(c, column)`, from the column). */
  withValues(c: number, values: Float64Array<ArrayBuffer>, clipped: number): Spectrum;
  /** The spectrum of column c from the whole column as read. */
  spectrum(c: number, column: Float64Array<ArrayBuffer>): Spectrum;
  /** To be called after the last column: adds the file's notes on all columns. */
  finish(): void;
}

/**
 * The {@linkcode TableSpectra} of a table whose first column is its x column (the others need
 * not be there: `width` says how many columns the table has).
 *
 * @throws {InputError} For duplicate or non-monotonic x, too few points, or an axis the file
 *   does not determine.
 */
export function tableSpectra(
  table: TextTable,
  file: string,
  options: ReadOptions,
  width: number,
): TableSpectra {
  const { columns, rowLines } = table;
  const rows = columns[0]?.length ?? 0;
  let header = table.header;
  if (header && header.length !== width) {
    header = width === 2 ? [header[0]!, header.slice(1).join(" ")] : undefined;
  }
  const fileWarnings: ReadWarning[] = [];
  const headerLine = table.headerLine;
  const fieldLine = (pattern: RegExp) => {
    const key = Object.keys(table.fields).find((k) => pattern.test(k));
    return key === undefined ? undefined : { key, line: table.fieldLines?.[key] };
  };
  const xs = columns[0] ?? new Float64Array(0);
  checkFinite(xs, rowLines, file);
  const axisReading: HeaderReading = header ? readAxisHeader(header[0]!) : {};
  const fieldAxisAt = fieldLine(/x\s*-?\s*units?|axis|abscissa/i);
  const fieldAxis = fieldAxisAt ? table.fields[fieldAxisAt.key] : undefined;
  let fileAxis: FileValue<AxisUnit> | undefined;
  if (axisReading.axis) {
    fileAxis = fileValue(axisReading.axis, "header", header![0]!, headerLine);
  } else if (fieldAxis && axisFromText(fieldAxis)) {
    fileAxis = fileValue(axisFromText(fieldAxis)!, "field", fieldAxisAt!.key, fieldAxisAt!.line);
  }
  let axis: AxisUnit;
  if (options.axis) axis = options.axis;
  else if (fileAxis) axis = fileAxis.value;
  else {
    axis = inferAxis(xs, file, headerLine ?? rowLines[0], fileWarnings);
    fileAxis = fileValue(axis, "range", undefined, undefined);
  }
  const ordinateField = ordinateFromFields(table.fields);
  const fieldOrdinate = ordinateField?.kind;
  const metadata = readFileMetadata(table.fields, table.fieldLines);
  fileWarnings.push(...metadata.warnings);
  const thicknessMm = options.thicknessMm ?? metadata.thicknessMm?.value;
  const polarisation = metadata.polarisation?.value;
  const sampleField = findField(table.fields, /^(sample|specimen|sample\s*(name|id)|name|id)$/i);
  const fileValues: FileValues = {};
  if (fileAxis) fileValues.axis = fileAxis;
  if (metadata.thicknessMm) fileValues.thicknessMm = metadata.thicknessMm;
  if (metadata.polarisation) fileValues.polarisation = metadata.polarisation;
  if (metadata.host) fileValues.host = metadata.host;

  if (rows < MIN_POINTS) {
    throw new InputError(
      "too-few-points",
      file,
      rowLines[0],
      `Only ${rows} data rows; at least ${MIN_POINTS} are needed`,
    );
  }
  const nm = new Float64Array(rows);
  for (let i = 0; i < rows; i++) nm[i] = axisToNm(xs[i]!, axis);
  const order = new Int32Array(rows);
  const descending = rows > 1 && nm[rows - 1]! < nm[0]!;
  for (let i = 0; i < rows; i++) order[i] = descending ? rows - 1 - i : i;
  for (let k = 1; k < rows; k++) {
    const a = nm[order[k - 1]!]!, b = nm[order[k]!]!;
    const line = rowLines[order[k]!];
    if (b === a) {
      throw new InputError(
        "duplicate-x",
        file,
        line,
        `Duplicate x value ${xs[order[k]!]} (also at line ${rowLines[order[k - 1]!]})`,
      );
    }
    if (b < a) {
      throw new InputError(
        "non-monotonic",
        file,
        line,
        `x value ${xs[order[k]!]} breaks the ${descending ? "descending" : "ascending"} order`,
      );
    }
  }
  for (let i = 0; i < rows; i++) {
    const v = nm[i]!;
    if (!(Number.isFinite(v) && v > 0)) {
      throw new InputError(
        "out-of-range",
        file,
        rowLines[i],
        `x value ${xs[i]} is not a valid ${axis} value`,
      );
    }
  }
  const wavelengthNm = new Float64Array(rows);
  for (let k = 0; k < rows; k++) wavelengthNm[k] = nm[order[k]!]!;
  // α over the slab (or, unknown, over a 0.1 mm film, the most lenient) may not reach an
  // absorbance below MIN_ABSORBANCE: A = α·d / ln 10 with d in cm
  const alphaPathMm = thicknessMm ?? 0.1;
  const minAlpha = MIN_ABSORBANCE * Math.LN10 / (alphaPathMm / 10);
  let ordinateConflict = false;
  const readings: (HeaderReading & { rule?: ColumnOrdinate })[] = [];
  const reading = (c: number) => readings[c] ??= header ? readOrdinateHeader(header[c]!) : {};
  const ordinate = (c: number): ColumnOrdinate => {
    const r = reading(c);
    if (r.rule) return r.rule;
    if (r.ordinate && fieldOrdinate && r.ordinate !== fieldOrdinate) ordinateConflict = true;
    const kind = options.ordinate ?? r.ordinate ?? fieldOrdinate;
    if (!kind) {
      throw new InputError(
        "ambiguous-ordinate",
        file,
        headerLine ?? rowLines[0],
        `Cannot tell what column ${c + 1}${
          header ? ` ("${header[c]}")` : ""
        } holds; its quantity needs to be stated (transmittance, percent, absorbance or alpha)`,
        { need: "ordinate", choices: ["transmittance", "percent", "absorbance", "alpha"] },
      );
    }
    const { quantity, scale: unitScale } = toQuantity(kind);
    // a decadic α (α₁₀ = A/d) is held as the napierian α of the model: α = α₁₀ · ln 10
    const said = header?.[c] ?? "";
    const decadic = quantity === "alpha" &&
      (/decadic|alpha\s*10|α\s*10/i.test(said) ||
        (options.alphaBase === "10" && !/natural|napierian|\bln\b/i.test(said)));
    return r.rule = { kind, quantity, scale: decadic ? unitScale * Math.LN10 : unitScale };
  };
  /** Converts the values of rows order[k] (or k), k < count, into out[k]; the clipped count. */
  const convert = (
    { kind, quantity, scale }: ColumnOrdinate,
    column: Float64Array,
    from: number,
    count: number,
    out: Float64Array | undefined,
    at: number,
  ): number => {
    let clipped = 0;
    const bounded = quantity === "transmittance" || quantity === "reflectance";
    for (let k = 0; k < count; k++) {
      const i = descending ? order[k]! : k;
      const shown = column[i]!;
      let v = shown * scale;
      if (bounded) {
        if (v < -T_NOISE || v > 1 + T_NOISE) {
          const percentLikely = kind === "transmittance" && shown > 1 && shown <= 100.5;
          const hint = percentLikely ? "; if the values are percent, read them as percent" : "";
          throw new InputError(
            "out-of-range",
            file,
            rowLines[from + i],
            `${kind === "percent" ? "%T" : "T"} value ${shown} is outside 0..${
              scale === 1 ? 1 : 100
            } beyond noise${hint}`,
            percentLikely ? { need: "ordinate", choices: ["percent"] } : undefined,
          );
        }
        if (v < 0 || v > 1) {
          clipped++;
          v = Math.min(1, Math.max(0, v));
        }
      } else if (quantity === "absorbance" && v < MIN_ABSORBANCE) {
        throw new InputError(
          "out-of-range",
          file,
          rowLines[from + i],
          `Absorbance ${shown} is below ${MIN_ABSORBANCE}, beyond any baseline noise (T would exceed 1)`,
        );
      } else if (quantity === "alpha" && v < minAlpha) {
        throw new InputError(
          "out-of-range",
          file,
          rowLines[from + i],
          `α ${shown} cm-1 is below ${
            minAlpha.toPrecision(3)
          } cm-1, beyond any baseline noise over ${alphaPathMm} mm`,
        );
      }
      if (out) out[at + k] = v;
    }
    return clipped;
  };
  const withValues = (c: number, values: Float64Array<ArrayBuffer>, clipped: number): Spectrum => {
    const r = reading(c);
    const { quantity } = ordinate(c);
    const fileOrdinate = r.ordinate
      ? fileValue(r.ordinate, "header", header![c]!, headerLine)
      : fieldOrdinate
      ? fileValue(
        fieldOrdinate,
        "field",
        ordinateField!.key,
        table.fieldLines?.[ordinateField!.key],
      )
      : undefined;
    const multi = width > 2;
    // a single data column is named after its file unless the header names a sample
    const headerName = !multi && r.name && isGenericName(r.name) ? undefined : r.name;
    const sample = headerName ?? (multi ? undefined : sampleField) ??
      (multi ? `${baseName(file)}#${c}` : baseName(file));
    const meta: SpectrumMeta = {
      sample,
      sourceFile: file,
      fields: table.fields,
      fileWarnings,
      fileValues: fileOrdinate ? { ...fileValues, ordinate: fileOrdinate } : fileValues,
      sources: {
        axis: options.axis ? "option" : "file",
        ordinate: options.ordinate ? "option" : "file",
      },
    };
    if (options.thicknessMm !== undefined) meta.sources!.thicknessMm = "option";
    else if (thicknessMm !== undefined) meta.sources!.thicknessMm = "file";
    if (polarisation) meta.sources!.polarisation = "file";
    if (metadata.host) meta.host = metadata.host.value;
    if (metadata.operator) meta.operator = metadata.operator;
    if (metadata.date) meta.date = metadata.date;
    if (metadata.instrument) meta.instrument = metadata.instrument;
    const spectrum: Spectrum = { wavelengthNm, values, quantity, meta };
    if (clipped > 0) {
      spectrum.meta.warnings = [
        `${clipped} value(s) slightly outside 0..1 clipped (noise, or a baseline or reference a little off)`,
      ];
    }
    if (thicknessMm !== undefined) spectrum.thicknessMm = thicknessMm;
    if (polarisation) spectrum.polarisation = polarisation;
    return spectrum;
  };
  return {
    wavelengthNm,
    descending,
    ordinate,
    values(c, column, from, count, out, at) {
      if (descending) throw new RangeError("Cannot convert a stretch of a descending table");
      return convert(ordinate(c), column, from, count, out, at);
    },
    withValues,
    spectrum(c, column) {
      checkFinite(column, rowLines, file);
      const rule = ordinate(c);
      const bounded = rule.quantity === "transmittance" || rule.quantity === "reflectance";
      // the column itself serves as the values when nothing changes them (saves a copy per spectrum)
      const asIs = !descending && rule.scale === 1 && !(bounded && outsideUnit(column));
      const values = asIs ? column : new Float64Array(rows);
      const clipped = convert(rule, column, 0, rows, asIs ? undefined : values, 0);
      return withValues(c, values, clipped);
    },
    finish() {
      if (ordinateConflict && !options.ordinate) {
        fileWarnings.push({
          message:
            "the column header and a preamble line name different ordinates; the header is used",
          need: "ordinate",
        });
      }
      Object.freeze(fileWarnings);
    },
  };
}

/** Whether any value lies outside 0..1 (and would be clipped or refused). */
function outsideUnit(values: ArrayLike<number>): boolean {
  for (let i = 0; i < values.length; i++) {
    const v = values[i]!;
    if (v < 0 || v > 1) return true;
  }
  return false;
}

/** A value as the file states it. */
function fileValue<T>(
  value: T,
  how: "header" | "field" | "range",
  key: string | undefined,
  line: number | undefined,
): FileValue<T> {
  const v: FileValue<T> = { value, source: "file", how };
  if (key !== undefined) v.key = key;
  if (line !== undefined) v.line = line;
  return v;
}

/** Rejects a non-finite number (a JCAMP-DX factor or compressed value that overflowed). */
function checkFinite(values: ArrayLike<number>, rowLines: number[], file: string): void {
  for (let i = 0; i < values.length; i++) {
    if (!Number.isFinite(values[i]!)) {
      throw new InputError(
        "non-finite",
        file,
        rowLines[i],
        `Value ${values[i]} is not a finite number`,
      );
    }
  }
}

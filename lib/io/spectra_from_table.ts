/**
 * Builds spectra from the located table of an export: one x column and one or more ordinate columns,
 * units from the header (or the preamble, or the caller's override), validated point by point.
 *
 * @module
 */
import { axisToNm, type AxisUnit } from "../spectrum/axis.ts";
import type { Polarisation, Quantity, Spectrum } from "../spectrum/spectrum.ts";
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

/** Overrides a user can give when the file does not say, or says it wrongly. */
export interface ReadOptions {
  ordinate?: OrdinateKind;
  axis?: AxisUnit;
  /** Thickness of the measured slab in mm (overrides the file's metadata). */
  thicknessMm?: number;
}

/** The least number of points a spectrum must have (our choice: fewer cannot carry a band or an interpolation). */
export const MIN_POINTS = 5;
/** Transmittance noise tolerated below 0 and above 1 before a value counts as wrong (common practice). */
export const T_NOISE = 0.02;

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

/** The ordinate named by any preamble line that talks about it (the first one that reads). */
function ordinateFromFields(fields: Record<string, string>): OrdinateKind | undefined {
  for (const [k, v] of Object.entries(fields)) {
    if (!/y\s*-?\s*units?|ordinate|data\s*type|quantity|mode|measurement/i.test(k)) continue;
    const kind = ordinateFromText(v);
    if (kind) return kind;
  }
  return undefined;
}

/** Thickness in mm from a metadata value such as `2.00 mm`, `0,2 cm` or `1500 µm`. */
export function parseThicknessMm(value: string, key = ""): number | undefined {
  const m = /([+-]?\d+(?:[.,]\d+)?(?:[eE][+-]?\d+)?)\s*(mm|cm|µm|μm|um|m)?\b/.exec(value);
  if (!m) return undefined;
  const v = Number(m[1]!.replace(",", "."));
  const unit = (m[2] ?? (/\bcm\b/i.test(key) ? "cm" : /µm|um\b/i.test(key) ? "um" : "mm"))
    .toLowerCase();
  const mm = unit === "cm" ? v * 10 : unit === "m" ? v * 1000 : unit === "mm" ? v : v / 1000;
  return mm > 0 && Number.isFinite(mm) ? mm : undefined;
}

function parsePolarisation(value: string | undefined): Polarisation | undefined {
  if (!value) return undefined;
  const v = value.trim().toLowerCase();
  if (/^(o|ordinary|e\s*(⊥|perp|_\|_)\s*c|sigma|σ)$/.test(v) || /⊥|perp/.test(v)) return "o";
  if (
    /^(e|extraordinary|e\s*(∥|\|\||par(allel)?)\s*c|pi|π)$/.test(v) || /∥|\|\||parallel/.test(v)
  ) return "e";
  if (/unpol|none|natural/.test(v)) return "unpolarised";
  return undefined;
}

function inferAxis(
  xs: number[],
  file: string,
  line: number | undefined,
  warnings: string[],
): AxisUnit {
  const min = Math.min(...xs), max = Math.max(...xs);
  if (min >= 150 && max <= 3300) {
    warnings.push("axis read as nm from its range; give --axis to override");
    return "nm";
  }
  if (min >= 3300 && max <= 70000) {
    warnings.push("axis read as cm-1 from its range; give --axis to override");
    return "cm-1";
  }
  throw new InputError(
    "ambiguous-axis",
    file,
    line,
    `Cannot tell the unit of the x axis (${min}–${max}): give --axis nm|um|cm-1|ev`,
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
  const width = table.rows[0]?.length ?? 0;
  let header = table.header;
  if (header && header.length !== width) {
    header = width === 2 ? [header[0]!, header.slice(1).join(" ")] : undefined;
  }
  const warnings: string[] = [];
  const axisReading: HeaderReading = header ? readAxisHeader(header[0]!) : {};
  const fieldAxis = findField(table.fields, /x\s*-?\s*units?|axis|abscissa/i);
  const xs = table.rows.map((r) => r[0]!);
  const axis = options.axis ?? axisReading.axis ??
    (fieldAxis ? axisFromText(fieldAxis) : undefined) ??
    inferAxis(xs, file, table.headerLine ?? table.rowLines[0], warnings);
  const fieldOrdinate = ordinateFromFields(table.fields);
  const thicknessKey = Object.keys(table.fields).find((k) =>
    /thick|path\s*length|^path\b/i.test(k)
  );
  const thicknessMm = options.thicknessMm ??
    (thicknessKey ? parseThicknessMm(table.fields[thicknessKey]!, thicknessKey) : undefined);
  const polarisation = parsePolarisation(findField(table.fields, /polari[sz]/i));
  const sampleField = findField(table.fields, /^(sample|specimen|sample\s*(name|id)|name|id)$/i);

  if (table.rows.length < MIN_POINTS) {
    throw new InputError(
      "too-few-points",
      file,
      table.rowLines[0],
      `Only ${table.rows.length} data rows; at least ${MIN_POINTS} are needed`,
    );
  }
  const nm = xs.map((x) => axisToNm(x, axis));
  const order = nm.map((_, i) => i);
  const descending = nm.length > 1 && nm[nm.length - 1]! < nm[0]!;
  if (descending) order.reverse();
  for (let k = 1; k < order.length; k++) {
    const a = nm[order[k - 1]!]!, b = nm[order[k]!]!;
    const line = table.rowLines[order[k]!];
    if (b === a) {
      throw new InputError(
        "duplicate-x",
        file,
        line,
        `Duplicate x value ${xs[order[k]!]} (also at line ${table.rowLines[order[k - 1]!]})`,
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
  if (!nm.every((v) => Number.isFinite(v) && v > 0)) {
    const i = nm.findIndex((v) => !(Number.isFinite(v) && v > 0));
    throw new InputError(
      "out-of-range",
      file,
      table.rowLines[i],
      `x value ${xs[i]} is not a valid ${axis} value`,
    );
  }
  const wavelengthNm = Float64Array.from(order, (i) => nm[i]!);
  const spectra: Spectrum[] = [];
  for (let c = 1; c < width; c++) {
    const reading = header ? readOrdinateHeader(header[c]!) : {};
    const kind = options.ordinate ?? reading.ordinate ??
      fieldOrdinate;
    if (!kind) {
      throw new InputError(
        "ambiguous-ordinate",
        file,
        table.headerLine ?? table.rowLines[0],
        `Cannot tell what column ${c + 1}${
          header ? ` ("${header[c]}")` : ""
        } holds: give --ordinate transmittance|percent|absorbance|alpha`,
      );
    }
    const { quantity, scale: unitScale } = toQuantity(kind);
    // a decadic α (α₁₀ = A/d) is held as the napierian α of the model: α = α₁₀ · ln 10
    const decadic = quantity === "alpha" && /decadic|alpha\s*10|α\s*10/i.test(header?.[c] ?? "");
    const scale = decadic ? unitScale * Math.LN10 : unitScale;
    const columnWarnings = [...warnings];
    let clipped = 0;
    const values = Float64Array.from(order, (i) => {
      let v = table.rows[i]![c]! * scale;
      if (quantity === "transmittance" || quantity === "reflectance") {
        if (v < -T_NOISE || v > 1 + T_NOISE) {
          const shown = table.rows[i]![c]!;
          const hint = kind === "transmittance" && shown > 1 && shown <= 100.5
            ? "; if the values are percent, give --ordinate percent"
            : "";
          throw new InputError(
            "out-of-range",
            file,
            table.rowLines[i],
            `${kind === "percent" ? "%T" : "T"} value ${shown} is outside 0..${
              scale === 1 ? 1 : 100
            } beyond noise${hint}`,
          );
        }
        if (v < 0 || v > 1) {
          clipped++;
          v = Math.min(1, Math.max(0, v));
        }
      }
      return v;
    });
    if (clipped > 0) {
      columnWarnings.push(`${clipped} value(s) slightly outside 0..1 clipped (noise)`);
    }
    const multi = width > 2;
    // a single data column is named after its file unless the header names a sample
    const headerName = !multi && reading.name && isGenericName(reading.name)
      ? undefined
      : reading.name;
    const sample = headerName ?? (multi ? undefined : sampleField) ??
      (multi ? `${baseName(file)}#${c}` : baseName(file));
    const spectrum: Spectrum = {
      wavelengthNm,
      values,
      quantity,
      meta: { sample, sourceFile: file, fields: table.fields },
    };
    if (columnWarnings.length) spectrum.meta.warnings = columnWarnings;
    if (thicknessMm !== undefined) spectrum.thicknessMm = thicknessMm;
    if (polarisation) spectrum.polarisation = polarisation;
    spectra.push(spectrum);
  }
  return spectra;
}

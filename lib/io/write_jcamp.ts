/**
 * Writer for JCAMP-DX 4.24 spectra (McDonald & Wilks, Appl. Spectrosc. 42(1), 151–162 (1988),
 * §5.2 compression, §5.3 AFFN, Table VII pseudo-digits; label and line rules as kept by the IUPAC
 * revision JCAMP-DX 5.01, Lampen et al., Pure Appl. Chem. 71, 1549 (1999) — that citation and
 * the 80-character line limit from memory): `##XYDATA=(X++(Y..Y))` in AFFN or DIFDUP with
 * Y-check values, or `##XYPOINTS=(XY..XY)` when the x axis is not evenly spaced; XFACTOR /
 * YFACTOR chosen so the integers keep the precision of the data (at most the requested
 * significant digits).
 *
 * @module
 */
import type { AxisUnit } from "../spectrum/axis.ts";
import type { Spectrum } from "../spectrum/spectrum.ts";
import { decimalExponent, formatFixed, powerOfTenText, toUnits } from "./_precision.ts";
import type { OrdinateKind } from "./header_units.ts";
import { type ColumnOptions, type SpectrumColumns, spectrumColumns } from "./spectrum_columns.ts";

/** Options of {@linkcode writeJcamp}. */
export interface JcampWriteOptions extends ColumnOptions {
  /** Form of the ordinates in `##XYDATA`: plain AFFN or DIFDUP compression. @default "difdup" */
  form?: "affn" | "difdup";
  /** Most significant digits kept for y (of its largest magnitude). @default 7 */
  ySignificantDigits?: number;
  /** Most significant digits kept for x. @default 9 */
  xSignificantDigits?: number;
  /** `##ORIGIN` (who produced the data). @default "not stated" */
  origin?: string;
  /** `##OWNER` (who owns or may release the data). @default "not stated" */
  owner?: string;
  /** Host crystal, written as `##$HOST`. */
  host?: string;
  /** Further user-defined records, written as `##$LABEL=value` in this order. */
  records?: Record<string, string>;
}

/** Longest data line (McDonald & Wilks 1988: 80 characters). */
const MAX_LINE = 80;

const XUNITS: Record<AxisUnit, string> = {
  nm: "NANOMETERS",
  um: "MICROMETERS",
  "cm-1": "1/CM",
  ev: "EV",
};

function yUnits(columns: SpectrumColumns): string {
  const units: Record<OrdinateKind, string> = {
    transmittance: "TRANSMITTANCE",
    percent: "PERCENT TRANSMITTANCE",
    absorbance: "ABSORBANCE",
    reflectance: "REFLECTANCE",
    "percent-reflectance": "PERCENT REFLECTANCE",
    alpha: columns.alphaBase === "10"
      ? "DECADIC ABSORPTION COEFFICIENT (1/CM)"
      : "NAPIERIAN ABSORPTION COEFFICIENT (1/CM)",
  };
  return units[columns.ordinate];
}

/** A label value as one line of printable ASCII without the `$$` comment mark. */
function recordValue(value: string): string {
  return value.replace(/[\r\n]+/g, " ").replace(/[^\x20-\x7e]/g, "?").replace(/\$\$/g, "$ $")
    .trim();
}

/** A user-defined label: `$` then upper-case letters, digits and single spaces. */
function userLabel(label: string): string {
  return `$${label.toUpperCase().replace(/[^A-Z0-9]+/g, " ").trim()}`;
}

/** Pseudo-digit form of an integer (ASDF SQZ or DIF, McDonald & Wilks 1988 Table VII). */
function pseudo(value: number, positive: string, negative: string): string {
  const digits = String(Math.abs(value));
  const table = value < 0 ? negative : positive;
  return table[Number(digits[0])]! + digits.slice(1);
}

const sqz = (v: number) => pseudo(v, "@ABCDEFGHI", "@abcdefghi");
const dif = (v: number) => pseudo(v, "%JKLMNOPQR", "%jklmnopqr");
/** DUP count (total occurrences, ≥ 2). */
const dup = (count: number) => {
  const digits = String(count);
  return "STUVWXYZs"[Number(digits[0]) - 1]! + digits.slice(1);
};

/** `(X++(Y..Y))` lines in AFFN: the abscissa of the first ordinate, then the ordinates. */
function affnLines(xs: string[], ys: number[]): string[] {
  const lines: string[] = [];
  let i = 0;
  while (i < ys.length) {
    let line = `${xs[i]}`;
    do {
      line += ` ${ys[i]}`;
      i++;
    } while (i < ys.length && line.length + 1 + String(ys[i]).length <= MAX_LINE);
    lines.push(line);
  }
  return lines;
}

/**
 * `(X++(Y..Y))` lines in DIFDUP. Every line after the first starts with the Y-check value (the
 * last ordinate of the line before, in SQZ form) at its abscissa, and a last line holds the
 * final abscissa and the last ordinate again as its check.
 */
function difdupLines(xs: string[], ys: number[]): string[] {
  const lines: string[] = [];
  const n = ys.length;
  let i = 0;
  while (true) {
    // a blank after the abscissa: an SQZ E or e (±5) must not read as an exponent
    let line = `${xs[i]} ${sqz(ys[i]!)}`;
    let j = i;
    while (j + 1 < n) {
      const d = ys[j + 1]! - ys[j]!;
      let run = 1;
      while (j + run + 1 < n && ys[j + run + 1]! - ys[j + run]! === d) run++;
      const token = (r: number) => dif(d) + (r > 1 ? dup(r) : "");
      while (run > 1 && line.length + token(run).length > MAX_LINE) run--;
      if (line.length + token(run).length > MAX_LINE) break;
      line += token(run);
      j += run;
    }
    lines.push(line);
    if (j === n - 1) break;
    i = j;
  }
  if (n > 1) lines.push(`${xs[n - 1]} ${sqz(ys[n - 1]!)}`);
  return lines;
}

/** True when x is evenly spaced to 1e-6 of its step (required by `(X++(Y..Y))`). */
function evenlySpaced(x: Float64Array): boolean {
  const n = x.length;
  const step = (x[n - 1]! - x[0]!) / (n - 1);
  for (let i = 1; i < n; i++) {
    if (Math.abs(x[i]! - (x[0]! + i * step)) > 1e-6 * Math.abs(step)) return false;
  }
  return true;
}

/**
 * Writes one spectrum as a JCAMP-DX 4.24 file (text, lines ending in LF).
 *
 * Sample, thickness (mm), polarisation and host go into labelled records (`##TITLE`,
 * `##$THICKNESS MM`, `##$POLARISATION`, `##$HOST`); the ordinate integers times YFACTOR give the
 * values to the precision 10^k, where k is the coarsest power of ten that represents every value
 * exactly, or the one that keeps `ySignificantDigits` of the largest value.
 *
 * @param spectrum The spectrum, on its nm axis, in its own quantity.
 * @param options Presentation (axis, ordinate, α base), form and metadata.
 * @returns The file's text.
 * @throws {RangeError} When the ordinate does not present the spectrum's quantity.
 *
 * @example Write and read back
 * ```ts
 * import { writeJcamp } from "./write_jcamp.ts";
 * import { readJcamp } from "./read_jcamp.ts";
 * const wavelengthNm = Float64Array.from([400, 410, 420, 430, 440, 450]);
 * const values = Float64Array.from([0.5, 0.52, 0.54, 0.54, 0.54, 0.6]);
 * const text = writeJcamp({ wavelengthNm, values, quantity: "transmittance", meta: { sample: "s1" } });
 * const [back] = readJcamp(text, "s1.jdx");
 * if (back!.values[5] !== 0.6) throw new Error("round trip failed");
 * ```
 */
export function writeJcamp(spectrum: Spectrum, options: JcampWriteOptions = {}): string {
  const columns = spectrumColumns(spectrum, options);
  const { x, y } = columns;
  const n = x.length;
  const xExp = decimalExponent(x, options.xSignificantDigits ?? 9);
  const yExp = decimalExponent(y, options.ySignificantDigits ?? 7);
  const yInts = Array.from(y, (v) => Math.round(toUnits(v, yExp)));
  const xInts = Array.from(x, (v) => String(Math.round(toUnits(v, xExp))));
  const even = n >= 2 && evenlySpaced(x);
  const head = [
    `##TITLE=${recordValue(spectrum.meta.sample) || "untitled"}`,
    "##JCAMP-DX=4.24",
    "##DATA TYPE=UV/VIS SPECTRUM",
    `##ORIGIN=${recordValue(options.origin ?? "not stated")}`,
    `##OWNER=${recordValue(options.owner ?? "not stated")}`,
  ];
  if (spectrum.thicknessMm !== undefined) head.push(`##$THICKNESS MM=${spectrum.thicknessMm}`);
  if (spectrum.polarisation) head.push(`##$POLARISATION=${spectrum.polarisation}`);
  if (options.host) head.push(`##$HOST=${recordValue(options.host)}`);
  for (const [label, value] of Object.entries(options.records ?? {})) {
    head.push(`##${userLabel(label)}=${recordValue(value)}`);
  }
  head.push(
    `##XUNITS=${XUNITS[columns.axis]}`,
    `##YUNITS=${yUnits(columns)}`,
    `##XFACTOR=${powerOfTenText(xExp)}`,
    `##YFACTOR=${powerOfTenText(yExp)}`,
    `##FIRSTX=${formatFixed(x[0]!, xExp)}`,
    `##LASTX=${formatFixed(x[n - 1]!, xExp)}`,
  );
  if (even) head.push(`##DELTAX=${(x[n - 1]! - x[0]!) / (n - 1)}`);
  head.push(
    `##FIRSTY=${formatFixed(y[0]!, yExp)}`,
    `##MINY=${formatFixed(Math.min(...y), yExp)}`,
    `##MAXY=${formatFixed(Math.max(...y), yExp)}`,
    `##NPOINTS=${n}`,
  );
  let data: string[];
  if (even) {
    head.push("##XYDATA=(X++(Y..Y))");
    data = (options.form ?? "difdup") === "affn"
      ? affnLines(xInts, yInts)
      : difdupLines(xInts, yInts);
  } else {
    head.push("##XYPOINTS=(XY..XY)");
    data = xInts.map((xi, i) => `${xi}, ${yInts[i]}`);
  }
  return [...head, ...data, "##END="].join("\n") + "\n";
}

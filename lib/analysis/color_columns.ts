/**
 * The one mapping from colour-row keys (the JSON contract) to CSV headers with units, used by
 * every CSV writer (`color --csv`, results.csv).
 *
 * @module
 */
import { roundTo } from "../numeric/round.ts";
import type { ColourRow } from "../cie/spectrum_colour.ts";

/** A column of a colour table: the row key, its CSV header, decimals kept in CSV. */
export interface ColorColumn {
  /** Key in the JSON rows. */
  key: keyof ColourRow;
  /** Header in CSV files. */
  header: string;
  /** Decimals written in CSV (none: written as is). */
  decimals?: number;
}

/** The colour columns, in output order. */
export const COLOR_COLUMNS: readonly ColorColumn[] = [
  { key: "sample", header: "sample" },
  { key: "file", header: "file" },
  { key: "illuminant", header: "illuminant" },
  { key: "observer", header: "observer" },
  { key: "pathMm", header: "path (mm)" },
  { key: "X", header: "X", decimals: 4 },
  { key: "Y", header: "Y", decimals: 4 },
  { key: "Z", header: "Z", decimals: 4 },
  { key: "x", header: "x", decimals: 4 },
  { key: "y", header: "y", decimals: 4 },
  { key: "L", header: "L*", decimals: 4 },
  { key: "a", header: "a*", decimals: 4 },
  { key: "b", header: "b*", decimals: 4 },
  { key: "C", header: "C*ab", decimals: 4 },
  { key: "h", header: "h_ab (deg)", decimals: 4 },
  { key: "uPrime", header: "u'", decimals: 4 },
  { key: "vPrime", header: "v'", decimals: 4 },
  { key: "dominantNm", header: "dominant or complementary (nm)", decimals: 1 },
  { key: "complementary", header: "complementary" },
  { key: "purity", header: "excitation purity", decimals: 4 },
  { key: "srgb", header: "sRGB" },
  { key: "srgbOutOfGamut", header: "outside sRGB" },
  { key: "p3", header: "Display P3" },
  { key: "p3OutOfGamut", header: "outside Display P3" },
  { key: "method", header: "interpolation" },
  { key: "extrapolated", header: "extrapolated" },
];

/**
 * A text cell a spreadsheet will not run as a formula: text starting with `=`, `+`, `-`, `@`,
 * tab or carriage return gets a leading `'` (OWASP, "CSV Injection").
 */
export function spreadsheetSafe(text: string): string {
  return /^[=+\-@\t\r]/.test(text) ? `'${text}` : text;
}

/**
 * A value as a CSV cell: numbers to the column's decimals, booleans as `true`/`false`, null
 * and undefined as an empty cell, text made spreadsheet-safe.
 */
export function csvCell(value: unknown, decimals?: number): string | number {
  if (value === null || value === undefined) return "";
  if (typeof value === "boolean") return value ? "true" : "false";
  if (typeof value === "number") {
    if (!Number.isFinite(value)) return "";
    return decimals === undefined ? value : roundTo(value, decimals);
  }
  return spreadsheetSafe(String(value));
}

/** The cells of one colour row, in {@linkcode COLOR_COLUMNS} order. */
export function colorRowCells(row: ColourRow): (string | number)[] {
  return COLOR_COLUMNS.map((c) => csvCell(row[c.key], c.decimals));
}

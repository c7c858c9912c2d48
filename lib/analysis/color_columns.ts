/**
 * The colour columns of results.csv in order, and CSV cells: booleans `true`/`false`, numbers
 * to the column's decimals, spreadsheet-safe text. Headers come from the one mapping in
 * csv_headers.ts.
 *
 * @module
 */
import { roundTo } from "../numeric/round.ts";
import { csvHeader } from "./csv_headers.ts";
import type { ColorRow } from "../cie/spectrum_color.ts";

/** A column of a colour table: the row key and the decimals kept in CSV. */
export interface ColorColumn {
  /** Key in the JSON rows (its CSV header comes from `csvHeader`). */
  key: keyof ColorRow;
  /** Decimals written in CSV (none: written as is). */
  decimals?: number;
}

/** The colour columns, in output order. */
export const COLOR_COLUMNS: readonly ColorColumn[] = [
  { key: "sample" },
  { key: "file" },
  { key: "illuminant" },
  { key: "observer" },
  { key: "pathMm" },
  { key: "X", decimals: 4 },
  { key: "Y", decimals: 4 },
  { key: "Z", decimals: 4 },
  { key: "x", decimals: 4 },
  { key: "y", decimals: 4 },
  { key: "L", decimals: 4 },
  { key: "a", decimals: 4 },
  { key: "b", decimals: 4 },
  { key: "C", decimals: 4 },
  { key: "h", decimals: 4 },
  { key: "uPrime", decimals: 4 },
  { key: "vPrime", decimals: 4 },
  { key: "dominantNm", decimals: 1 },
  { key: "complementary" },
  { key: "purity", decimals: 4 },
  { key: "srgb" },
  { key: "srgbOutOfGamut" },
  { key: "p3" },
  { key: "p3OutOfGamut" },
  { key: "method" },
  { key: "extrapolated" },
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

/** The CSV headers of the colour columns. */
export function colorHeaders(): string[] {
  return COLOR_COLUMNS.map((c) => csvHeader(c.key));
}

/** The cells of one colour row, in {@linkcode COLOR_COLUMNS} order. */
export function colorRowCells(row: ColorRow): (string | number)[] {
  return COLOR_COLUMNS.map((c) => csvCell(row[c.key], c.decimals));
}

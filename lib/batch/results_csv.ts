/**
 * results.csv: one row per sample, illuminant and observer, with the colour columns of the
 * shared mapping, then change, target and dopant columns, notes and the sheet's own columns.
 *
 * @module
 */
import { stringify } from "csv-stringify/sync";
import type { SampleResult } from "../analysis/sample_result.ts";
import { csvHeader } from "../analysis/csv_headers.ts";
import {
  colorHeaders,
  colorRowCells,
  csvCell,
  spreadsheetSafe,
} from "../analysis/color_columns.ts";

/** Standard uncertainties (k = 1) of a colour row, blank when uncertainties are off. */
const SD_KEYS = ["LSd", "aSd", "bSd", "CSd", "hSd"] as const;

/** Columns after the colour columns. */
const SAMPLE_COLUMNS = [
  ...SD_KEYS.map(csvHeader),
  "thickness (mm)",
  "change dE00",
  "change dh (deg)",
  "change marked",
  csvHeader("changeDE00Sd"),
  "target",
  "target dE00 (this illuminant)",
  "target dE00 (worst)",
  "target pass",
  "target miss",
  `target ${csvHeader("passProbability")}`,
  `target ${csvHeader("verdict")}`,
  "dopant",
  "dopant sigma",
  "dopant unit",
  "dopant calibration",
  "dopant outside calibrated range",
  "notes",
];

/** The header row, with the sheet's extra columns. */
export function resultsCsvHeader(extraColumns: string[]): string {
  return stringify([[
    ...colorHeaders(),
    ...SAMPLE_COLUMNS,
    ...extraColumns.map(spreadsheetSafe),
  ]]);
}

/** The rows of one sample result. */
export function resultsCsvRows(result: SampleResult, extraColumns: string[]): string {
  const t = result.target, d = result.dopant;
  const rows = result.color.map((c) => {
    const here = t && t.observer === c.observer
      ? t.checks.find((k) => k.illuminant === c.illuminant)
      : undefined;
    const sd = result.uncertainty?.rows.find((r) =>
      r.illuminant === c.illuminant && r.observer === c.observer
    );
    return [
      ...colorRowCells(c),
      ...SD_KEYS.map((k) => csvCell(sd?.[k], 4)),
      csvCell(result.thicknessMm),
      csvCell(result.change.dE00, 4),
      csvCell(result.change.dh, 4),
      csvCell(result.change.marked),
      csvCell(result.uncertainty?.changeDE00Sd, 4),
      csvCell(t?.name),
      csvCell(here?.dE00, 4),
      csvCell(t?.dE00, 4),
      csvCell(t?.pass),
      csvCell(t?.words),
      csvCell(t?.passProbability, 4),
      csvCell(t?.verdict),
      csvCell(d?.concentration, 6),
      csvCell(d?.sigma, 6),
      csvCell(d?.unit),
      csvCell(d?.calibration),
      csvCell(d?.outsideRange),
      csvCell(result.notes),
      ...extraColumns.map((k) => csvCell(result.extra[k] ?? "")),
    ];
  });
  return stringify(rows);
}

/**
 * The standards table of a calibration: CSV with sample, concentration (unit in a column or in
 * the header, e.g. `Cr2O3 (wt%)`), an optional concentration uncertainty, and either a
 * spectrum file or a ready `response` value (with optional `response_sigma`).
 *
 * @module
 */
import { parseSheet } from "../io/parse_sheet.ts";
import { InputError } from "../io/input_error.ts";
import { isResponseHeader, readResponseHeader, type ResponseHeader } from "./response_header.ts";

/** One row of the standards table. */
export interface StandardRow {
  line: number;
  sample: string;
  concentration: number;
  concentrationSigma?: number;
  unit: string;
  file?: string;
  response?: number;
  responseSigma?: number;
  thicknessMm?: number;
}

/**
 * Parses a standards table.
 *
 * @throws {InputError} Naming the line for a missing or non-numeric concentration or response.
 */
export function parseStandards(text: string, file: string): StandardRow[] {
  return parseStandardsTable(text, file).rows;
}

/** A standards table: its rows and what its response column holds (when it has one). */
export interface StandardsTable {
  /** The standards. */
  rows: StandardRow[];
  /** The response column's metric, position and unit, from its header. */
  response?: ResponseHeader & { header: string };
}

/**
 * Parses a standards table, with the response metric its header names.
 *
 * @throws {InputError} Naming the line for a missing or non-numeric concentration or response.
 */
export function parseStandardsTable(text: string, file: string): StandardsTable {
  let records: string[][];
  try {
    records = parseSheet(text);
  } catch (e) {
    throw new InputError(
      "malformed",
      file,
      undefined,
      `Cannot read the standards table: ${(e as Error).message}`,
    );
  }
  const [header, ...rows] = records;
  if (!header) throw new InputError("empty", file, undefined, "Standards table is empty");
  const keys = header.map((h) => h.toLowerCase());
  const find = (re: RegExp) => keys.findIndex((k) => re.test(k));
  const cConc = find(/^(concentration|conc|level|content)\b|wt ?%|ppm|at ?%|cm-3/);
  const cSigma = find(/(concentration|conc).*(sigma|sd|uncert|±|err)|^(sigma|u)_?(conc|c)$/);
  const cUnit = find(/^unit$/);
  const cSample = find(/^(sample|standard|id|name)$/);
  const cFile = find(/^(file|spectrum|filename)$/);
  const cResp = header.findIndex((h) =>
    isResponseHeader(h) && !/sigma|\bsd\b|err|uncert|±/i.test(h)
  );
  const cRespSigma = find(/^response[_ ]?(sigma|sd|err)/);
  const cThick = find(/^thickness/);
  if (cConc < 0) {
    throw new InputError(
      "malformed",
      file,
      1,
      'No concentration column (e.g. "concentration" or "Cr2O3 (wt%)")',
    );
  }
  if (cFile < 0 && cResp < 0) {
    throw new InputError("malformed", file, 1, "Need a file column or a response column");
  }
  const headerUnit = /\(([^)]+)\)|\[([^\]]+)\]/.exec(header[cConc]!);
  const num = (cells: string[], c: number, line: number, what: string, required: boolean) => {
    const raw = c >= 0 ? (cells[c] ?? "") : "";
    if (raw === "") {
      if (required) throw new InputError("non-numeric", file, line, `Missing ${what}`);
      return undefined;
    }
    const v = Number(raw.replace(",", "."));
    if (!Number.isFinite(v)) {
      throw new InputError("non-numeric", file, line, `${what} "${raw}" is not a number`);
    }
    return v;
  };
  const parsed = rows.map((cells, i) => {
    const line = i + 2;
    const row: StandardRow = {
      line,
      sample: cSample >= 0 ? cells[cSample] ?? `standard ${i + 1}` : `standard ${i + 1}`,
      concentration: num(cells, cConc, line, "concentration", true)!,
      unit: (cUnit >= 0 ? cells[cUnit] : undefined) || headerUnit?.[1] || headerUnit?.[2] || "",
    };
    const s = num(cells, cSigma, line, "concentration uncertainty", false);
    if (s !== undefined) row.concentrationSigma = s;
    if (cFile >= 0 && cells[cFile]) row.file = cells[cFile];
    const r = num(cells, cResp, line, "response", !row.file);
    if (r !== undefined) row.response = r;
    const rs = num(cells, cRespSigma, line, "response uncertainty", false);
    if (rs !== undefined) row.responseSigma = rs;
    const t = num(cells, cThick, line, "thickness", false);
    if (t !== undefined) row.thicknessMm = t;
    return row;
  });
  if (cResp < 0) return { rows: parsed };
  const response = { ...readResponseHeader(header[cResp]!), header: header[cResp]! };
  return { rows: parsed, response };
}

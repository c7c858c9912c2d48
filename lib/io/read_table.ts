/**
 * Finds the numeric table inside a text export: delimiter and decimal mark, the metadata
 * preamble, the header row, the data rows (with their line numbers) and any footer.
 * Field splitting is done by csv-parse; this module only decides how to call it.
 *
 * @module
 */
// A full specifier: a program outside this repository that imports lib/mod.ts by path resolves it
// without our deno.json (the import map applies only inside the project).
// deno-lint-ignore no-import-prefix
import { parse } from "npm:csv-parse@^5.6.0/sync";
import { InputError } from "./input_error.ts";

/** A located, numeric table read from a text export. */
export interface TextTable {
  delimiter: "," | ";" | "\t" | "whitespace";
  decimalComma: boolean;
  /** Header cells, when a header row was found. */
  header?: string[];
  /** 1-based line number of the header row. */
  headerLine?: number;
  /** Data rows as numbers, all of the same width. */
  rows: number[][];
  /** 1-based source line number of each data row. */
  rowLines: number[];
  /** Key/value lines before the header (and any footer), verbatim. */
  fields: Record<string, string>;
  /** `#` comment lines, verbatim. */
  comments: string[];
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const NON_FINITE = /^[+-]?(nan|inf|infinity|∞|1\.#inf|1\.#ind)$/i;

interface Line {
  text: string;
  no: number;
}

/** One split line: its cells and its 1-based line number. */
interface Row {
  cells: string[];
  no: number;
}

function splitLines(text: string): Line[] {
  return text.split(/\r\n|\n|\r/).map((t, i) => ({ text: t.replace(/^\uFEFF/, ""), no: i + 1 }));
}

function looksNumeric(line: string): boolean {
  return /^\s*[+-]?(\d|\.\d)/.test(line);
}

function chooseDelimiter(sample: string[]): TextTable["delimiter"] {
  if (sample.some((l) => l.includes("\t"))) return "\t";
  if (sample.some((l) => l.includes(";"))) return ";";
  if (sample.some((l) => l.includes(","))) {
    const ws = sample.every((l) => {
      const f = l.trim().split(/\s+/);
      return f.length >= 2 && f.every((c) => /^[+-]?\d+(,\d+)?([eE][+-]?\d+)?$/.test(c));
    });
    return ws ? "whitespace" : ",";
  }
  return "whitespace";
}

/** Drops empty cells at the end of a record: many exports end every line with a delimiter. */
function trimTrailingEmpty(cells: string[]): string[] {
  let end = cells.length;
  while (end > 1 && cells[end - 1] === "") end--;
  return end === cells.length ? cells : cells.slice(0, end);
}

function splitRecords(lines: Line[], delimiter: TextTable["delimiter"], file: string): Row[] {
  return lines.map((l) => ({ cells: trimTrailingEmpty(splitCells(l, delimiter, file)), no: l.no }));
}

function splitCells(l: Line, delimiter: TextTable["delimiter"], file: string): string[] {
  if (delimiter === "whitespace") return l.text.trim().split(/\s+/);
  // Lines without quotes split exactly on the delimiter (fast for wide files); csv-parse
  // handles every line that quotes a field.
  if (!l.text.includes('"')) {
    const cells = l.text.split(delimiter);
    return /\s/.test(l.text) ? cells.map((t) => t.trim()) : cells;
  }
  try {
    const cells: string[][] = parse(l.text, {
      delimiter,
      relax_column_count: true,
      relax_quotes: true,
      trim: true,
      skip_empty_lines: false,
    });
    return cells[0] ?? [];
  } catch (e) {
    throw new InputError("malformed", file, l.no, `Cannot split line: ${(e as Error).message}`);
  }
}

/** Parses a cell as a number (decimal comma allowed when set); undefined when not numeric. */
export function parseNumberCell(cell: string, decimalComma: boolean): number | undefined {
  const t = (decimalComma ? cell.replace(",", ".") : cell).trim();
  return NUMBER.test(t) ? Number(t) : undefined;
}

function keyValue(cells: string[], raw: string): [string, string] | undefined {
  if (cells.length >= 2 && cells[0]) {
    return [
      cells[0].replace(/[:=]\s*$/, "").trim(),
      cells.slice(1).filter(Boolean).join(" ").trim(),
    ];
  }
  const m = /^\s*([^:=]+?)\s*[:=]\s*(.*)$/.exec(raw);
  return m ? [m[1]!, m[2]!.trim()] : undefined;
}

/**
 * Locates the numeric table in export text.
 *
 * @throws {InputError} `empty` when no data rows exist, `non-numeric` / `non-finite` /
 *   `malformed` for a bad row inside the table (with its line number).
 */
export function readTextTable(text: string, file: string): TextTable {
  const all = splitLines(text);
  const comments = all.filter((l) => /^\s*#/.test(l.text)).map((l) =>
    l.text.replace(/^\s*#\s?/, "")
  );
  const lines = all.filter((l) => l.text.trim() !== "" && !/^\s*#/.test(l.text));
  const numericSample = lines.filter((l) => looksNumeric(l.text)).slice(0, 50).map((l) => l.text);
  if (numericSample.length === 0) {
    throw new InputError("empty", file, undefined, "No numeric data rows found");
  }
  const delimiter = chooseDelimiter(numericSample);
  const records = splitRecords(lines, delimiter, file);
  const decimalComma = delimiter !== "," &&
    records.filter((r) => looksNumeric(r.cells[0] ?? "")).slice(0, 200).some((r) =>
      r.cells.some((c) => /^[+-]?\d*,\d+([eE][+-]?\d+)?$/.test(c))
    );
  const numericRow = (r: Row) =>
    r.cells.length >= 2 && r.cells.every((c) => parseNumberCell(c, decimalComma) !== undefined);
  let start = -1;
  for (let i = 0; i < records.length; i++) {
    const r = records[i]!;
    const next = records[i + 1];
    if (
      numericRow(r) &&
      (next === undefined || (numericRow(next) && next.cells.length === r.cells.length))
    ) {
      start = i;
      break;
    }
  }
  if (start < 0) {
    const first = records.find((r) => looksNumeric(r.cells[0] ?? ""));
    const bad = first?.cells.find((c) => parseNumberCell(c, decimalComma) === undefined);
    if (first && bad !== undefined) throw cellError(file, bad, first.no, decimalComma);
    throw new InputError(
      "empty",
      file,
      undefined,
      "No table of at least two numeric columns found",
    );
  }
  const width = records[start]!.cells.length;
  const fields: Record<string, string> = {};
  let header: string[] | undefined;
  let headerLine: number | undefined;
  const before = records.slice(0, start);
  const last = before[before.length - 1];
  if (last && !numericRow(last) && last.cells.length >= Math.min(2, width)) {
    header = last.cells;
    if (delimiter === "whitespace" && header.length !== width) {
      const raw = lines[before.length - 1]!.text.trim();
      const wide = raw.split(/\t|\s{2,}/);
      header = wide.length === width ? wide : header;
    }
    headerLine = last.no;
    before.pop();
  }
  before.forEach((r, i) => {
    const raw = lines[i]!.text;
    const kv = keyValue(r.cells, raw);
    if (kv) fields[kv[0]] = kv[1];
    else fields[`line ${lines[i]!.no}`] = raw.trim();
  });
  const rows: number[][] = [];
  const rowLines: number[] = [];
  for (let i = start; i < records.length; i++) {
    const r = records[i]!;
    if (!looksNumeric(r.cells[0] ?? "")) {
      const nonFinite = r.cells.find((c) => NON_FINITE.test(c.trim()));
      if (nonFinite !== undefined) throw cellError(file, nonFinite, r.no, decimalComma);
      records.slice(i).forEach((f) => {
        const kv = keyValue(f.cells, f.cells.join(" "));
        fields[kv ? kv[0] : `line ${f.no}`] = kv ? kv[1] : f.cells.join(" ");
      });
      break;
    }
    const values: number[] = new Array(r.cells.length);
    for (let k = 0; k < r.cells.length; k++) {
      const v = parseNumberCell(r.cells[k]!, decimalComma);
      if (v === undefined) throw cellError(file, r.cells[k]!, r.no, decimalComma);
      values[k] = v;
    }
    if (values.length !== width) {
      throw new InputError(
        "malformed",
        file,
        r.no,
        `Row has ${values.length} fields where the table has ${width}`,
      );
    }
    rows.push(values);
    rowLines.push(r.no);
  }
  const table: TextTable = { delimiter, decimalComma, rows, rowLines, fields, comments };
  if (header) table.header = header;
  if (headerLine !== undefined) table.headerLine = headerLine;
  return table;
}

function cellError(file: string, cell: string, line: number, decimalComma: boolean): InputError {
  const text = cell.trim();
  if (NON_FINITE.test(text)) {
    return new InputError("non-finite", file, line, `Value "${text}" is not a finite number`);
  }
  if (text === "") {
    return new InputError("non-numeric", file, line, "Empty cell in the data table");
  }
  const hint = !decimalComma && /^\d+,\d+$/.test(text)
    ? " (decimal comma with a comma delimiter?)"
    : "";
  return new InputError("non-numeric", file, line, `Cell "${text}" is not a number${hint}`);
}

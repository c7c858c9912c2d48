/**
 * Finds the numeric table inside a text export: delimiter and decimal mark, the metadata
 * preamble and `#` comments, the header row, the data rows (with their line numbers) and any
 * footer. Field splitting of quoted lines is done by csv-parse; plain numeric data lines take
 * a fast path straight from the characters into typed columns (`parse_numeric_line.ts`), with
 * the general per-cell reader judging every line the fast path declines. An ASCII export may be
 * given as its bytes (vetted by `asciiText`): then only the lines that are not parsed by the fast path (preamble,
 * header, footer, the first rows that locate the table) are ever turned into strings.
 *
 * @module
 */
// A full specifier: a program outside this repository that imports lib/mod.ts by path resolves it
// without our deno.json (the import map applies only inside the project).
// deno-lint-ignore no-import-prefix
import { parse } from "npm:csv-parse@^5.6.0/sync";
import { InputError } from "./input_error.ts";
import { parseNumericBytes, parseNumericLine, WHITESPACE_DELIMITER } from "./parse_numeric_line.ts";
import { type ReadLimits, resolveReadLimits } from "./read_limits.ts";
import { type AsciiScan, scanAscii } from "./ascii_scan.ts";
import { splitMetadataLine } from "./read_metadata.ts";

/** A located, numeric table read from a text export. */
export interface TextTable {
  delimiter: "," | ";" | "\t" | "whitespace";
  decimalComma: boolean;
  /** Header cells, when a header row was found. */
  header?: string[];
  /** 1-based line number of the header row. */
  headerLine?: number;
  /** Data columns, all of the same length (the number of data rows). */
  columns: Float64Array<ArrayBuffer>[];
  /** 1-based source line number of each data row. */
  rowLines: number[];
  /** Key/value lines of the preamble, `#` comments and any footer, verbatim. */
  fields: Record<string, string>;
  /** 1-based line of each field. */
  fieldLines?: Record<string, number>;
  /** `#` comment lines, verbatim. */
  comments: string[];
}

/** How to read a table. */
export interface TableReadOptions {
  /** Caps on the table (defaults in `read_limits.ts`). */
  limits?: Partial<ReadLimits>;
  /** `general` reads every line cell by cell (the reference the fast path is tested against). */
  tableReader?: "auto" | "general";
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;
const NON_FINITE = /^[+-]?(nan|inf|infinity|∞|1\.#inf|1\.#ind)$/i;

/** One line of the export: its text (made on first use for a line held as bytes). */
interface Line {
  readonly text: string;
  readonly no: number;
  /** The first character code (NaN for an empty line). */
  readonly first: number;
  /** Whether the line holds the character `code` (ASCII). */
  has(code: number): boolean;
  /** Parses the line by the fast path (see `parseNumericLine`). */
  parse(delimiter: number, decimalComma: boolean, columns: Float64Array[], row: number): boolean;
}

/** A line held as text. */
class TextLine implements Line {
  readonly first: number;
  constructor(readonly text: string, readonly no: number) {
    this.first = text.charCodeAt(0);
  }
  has(code: number): boolean {
    return this.text.includes(String.fromCharCode(code));
  }
  parse(delimiter: number, decimalComma: boolean, columns: Float64Array[], row: number): boolean {
    return parseNumericLine(this.text, delimiter, decimalComma, columns, row);
  }
}

const ascii = new TextDecoder();

/** ASCII white space as `trim` and `\s` see it: tab, LF, VT, FF, CR and space. */
function isBlank(code: number): boolean {
  return code === 32 || (code >= 9 && code <= 13);
}

/** A line held as the bytes `bytes[start … end − 1]` of an ASCII export. */
class ByteLine implements Line {
  #text: string | undefined;
  readonly first: number;
  constructor(
    readonly bytes: Uint8Array,
    readonly start: number,
    readonly end: number,
    readonly no: number,
  ) {
    this.first = start < end ? bytes[start]! : NaN;
  }
  get text(): string {
    return this.#text ??= ascii.decode(this.bytes.subarray(this.start, this.end));
  }
  /** The first cell, trimmed, as splitting the text would give it (a line without quotes). */
  firstCell(delimiter: number): string {
    const b = this.bytes;
    let i = this.start;
    while (i < this.end && isBlank(b[i]!)) i++;
    let stop = i;
    if (delimiter === WHITESPACE_DELIMITER) {
      while (stop < this.end && !isBlank(b[stop]!)) {
        stop++;
      }
    } else {
      while (stop < this.end && b[stop] !== delimiter) stop++;
      while (stop > i && isBlank(b[stop - 1]!)) stop--;
    }
    return ascii.decode(b.subarray(i, stop));
  }
  has(code: number): boolean {
    const at = this.bytes.indexOf(code, this.start);
    return at >= 0 && at < this.end;
  }
  parse(delimiter: number, decimalComma: boolean, columns: Float64Array[], row: number): boolean {
    return parseNumericBytes(
      this.bytes,
      this.start,
      this.end,
      delimiter,
      decimalComma,
      columns,
      row,
    );
  }
}

/** One split line: its cells and its 1-based line number. */
interface Row {
  cells: string[];
  no: number;
}

function splitLines(text: string): Line[] {
  // a plain split when the text has no CR (a regex split of a 30 MB text costs several times more)
  const parts = text.includes("\r") ? text.split(/\r\n|\n|\r/) : text.split("\n");
  const out: Line[] = new Array(parts.length);
  for (let i = 0; i < parts.length; i++) {
    const t = parts[i]!;
    out[i] = new TextLine(t.charCodeAt(0) === 0xfeff ? t.slice(1) : t, i + 1);
  }
  return out;
}

/** The lines of ASCII bytes ended by LF or CR LF (see {@linkcode asciiText}). */
function splitByteLines(bytes: Uint8Array): Line[] {
  const out: Line[] = [];
  let start = 0;
  for (;;) {
    const lf = bytes.indexOf(10, start);
    const stop = lf < 0 ? bytes.length : lf;
    const end = stop > start && bytes[stop - 1] === 13 ? stop - 1 : stop;
    out.push(new ByteLine(bytes, start, end, out.length + 1));
    if (lf < 0) return out;
    start = lf + 1;
  }
}

/** Bytes {@linkcode asciiText} found readable as a table without decoding, with its scan. */
export interface AsciiText {
  /** The export's bytes (after any leading BOM). */
  readonly bytes: Uint8Array;
  /** What the scan found in them (NUL, control bytes) for the checks of `decodeText`. */
  readonly scan: AsciiScan;
}

/**
 * The bytes, vetted, when they can be read as a table without decoding: 7-bit ASCII whose only
 * CRs end lines (CR LF); undefined for anything else (UTF-8 beyond ASCII, a BOM, old Mac line
 * ends), which is read as text.
 */
export function asciiText(bytes: Uint8Array): AsciiText | undefined {
  const scan = scanAscii(bytes);
  return scan.ascii && !scan.loneCr ? { bytes, scan } : undefined;
}

function looksNumeric(line: string): boolean {
  return /^\s*[+-]?(\d|\.\d)/.test(line);
}

function isComment(line: string): boolean {
  return /^\s*#/.test(line);
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

/** The first cell of a line as {@linkcode splitCells} would give it, without splitting the rest. */
function firstCell(l: Line, delimiter: TextTable["delimiter"], file: string): string {
  if (l instanceof ByteLine && !l.has(34)) {
    return l.firstCell(delimiter === "whitespace" ? WHITESPACE_DELIMITER : delimiter.charCodeAt(0));
  }
  if (delimiter === "whitespace") return l.text.trim().split(/\s+/, 1)[0] ?? "";
  if (l.text.includes('"')) return splitCells(l, delimiter, file)[0] ?? "";
  const at = l.text.indexOf(delimiter);
  return (at < 0 ? l.text : l.text.slice(0, at)).trim();
}

/**
 * Locates the numeric table in export text.
 *
 * @throws {InputError} `empty` when no data rows exist, `non-numeric` / `non-finite` /
 *   `malformed` for a bad row inside the table (with its line number), `too-large` past a cap.
 */
export function readTextTable(
  text: string | AsciiText,
  file: string,
  options: TableReadOptions = {},
): TextTable {
  const limits = resolveReadLimits(options.limits);
  const all = typeof text === "string" ? splitLines(text) : splitByteLines(text.bytes);
  // metadata lines (comments, preamble, footer), turned into fields in file order at the end
  const metadata: { line: Line; comment: boolean }[] = [];
  const addField = (line: Line) => metadata.push({ line, comment: false });
  const comments: string[] = [];
  const lines: Line[] = [];
  for (const l of all) {
    const c0 = l.first;
    if ((c0 >= 48 && c0 <= 57) || c0 === 45 || c0 === 43 || c0 === 46 || c0 === 34) {
      lines.push(l); // a digit, sign or point first: neither a comment nor blank (most lines)
    } else if (isComment(l.text)) {
      comments.push(l.text.replace(/^\s*#\s?/, ""));
      metadata.push({ line: l, comment: true });
    } else if (l.text.trim() !== "") lines.push(l);
  }
  const numericSample: string[] = [];
  for (const l of lines) {
    // quoted cells ("380","0.80") are numbers too
    const text = l.text.includes('"') ? l.text.replace(/"/g, "") : l.text;
    if (looksNumeric(text)) numericSample.push(text);
    if (numericSample.length === 50) break;
  }
  if (numericSample.length === 0) {
    throw new InputError("empty", file, undefined, "No numeric data rows found");
  }
  const delimiter = chooseDelimiter(numericSample);
  const cache: (Row | undefined)[] = new Array(lines.length);
  const record = (i: number): Row =>
    cache[i] ??= {
      cells: trimTrailingEmpty(splitCells(lines[i]!, delimiter, file)),
      no: lines[i]!.no,
    };
  let decimalComma = false;
  if (delimiter !== ",") {
    for (let i = 0, seen = 0; i < lines.length && seen < 200; i++) {
      if (!looksNumeric(firstCell(lines[i]!, delimiter, file))) continue;
      seen++;
      if (!lines[i]!.has(44)) continue; // a comma (bytes are not made into text for this)
      if (record(i).cells.some((c) => /^[+-]?\d*,\d+([eE][+-]?\d+)?$/.test(c))) {
        decimalComma = true;
        break;
      }
    }
  }
  const numericRow = (r: Row) =>
    r.cells.length >= 2 && r.cells.every((c) => parseNumberCell(c, decimalComma) !== undefined);
  let start = -1;
  for (let i = 0; i < lines.length; i++) {
    if (!looksNumeric(firstCell(lines[i]!, delimiter, file))) continue;
    const r = record(i);
    const next = i + 1 < lines.length ? record(i + 1) : undefined;
    if (
      numericRow(r) &&
      (next === undefined || (numericRow(next) && next.cells.length === r.cells.length))
    ) {
      start = i;
      break;
    }
  }
  if (start < 0) {
    let first: Row | undefined;
    for (let i = 0; i < lines.length && !first; i++) {
      if (looksNumeric(firstCell(lines[i]!, delimiter, file))) first = record(i);
    }
    const bad = first?.cells.find((c) => parseNumberCell(c, decimalComma) === undefined);
    if (first && bad !== undefined) throw cellError(file, bad, first.no, decimalComma);
    throw new InputError(
      "empty",
      file,
      undefined,
      "No table of at least two numeric columns found",
    );
  }
  const width = record(start).cells.length;
  if (width > limits.maxColumns) {
    throw new InputError(
      "too-large",
      file,
      lines[start]!.no,
      `Table has ${width} columns; at most ${limits.maxColumns} are read`,
    );
  }
  let header: string[] | undefined;
  let headerLine: number | undefined;
  let preambleEnd = start;
  if (start > 0) {
    const last = record(start - 1);
    if (!numericRow(last) && last.cells.length >= Math.min(2, width)) {
      header = last.cells;
      if (delimiter === "whitespace" && header.length !== width) {
        const raw = lines[start - 1]!.text.trim();
        const wide = raw.split(/\t|\s{2,}/);
        header = wide.length === width ? wide : header;
      }
      headerLine = last.no;
      preambleEnd = start - 1;
    }
  }
  for (let i = 0; i < preambleEnd; i++) addField(lines[i]!);

  const maxRows = Math.min(limits.maxPoints, Math.floor(limits.maxValues / width));
  const capacity = Math.min(lines.length - start, maxRows);
  const columns: Float64Array<ArrayBuffer>[] = [];
  for (let k = 0; k < width; k++) columns.push(new Float64Array(capacity));
  const rowLines: number[] = [];
  const fast = options.tableReader !== "general";
  const delimiterCode = delimiter === "whitespace" ? WHITESPACE_DELIMITER : delimiter.charCodeAt(0);
  let count = 0;
  for (let i = start; i < lines.length; i++) {
    const l = lines[i]!;
    if (count === capacity) {
      if (!looksNumeric(firstCell(l, delimiter, file))) {
        for (let j = i; j < lines.length; j++) addField(lines[j]!);
        break;
      }
      throw new InputError(
        "too-large",
        file,
        l.no,
        `Table has more than ${maxRows} rows of ${width} columns; at most ${limits.maxPoints} points and ${limits.maxValues} values are read`,
      );
    }
    if (fast && l.parse(delimiterCode, decimalComma, columns, count)) {
      rowLines.push(l.no);
      count++;
      continue;
    }
    const r = record(i);
    if (!looksNumeric(r.cells[0] ?? "")) {
      const nonFinite = r.cells.find((c) => NON_FINITE.test(c.trim()));
      if (nonFinite !== undefined) throw cellError(file, nonFinite, r.no, decimalComma);
      for (let j = i; j < lines.length; j++) addField(lines[j]!);
      break;
    }
    for (let k = 0; k < r.cells.length; k++) {
      const v = parseNumberCell(r.cells[k]!, decimalComma);
      if (v === undefined) throw cellError(file, r.cells[k]!, r.no, decimalComma);
      if (!Number.isFinite(v)) throw cellError(file, r.cells[k]!, r.no, decimalComma);
      if (k < width) columns[k]![count] = v;
    }
    if (r.cells.length !== width) {
      throw new InputError(
        "malformed",
        file,
        r.no,
        `Row has ${r.cells.length} fields where the table has ${width}`,
      );
    }
    cache[i] = undefined;
    rowLines.push(r.no);
    count++;
  }
  const fields: Record<string, string> = {};
  const fieldLines: Record<string, number> = {};
  metadata.sort((a, b) => a.line.no - b.line.no);
  for (const { line, comment } of metadata) {
    const kv = splitMetadataLine(line.text);
    if (!kv && comment) continue; // a comment without a key is prose, kept in `comments`
    const key = kv ? kv.key : `line ${line.no}`;
    if (key in fields) continue; // the first statement of a key is kept
    fields[key] = kv ? kv.value : line.text.trim();
    fieldLines[key] = line.no;
  }
  const table: TextTable = {
    delimiter,
    decimalComma,
    columns: count === capacity ? columns : columns.map((c) => c.slice(0, count)),
    rowLines,
    fields,
    fieldLines,
    comments,
  };
  if (header) table.header = header;
  if (headerLine !== undefined) table.headerLine = headerLine;
  return table;
}

function cellError(file: string, cell: string, line: number, decimalComma: boolean): InputError {
  const text = cell.trim();
  if (NON_FINITE.test(text)) {
    return new InputError("non-finite", file, line, `Value "${text}" is not a finite number`);
  }
  if (parseNumberCell(text, decimalComma) !== undefined) {
    return new InputError(
      "non-finite",
      file,
      line,
      `Value "${text}" is beyond the range of finite numbers`,
    );
  }
  if (text === "") {
    return new InputError("non-numeric", file, line, "Empty cell in the data table");
  }
  const hint = !decimalComma && /^\d+,\d+$/.test(text)
    ? " (decimal comma with a comma delimiter?)"
    : "";
  return new InputError("non-numeric", file, line, `Cell "${text}" is not a number${hint}`);
}

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
import type { ByteSource, SourceText } from "./byte_source.ts";

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
  /**
   * Hands the data rows on a stretch at a time instead of keeping them (see
   * {@linkcode TableStream}); the returned table then holds only the x column.
   */
  stream?: TableStream;
}

/**
 * A consumer of a table's rows, a stretch of rows at a time: the table is never held whole.
 * `begin` receives the table with its x column only (the first cell of each data row, read
 * before any other cell), then `stretch` each stretch of rows in order.
 */
export interface TableStream {
  /**
   * Called once, before any stretch, with the table holding only its x column and the number
   * of columns it has; returns the rows per stretch (at least 1), or false to read no further.
   */
  begin(table: TextTable, width: number): number | false;
  /**
   * One stretch: `columns[k][j]` is column k of data row `firstRow + j`, j < count. The arrays
   * are reused for the next stretch.
   */
  stretch(columns: readonly Float64Array[], count: number, firstRow: number): void;
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
  /** The first cell, trimmed, of a line without quotes, when the line can say it from its bytes. */
  firstCellOf?(delimiter: number): string;
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

/**
 * The first cell, trimmed, of the ASCII line `bytes[start … end − 1]`, as splitting its text
 * would give it (a line without quotes).
 */
function firstCellOfBytes(b: Uint8Array, start: number, end: number, delimiter: number): string {
  let i = start;
  while (i < end && isBlank(b[i]!)) i++;
  let stop = i;
  if (delimiter === WHITESPACE_DELIMITER) {
    while (stop < end && !isBlank(b[stop]!)) stop++;
  } else {
    while (stop < end && b[stop] !== delimiter) stop++;
    while (stop > i && isBlank(b[stop - 1]!)) stop--;
  }
  return ascii.decode(b.subarray(i, stop));
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
  firstCellOf(delimiter: number): string {
    return firstCellOfBytes(this.bytes, this.start, this.end, delimiter);
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

/** Reads lines of a {@linkcode ByteSource} into one reused buffer. */
class LineReader {
  #buffer = new Uint8Array(1 << 16);
  constructor(readonly source: ByteSource) {}
  /** The bytes from `start` to `end` − 1, valid until the next read. */
  read(start: number, end: number): Uint8Array {
    const length = end - start;
    if (this.#buffer.length < length) this.#buffer = new Uint8Array(length + (length >> 2));
    const into = this.#buffer.subarray(0, length);
    let done = 0;
    while (done < length) {
      const n = this.source.readAt(start + done, into.subarray(done));
      if (n === 0) throw new Error(`Cannot read bytes ${start}–${end}: the file got shorter`);
      done += n;
    }
    return into;
  }
}

/**
 * A line held as its place in a {@linkcode ByteSource}: its bytes are read, and its text made,
 * each time they are needed (the few lines whose text is needed are read a few times; kept,
 * the texts of a wide table's first rows would stay in memory for the whole read).
 */
class SourceLine implements Line {
  constructor(
    readonly reader: LineReader,
    readonly start: number,
    readonly end: number,
    readonly no: number,
    readonly first: number,
  ) {}
  get text(): string {
    return ascii.decode(this.reader.read(this.start, this.end));
  }
  firstCellOf(delimiter: number): string {
    // a first cell is short: the line's opening bytes say it unless they hold no delimiter
    for (let size = 256;; size *= 16) {
      const end = Math.min(this.end, this.start + size);
      const bytes = this.reader.read(this.start, end);
      let i = 0;
      while (i < bytes.length && isBlank(bytes[i]!)) i++;
      const stop = delimiter === WHITESPACE_DELIMITER
        ? bytes.findIndex((b, k) => k > i && isBlank(b))
        : bytes.indexOf(delimiter);
      if (stop >= 0 || end === this.end) return firstCellOfBytes(bytes, 0, bytes.length, delimiter);
    }
  }
  has(code: number): boolean {
    return this.reader.read(this.start, this.end).includes(code);
  }
  parse(delimiter: number, decimalComma: boolean, columns: Float64Array[], row: number): boolean {
    const bytes = this.reader.read(this.start, this.end);
    return parseNumericBytes(bytes, 0, bytes.length, delimiter, decimalComma, columns, row);
  }
}

/** The lines of an indexed source (see `indexSourceLines`). */
function sourceLines(text: SourceText): Line[] {
  const reader = new LineReader(text.source);
  const out: Line[] = new Array(text.starts.length);
  for (let i = 0; i < out.length; i++) {
    out[i] = new SourceLine(reader, text.starts[i]!, text.ends[i]!, i + 1, text.firsts[i]!);
  }
  return out;
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

/**
 * A numeric-looking line sampled to choose the delimiter: what it holds, and its text (quotes
 * removed) made again when asked, so a wide table's first rows are not kept as text meanwhile.
 */
interface SampledLine {
  tab: boolean;
  semicolon: boolean;
  comma: boolean;
  text(): string;
}

/** The text of a line with its quotes removed (quoted cells such as "380","0.80" are numbers too). */
function unquoted(l: Line): string {
  const text = l.text;
  return text.includes('"') ? text.replace(/"/g, "") : text;
}

function chooseDelimiter(sample: SampledLine[]): TextTable["delimiter"] {
  if (sample.some((l) => l.tab)) return "\t";
  if (sample.some((l) => l.semicolon)) return ";";
  if (sample.some((l) => l.comma)) {
    const ws = sample.every((l) => {
      const f = l.text().trim().split(/\s+/);
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
  if (l.firstCellOf && !l.has(34)) {
    return l.firstCellOf(
      delimiter === "whitespace" ? WHITESPACE_DELIMITER : delimiter.charCodeAt(0),
    );
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
  text: string | AsciiText | SourceText,
  file: string,
  options: TableReadOptions = {},
): TextTable {
  const limits = resolveReadLimits(options.limits);
  const all = typeof text === "string"
    ? splitLines(text)
    : "source" in text
    ? sourceLines(text)
    : splitByteLines(text.bytes);
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
  const numericSample: SampledLine[] = [];
  for (const l of lines) {
    const text = unquoted(l);
    if (looksNumeric(text)) {
      numericSample.push({
        tab: text.includes("\t"),
        semicolon: text.includes(";"),
        comma: text.includes(","),
        text: () => unquoted(l),
      });
    }
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
  const fast = options.tableReader !== "general";
  const delimiterCode = delimiter === "whitespace" ? WHITESPACE_DELIMITER : delimiter.charCodeAt(0);
  /** The too-large error of a data row found past the capacity. */
  const tooManyRows = (l: Line) =>
    new InputError(
      "too-large",
      file,
      l.no,
      `Table has more than ${maxRows} rows of ${width} columns; at most ${limits.maxPoints} points and ${limits.maxValues} values are read`,
    );
  /**
   * Reads line i into `columns[k][row]`: true for a data row, false for the first line after the
   * table (a footer line); throws for a bad row.
   */
  const readRow = (i: number, columns: Float64Array[], row: number): boolean => {
    if (fast && lines[i]!.parse(delimiterCode, decimalComma, columns, row)) return true;
    const r = record(i);
    if (!looksNumeric(r.cells[0] ?? "")) {
      const nonFinite = r.cells.find((c) => NON_FINITE.test(c.trim()));
      if (nonFinite !== undefined) throw cellError(file, nonFinite, r.no, decimalComma);
      return false;
    }
    for (let k = 0; k < r.cells.length; k++) {
      const v = parseNumberCell(r.cells[k]!, decimalComma);
      if (v === undefined) throw cellError(file, r.cells[k]!, r.no, decimalComma);
      if (!Number.isFinite(v)) throw cellError(file, r.cells[k]!, r.no, decimalComma);
      if (k < width) columns[k]![row] = v;
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
    return true;
  };
  const rowLines: number[] = [];
  let columns: Float64Array<ArrayBuffer>[] = [];
  let count = 0;
  if (!options.stream) {
    for (let k = 0; k < width; k++) columns.push(new Float64Array(capacity));
    for (let i = start; i < lines.length; i++) {
      const l = lines[i]!;
      if (count === capacity) {
        if (!looksNumeric(firstCell(l, delimiter, file))) {
          for (let j = i; j < lines.length; j++) addField(lines[j]!);
          break;
        }
        throw tooManyRows(l);
      }
      if (!readRow(i, columns, count)) {
        for (let j = i; j < lines.length; j++) addField(lines[j]!);
        break;
      }
      rowLines.push(l.no);
      count++;
    }
    if (count < capacity) columns = columns.map((c) => c.slice(0, count));
  } else {
    // the x column first: a data row is a line whose first cell looks numeric, exactly the
    // lines the loop above keeps (the fast path parses only such lines)
    const xs: number[] = [];
    for (let i = start; i < lines.length; i++) {
      const l = lines[i]!;
      const cell = firstCell(l, delimiter, file);
      if (!looksNumeric(cell)) {
        if (count < capacity) readRow(i, [], 0); // a non-finite cell there is refused as above
        for (let j = i; j < lines.length; j++) addField(lines[j]!);
        break;
      }
      if (count === capacity) throw tooManyRows(l);
      const x = parseNumberCell(cell, decimalComma);
      if (x === undefined || !Number.isFinite(x)) throw cellError(file, cell, l.no, decimalComma);
      xs.push(x);
      rowLines.push(l.no);
      count++;
    }
    columns = [Float64Array.from(xs)];
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
    columns,
    rowLines,
    fields,
    fieldLines,
    comments,
  };
  if (header) table.header = header;
  if (headerLine !== undefined) table.headerLine = headerLine;
  if (options.stream) {
    streamRows(options.stream, table, width, (i, c, r) => readRow(start + i, c, r));
  }
  return table;
}

/**
 * Reads the data rows of a table whose x column is known a stretch at a time into reused
 * columns and hands each stretch on; a row that reads otherwise than the x pass saw it throws.
 */
function streamRows(
  stream: TableStream,
  table: TextTable,
  width: number,
  readRow: (index: number, columns: Float64Array[], row: number) => boolean,
): void {
  const rows = stream.begin(table, width);
  if (rows === false) return;
  const xs = table.columns[0]!;
  const count = xs.length;
  const size = Math.max(1, Math.min(rows, count));
  // one buffer for all columns (thousands of small arrays would each be allocated apart)
  const buffer = new Float64Array(width * size);
  const columns: Float64Array[] = [];
  for (let k = 0; k < width; k++) columns.push(buffer.subarray(k * size, (k + 1) * size));
  for (let from = 0; from < count; from += size) {
    const n = Math.min(size, count - from);
    for (let j = 0; j < n; j++) {
      if (!readRow(from + j, columns, j) || !Object.is(columns[0]![j], xs[from + j])) {
        throw new Error(`Cannot stream line ${table.rowLines[from + j]}: it reads otherwise twice`);
      }
    }
    stream.stretch(columns, n, from);
  }
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

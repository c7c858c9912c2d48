/**
 * Pieces every command shares: usage errors, exit codes, option parsing, output formats.
 *
 * @module
 */
import { roundTo } from "../lib/numeric/round.ts";
import { InputError } from "../lib/io/input_error.ts";
import { csvHeader } from "../lib/analysis/csv_headers.ts";

/** Exit codes of the machine contract. */
export const EXIT = { ok: 0, usage: 1, someFailed: 2 } as const;

/** A mistake in how the command was called (exit code 1). */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "UsageError";
  }
}

/** A positive number from an option value. */
export function positiveNumber(value: string | undefined, option: string): number | undefined {
  if (value === undefined) return undefined;
  const v = Number(value.replace(",", "."));
  if (!(v > 0) || !Number.isFinite(v)) {
    throw new UsageError(`Option --${option} needs a positive number, got "${value}"`);
  }
  return v;
}

/** Comma-separated list option. */
export function listOption(value: string | undefined, fallback: string[]): string[] {
  if (value === undefined) return fallback;
  return value.split(",").map((s) => s.trim()).filter(Boolean);
}

/** Writes a line to stderr. */
export function log(message: string): void {
  console.error(message);
}

/** Reports a failed input on stderr in the `file:line: problem` form. */
export function reportFailure(error: unknown, file: string): void {
  if (error instanceof InputError) log(`crystint: ${withFlagHint(error)}`);
  else log(`crystint: ${file}: ${withFlagHint(error)}`);
}

/** Flag wording for the machine hints library errors carry in `need`. */
const FLAG_HINTS: Record<string, string> = {
  thickness: "--thickness MM",
  path: "--path MM",
  host: "--host NAME, --n VALUE or --sellmeier COEFFS",
  n: "--n VALUE",
  index: "--host NAME, --n VALUE or --sellmeier COEFFS",
  ordinate: "--ordinate KIND",
  axis: "--axis UNIT",
  alphaBase: "--alpha-base e|10",
  illuminant: "--illuminant NAME",
  observer: "--observer 2|10",
  calibration: "--calibration CAL.json",
  length: "--length MM",
  polarisation: "--force-order",
};

/**
 * The option that supplies what a library error says is missing: `flagHint("thickness")` is
 * `"--thickness MM"`; an unknown hint becomes `--<hint>`.
 */
export function flagHint(need: string): string {
  return FLAG_HINTS[need] ?? `--${need.replace(/[A-Z]/g, (c) => `-${c.toLowerCase()}`)}`;
}

/** An error's message, with the flag to give when the error carries a `need` hint. */
export function withFlagHint(error: unknown): string {
  const message = (error as Error)?.message ?? String(error);
  const e = error as { need?: unknown; hint?: { need?: unknown; choices?: string[] } } | null;
  const need = e?.need ?? e?.hint?.need;
  if (typeof need !== "string" || need === "") return message;
  const choices = e?.hint?.choices;
  const flag = choices?.length ? `--${need} ${choices.join("|")}` : flagHint(need);
  return message.includes(flag.split(/[ ,]/)[0]!) ? message : `${message} (give ${flag})`;
}

/** Rounds for display or CSV without losing what the measurement supports. */
export function round(value: unknown, digits: number): unknown {
  return typeof value === "number" && Number.isFinite(value) ? roundTo(value, digits) : value;
}

/** A cell as CSV writes it: booleans `true`/`false`, missing values blank, objects as JSON. */
function csvCell(value: unknown): unknown {
  if (value === undefined || value === null) return "";
  if (typeof value === "boolean") return value ? "true" : "false";
  if (typeof value === "object") return JSON.stringify(value);
  return value;
}

/** One CSV field (RFC 4180): quoted when it holds a comma, quote or line break. */
function csvField(value: unknown): string {
  // a number's text never holds a comma, quote or line break
  if (typeof value === "number") return String(value);
  const cell = csvCell(value);
  const text = typeof cell === "string" ? cell : String(cell);
  return /[",\n\r]/.test(text) ? `"${text.replaceAll('"', '""')}"` : text;
}

/**
 * Rows as CSV text, with the readable header of each key (lib/analysis/csv_headers.ts).
 * Written directly, not through csv-stringify: the same text (test/cli/to_csv_test.ts checks it
 * against csv-stringify) at a fraction of the time and memory for 40,000-row outputs.
 */
export function toCsv(rows: Record<string, unknown>[], keys: string[]): string {
  return Array.from(csvPieces(rows, keys)).join("");
}

/**
 * The text of {@linkcode toCsv} in pieces of about `size` characters, header first, so a large
 * output is written as it is made instead of being held whole.
 */
export function* csvPieces(
  rows: Record<string, unknown>[],
  keys: string[],
  { header = true, size = 1 << 20 }: { header?: boolean; size?: number } = {},
): Generator<string> {
  let piece = header ? csvHeaderLine(keys) : "";
  for (const r of rows) {
    piece += csvLine(r, keys);
    if (piece.length >= size) {
      yield piece;
      piece = "";
    }
  }
  if (piece !== "") yield piece;
}

const encoder = new TextEncoder();

/** The header line of CSV rows with these keys (with its line end). */
function csvHeaderLine(keys: string[]): string {
  return keys.map((k) => csvField(csvHeader(k))).join(",") + "\n";
}

/** Finite numbers of consecutive cells of the line being written (reused). */
const run: number[] = [];

/**
 * One row as a CSV line (with its line end). Consecutive finite numbers are written by one
 * `JSON.stringify` of their list, whose text between the brackets is their `String` texts joined
 * by commas (ECMA-262 SerializeJSONProperty: a finite number is serialised as ToString), at half
 * the time, and without V8's number-to-string cache, whose entries each outlive a young
 * collection and piled up 20 MB of garbage in the old generation over 40,000 rows.
 */
function csvLine(r: Record<string, unknown>, keys: string[]): string {
  let line = "";
  run.length = 0;
  for (let k = 0; k < keys.length; k++) {
    const v = r[keys[k]!];
    if (typeof v === "number" && Number.isFinite(v)) {
      run.push(v);
      continue;
    }
    if (run.length > 0) line += numberRun(k - run.length);
    line += (k > 0 ? "," : "") + csvField(v);
  }
  if (run.length > 0) line += numberRun(keys.length - run.length);
  return line + "\n";
}

/** The text of {@linkcode run}, which starts at cell `first`, and empties it. */
function numberRun(first: number): string {
  const text = JSON.stringify(run);
  run.length = 0;
  return (first > 0 ? "," : "") + text.slice(1, -1);
}

/**
 * CSV rows written to stdout one at a time through one reused buffer (the text of
 * {@linkcode toCsv}): each row's text dies as soon as it is encoded, so a long output leaves
 * almost nothing behind in the JavaScript heap. Call `flush` at the end.
 */
export class CsvStdout {
  #bytes = new Uint8Array(1 << 16);
  #length = 0;
  constructor(readonly keys: string[]) {}
  /** Writes the header line. */
  header(): void {
    this.#add(csvHeaderLine(this.keys));
  }
  /** Writes rows. */
  rows(rows: readonly object[]): void {
    for (const r of rows) this.#add(csvLine(r as Record<string, unknown>, this.keys));
  }
  /** Writes out what is buffered. */
  flush(): void {
    let written = 0;
    while (written < this.#length) {
      written += Deno.stdout.writeSync(this.#bytes.subarray(written, this.#length));
    }
    this.#length = 0;
  }
  #add(text: string): void {
    // UTF-8 needs at most 3 bytes per UTF-16 code unit
    const most = 3 * text.length;
    if (this.#length + most > this.#bytes.length) this.flush();
    if (most > this.#bytes.length) this.#bytes = new Uint8Array(most);
    this.#length += encoder.encodeInto(text, this.#bytes.subarray(this.#length)).written;
  }
}

/** Writes rows as CSV to stdout piece by piece (the text of {@linkcode toCsv}; header optional). */
export function writeCsv(
  rows: Record<string, unknown>[],
  keys: string[],
  options: { header?: boolean } = {},
): void {
  for (const piece of csvPieces(rows, keys, { ...options, size: CSV_PIECE })) writeStdout(piece);
}

/**
 * Characters of CSV written at a time (our choice): small enough that a piece dies young in
 * the JavaScript heap (larger pieces made its young generation grow to 60 MB on 40,000 rows),
 * large enough for few writes.
 */
const CSV_PIECE = 1 << 16;

/** Output format chosen by `--json` / `--csv`, or the terminal table. */
export type OutputFormat = "json" | "csv" | "table";

/** The output format from the two flags (giving both is a usage error). */
export function outputFormat(json: boolean, csv: boolean): OutputFormat {
  if (json && csv) throw new UsageError("Give only one of --json and --csv");
  return json ? "json" : csv ? "csv" : "table";
}

/** The bytes of text being written, reused (a new array per write is garbage outside the heap). */
let stdoutBytes = new Uint8Array(1 << 16);

/** Writes text to stdout without a trailing newline being added. */
export function writeStdout(text: string): void {
  // UTF-8 needs at most 3 bytes per UTF-16 code unit
  if (stdoutBytes.length < 3 * text.length) stdoutBytes = new Uint8Array(3 * text.length);
  const { written: length } = encoder.encodeInto(text, stdoutBytes);
  let written = 0;
  while (written < length) {
    written += Deno.stdout.writeSync(stdoutBytes.subarray(written, length));
  }
}

/** Rows as an aligned plain-text table for a terminal, headed as in CSV. */
export function toTable(rows: Record<string, unknown>[], columns: string[]): string {
  const cells = rows.map((r) => columns.map((c) => String(r[c] ?? "")));
  const heads = columns.map(csvHeader);
  const widths = heads.map((c, i) => Math.max(c.length, ...cells.map((row) => row[i]!.length)));
  const fmt = (row: string[]) =>
    row.map((v, i) => (/^-?[\d.]+$/.test(v) ? v.padStart(widths[i]!) : v.padEnd(widths[i]!)))
      .join("  ").trimEnd();
  return [fmt(heads), fmt(widths.map((w) => "─".repeat(w))), ...cells.map(fmt)].join("\n");
}

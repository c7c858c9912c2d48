/**
 * Pieces every command shares: usage errors, exit codes, option parsing, output formats.
 *
 * @module
 */
import { parseArgs, type ParseArgsOptionsConfig } from "node:util";
import { stringify } from "csv-stringify/sync";
import { InputError } from "../lib/io/input_error.ts";

/** Exit codes of the machine contract. */
export const EXIT = { ok: 0, usage: 1, someFailed: 2 } as const;

/** A mistake in how the command was called (exit code 1). */
export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "UsageError";
  }
}

/** Parses arguments, turning unknown options into a {@linkcode UsageError}. */
export function parseCommandArgs<const T extends ParseArgsOptionsConfig>(
  args: string[],
  options: T,
) {
  try {
    return parseArgs({ args, options, allowPositionals: true, strict: true });
  } catch (e) {
    throw new UsageError((e as Error).message);
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
  if (error instanceof InputError) {
    const hint = error.hint
      ? ` (give --${error.hint.need}${
        error.hint.choices ? ` ${error.hint.choices.join("|")}` : ""
      })`
      : "";
    log(`crystint: ${error.message}${hint}`);
  } else log(`crystint: ${file}: ${(error as Error).message ?? String(error)}`);
}

/** Rounds for display or CSV without losing what the measurement supports. */
export function round(value: unknown, digits: number): unknown {
  return typeof value === "number" && Number.isFinite(value)
    ? Number(value.toFixed(digits))
    : value;
}

/** Rows as CSV text with a header row. */
export function toCsv(rows: Record<string, unknown>[], columns: string[]): string {
  return stringify(rows.map((r) => columns.map((c) => r[c] ?? "")), { header: true, columns });
}

/** Rows as an aligned plain-text table for a terminal. */
export function toTable(rows: Record<string, unknown>[], columns: string[]): string {
  const cells = rows.map((r) => columns.map((c) => String(r[c] ?? "")));
  const widths = columns.map((c, i) => Math.max(c.length, ...cells.map((row) => row[i]!.length)));
  const fmt = (row: string[]) =>
    row.map((v, i) => (/^-?[\d.]+$/.test(v) ? v.padStart(widths[i]!) : v.padEnd(widths[i]!)))
      .join("  ").trimEnd();
  return [fmt(columns), fmt(widths.map((w) => "─".repeat(w))), ...cells.map(fmt)].join("\n");
}

import { describe, it } from "node:test";
import { expect } from "expect";
import fc from "fast-check";
import { stringify } from "csv-stringify/sync";
import { toCsv } from "../../cli/_shared.ts";
import { CSV_HEADERS, csvHeader } from "../../lib/analysis/csv_headers.ts";

/** The cell mapping of the CLI's CSV contract: blank for missing, true/false, JSON for objects. */
const cell = (v: unknown) =>
  v === undefined || v === null
    ? ""
    : typeof v === "boolean"
    ? (v ? "true" : "false")
    : typeof v === "object"
    ? JSON.stringify(v)
    : v;

/** Reference: csv-stringify (npm) with its defaults, as toCsv was first written. */
const reference = (rows: Record<string, unknown>[], keys: string[]) =>
  stringify(rows.map((r) => keys.map((k) => cell(r[k]))), {
    header: true,
    columns: keys.map(csvHeader),
  });

describe("toCsv", () => {
  const keys = [...Object.keys(CSV_HEADERS).slice(0, 6), "someExtraColumn"];
  const value = fc.oneof(
    fc.string(),
    fc.constantFrom("a,b", 'say "x"', "two\nlines", "cr\rlf", "", " lead", "1,5"),
    fc.double(),
    fc.integer(),
    fc.boolean(),
    fc.constant(null),
    fc.constant(undefined),
    fc.record({ L: fc.double(), note: fc.string() }),
    fc.array(fc.integer(), { maxLength: 3 }),
  );
  it("writes the same text as csv-stringify for any cells (quotes, commas, line breaks)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.dictionary(fc.constantFrom(...keys), value), { maxLength: 8 }),
        (rows) => {
          expect(toCsv(rows, keys)).toBe(reference(rows, keys));
        },
      ),
      { numRuns: 300 },
    );
  });
  it("writes only the header line for no rows, as csv-stringify does", () => {
    expect(toCsv([], keys)).toBe(reference([], keys));
  });
});

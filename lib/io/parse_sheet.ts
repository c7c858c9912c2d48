/**
 * Reads a small CSV sheet (sample sheet, standards table) into rows of trimmed cells, with a
 * BOM, blank lines, `#` comment lines and ragged rows allowed (csv-parse underneath). The
 * separator is judged from the first line: a comma, or the semicolon or tab that spreadsheets
 * set to decimal-comma locales write.
 *
 * @module
 */
// A full specifier: a program outside this repository that imports lib/mod.ts by path resolves it
// without our deno.json (the import map applies only inside the project).
// deno-lint-ignore no-import-prefix
import { parse } from "npm:csv-parse@^5.6.0/sync";

/**
 * Rows of cells of a CSV sheet.
 *
 * @throws {Error} csv-parse's error for text that is not CSV (callers wrap it with the file).
 */
export function parseSheet(text: string): string[][] {
  return parse(text, {
    delimiter: sheetDelimiter(text),
    bom: true,
    trim: true,
    skip_empty_lines: true,
    relax_column_count: true,
    comment: "#",
    comment_no_infix: true,
  });
}

/** The separator of a sheet: the one of `,`, `;`, tab found most often outside quotes in its first line. */
export function sheetDelimiter(text: string): string {
  const first =
    text.replace(/^\uFEFF/, "").split(/\r?\n/).find((l) => l.trim() && !/^\s*#/.test(l)) ??
      "";
  const unquoted = first.replace(/"[^"]*"/g, "");
  const count = (c: string) => unquoted.split(c).length - 1;
  const [best] = [",", ";", "\t"].map((c) => [c, count(c)] as const).sort((a, b) => b[1] - a[1]);
  return best && best[1] > 0 ? best[0] : ",";
}

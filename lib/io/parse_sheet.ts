/**
 * Reads a small CSV sheet (sample sheet, standards table) into rows of trimmed cells, with a
 * BOM, blank lines, `#` comment lines and ragged rows allowed (csv-parse underneath).
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
    bom: true,
    trim: true,
    skip_empty_lines: true,
    relax_column_count: true,
    comment: "#",
    comment_no_infix: true,
  });
}

/**
 * Reads the spectra of a delimited ASCII export a stretch of rows at a time from an indexed
 * {@linkcode SourceText}, never holding the file or its table: the x column first (the grid),
 * then the values of every spectrum, stretch after stretch, with the same validation and the
 * same numbers as reading it whole (`readSpectraFromBytes`).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import type { SourceText } from "./byte_source.ts";
import { readTextTable } from "./read_table.ts";
import { resolveReadLimits } from "./read_limits.ts";
import { type ReadOptions, type TableSpectra, tableSpectra } from "./spectra_from_table.ts";

/** Where the spectra read a stretch at a time go. */
export interface SpectraStretches {
  /**
   * Called once, before any values, with the spectra of the file without their values (their
   * grid, quantity, thickness and metadata).
   */
  begin(spectra: readonly Spectrum[]): void;
  /**
   * The values of spectrum `s` (0-based) at grid points `from … from + values.length − 1`;
   * `values` is reused for the next call.
   */
  stretch(s: number, values: Float64Array<ArrayBuffer>, from: number): void;
}

/** Values held per stretch, all columns together (our choice: 2²⁰ values, 8 MB). */
const STRETCH_VALUES = 1 << 20;

const NO_VALUES = new Float64Array(0);

/**
 * Reads an export's spectra a stretch of rows at a time and hands them to `to`.
 *
 * @param stretchValues Values held per stretch, all columns together (at least one row).
 * @returns The spectra without their values (with their notes, e.g. values clipped), or
 *   undefined when the file is not read this way: not a plain ASCII table (BOM, lone CR, control
 *   bytes, JCAMP-DX), a descending x column, or the general table reader asked for. Such a file,
 *   and any file that throws here, reads whole with `readSpectraFromBytes`, which then says
 *   exactly what is wrong and where.
 */
export function streamSpectra(
  text: SourceText,
  file: string,
  options: ReadOptions,
  to: SpectraStretches,
  stretchValues = STRETCH_VALUES,
): Spectrum[] | undefined {
  const { scan, head } = text;
  if (
    options.tableReader === "general" || text.source.size === 0 || scan.loneCr || scan.nul ||
    scan.control > 0 || !text.visible ||
    /^\s*##TITLE\s*=/im.test(new TextDecoder().decode(head))
  ) {
    return undefined;
  }
  let layout: TableSpectra | undefined;
  let count = 0;
  let clipped: number[] = [];
  let values = NO_VALUES;
  let descending = false;
  const limits = resolveReadLimits(options.limits);
  readTextTable(text, file, {
    limits,
    stream: {
      begin(table, width) {
        layout = tableSpectra(table, file, options, width);
        descending = layout.descending;
        if (descending) return false; // its values run against the grid: read whole
        count = width - 1;
        clipped = new Array(count).fill(0);
        const shells: Spectrum[] = [];
        for (let c = 1; c < width; c++) shells.push(layout.withValues(c, NO_VALUES, 0));
        to.begin(shells);
        const rows = Math.max(1, Math.floor(stretchValues / width));
        values = new Float64Array(Math.min(rows, table.columns[0]!.length));
        return rows;
      },
      stretch(columns, n, from) {
        const out = values.subarray(0, n);
        for (let c = 1; c <= count; c++) {
          clipped[c - 1]! += layout!.values(c, columns[c]!, from, n, out);
          to.stretch(c - 1, out, from);
        }
      },
    },
  });
  if (descending || !layout) return undefined;
  const spectra: Spectrum[] = [];
  for (let c = 1; c <= count; c++) spectra.push(layout.withValues(c, NO_VALUES, clipped[c - 1]!));
  layout.finish();
  return spectra;
}

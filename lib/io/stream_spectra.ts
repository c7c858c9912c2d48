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
import { looksLikeJcamp } from "./read_spectra.ts";
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
   * The values of every spectrum at grid points `from … from + points − 1`, spectrum after
   * spectrum: spectrum s (0-based) at `values[s · points … (s + 1) · points − 1]`. `values` is
   * reused for the next call.
   */
  stretch(values: Float64Array<ArrayBuffer>, points: number, from: number): void;
}

/** Values held per stretch, all columns together (our choice: 2¹⁷ values, 1 MB per buffer). */
const STRETCH_VALUES = 1 << 17;

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
    looksLikeJcamp(new TextDecoder().decode(head))
  ) {
    return undefined;
  }
  let layout: TableSpectra | undefined;
  let count = 0;
  let clipped: number[] = [];
  let values = NO_VALUES;
  const shells: Spectrum[] = [];
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
        for (let c = 1; c < width; c++) shells.push(layout.withValues(c, NO_VALUES, 0));
        to.begin(shells);
        const rows = Math.max(1, Math.floor(stretchValues / width));
        values = new Float64Array(count * Math.min(rows, table.columns[0]!.length));
        return rows;
      },
      stretch(columns, n, from) {
        for (let c = 1; c <= count; c++) {
          clipped[c - 1]! += layout!.values(c, columns[c]!, from, n, values, (c - 1) * n);
        }
        to.stretch(values.subarray(0, count * n), n, from);
      },
    },
  });
  if (descending || !layout) return undefined;
  // the spectra given to `begin`, but with the note of values clipped where some were
  const spectra = shells.map((s, k) =>
    clipped[k] ? layout!.withValues(k + 1, NO_VALUES, clipped[k]!) : s
  );
  layout.finish();
  return spectra;
}

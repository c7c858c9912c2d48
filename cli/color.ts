/**
 * `crystint color`: CIE colour of each spectrum under each illuminant and observer.
 *
 * @module
 */
import type { ColorRow } from "../lib/cie/spectrum_color.ts";
import {
  conditionsOf,
  spectraColorRows,
  type SpectraXyz,
  spectraXyzRows,
  XyzSums,
} from "../lib/cie/spectra_color_many.ts";
import {
  floorMatters,
  pathTransmittanceIsValues,
  type ReflectionSettings,
  transmittanceForPath,
} from "../lib/optics/path_transmittance.ts";
import type { Spectrum } from "../lib/spectrum/spectrum.ts";
import { openInputSource } from "../lib/io/read_file.ts";
import { indexSourceLines } from "../lib/io/byte_source.ts";
import { streamSpectra } from "../lib/io/stream_spectra.ts";
import type { ReadOptions } from "../lib/io/read_spectra.ts";
import type { CommandSpec } from "./_command.ts";
import { MARKS } from "../lib/report/marks.ts";
import {
  CsvStdout,
  EXIT,
  listOption,
  log,
  outputFormat,
  positiveNumber,
  round,
  toTable,
  UsageError,
} from "./_shared.ts";
import {
  ALPHA_NOTE,
  DEFAULT_OBSERVER,
  illuminantOption,
  OBSERVER_NOTE,
  observerOption,
  OPTICS_OPTIONS,
  OUTPUT_OPTIONS,
  READING_OPTIONS,
} from "./_options.ts";
import {
  type AlphaBase,
  checkObservers,
  forEachFile,
  naturalAlpha,
  reflectionFrom,
  resolveIlluminants,
  type StreamedFile,
  surfaceLossNote,
} from "./_spectrum_options.ts";
import {
  COLOR_UNCERTAINTY_COLUMNS,
  normaliseUncertaintyArgs,
  UNCERTAINTY_OPTIONS,
  uncertaintyFromArgs,
  withColorUncertainty,
} from "./_uncertainty_options.ts";

/** The contract keys of a colour row (shared/DESIGN.md), in output order. */
export const COLOR_KEYS = [
  "sample",
  "file",
  "illuminant",
  "observer",
  "pathMm",
  "X",
  "Y",
  "Z",
  "x",
  "y",
  "L",
  "a",
  "b",
  "C",
  "h",
];
/** Further keys of a colour row, after the contract keys. */
export const COLOR_EXTRA_KEYS = [
  "uPrime",
  "vPrime",
  "dominantNm",
  "complementary",
  "purity",
  "srgb",
  "srgbOutOfGamut",
  "p3",
  "p3OutOfGamut",
  "method",
  "extrapolated",
];

/** Spectra coloured and written at a time with --csv (our choice: a few MB of rows at most). */
const SLICE = 1000;

/**
 * Most lines of a file coloured a stretch of rows at a time (our choice): the route pays where
 * a table is wide (many spectra side by side); a long narrow file reads whole as before.
 */
const STREAM_MAX_LINES = 65_536;

/** Uncertainty columns the terminal table shows. */
const SHOWN_SD = ["LSd", "aSd", "bSd"];

/** The command table of `crystint color`. */
export const COLOR_COMMAND: CommandSpec = {
  name: "color",
  summary: "CIE colour (XYZ, xy, L*a*b*, LCh, swatches) of spectra under chosen illuminants",
  usage: ["FILE… [options]"],
  positionals: "FILE… spectrum exports (CSV/TSV/text tables or JCAMP-DX).",
  options: [
    ...READING_OPTIONS,
    ...OPTICS_OPTIONS,
    illuminantOption("D65,A"),
    observerOption(),
    ...UNCERTAINTY_OPTIONS,
    ...OUTPUT_OPTIONS,
  ],
  prepareArgs: normaliseUncertaintyArgs,
  notes: [
    "Each row: sample, file, illuminant, observer, pathMm, X, Y, Z, x, y, L, a, b, C, h " +
    "(L*a*b* relative to the white of the illuminant used; h in degrees), then u′v′, dominant " +
    "wavelength and purity, sRGB / Display P3 swatches with out-of-gamut flags. With " +
    "--uncertainty also LSd, aSd, bSd, CSd, hSd (standard uncertainties, k = 1) and, in --json, " +
    "labCovariance (3×3) and the sources used.",
    OBSERVER_NOTE,
    ALPHA_NOTE,
    "Exit codes: 0 all files done, 1 usage error, 2 some files failed.",
  ],
  examples: ["stones/ruby-03.csv --thickness 2 --path 6 --illuminant D65,A --json"],
  async run(args) {
    if (args.positionals.length === 0) {
      throw new UsageError("No input files: give one or more spectrum files");
    }
    const format = outputFormat(args.flag("json"), args.flag("csv"));
    const reflection = reflectionFrom(args);
    const pathMm = positiveNumber(args.string("path"), "path");
    const observers = checkObservers(listOption(args.string("observer"), [DEFAULT_OBSERVER]));
    const illuminants = await resolveIlluminants(
      listOption(args.string("illuminant"), ["D65", "A"]),
    );
    const note = surfaceLossNote(reflection, args);
    const uncertainty = uncertaintyFromArgs(args);
    const rows: ColorRow[] = [];
    const csvKeys = [
      ...COLOR_KEYS,
      ...COLOR_EXTRA_KEYS,
      ...(uncertainty ? COLOR_UNCERTAINTY_COLUMNS : []),
    ];
    // CSV is written as the rows are made, a slice of spectra at a time (flat memory)
    const csv = format === "csv" ? new CsvStdout(csvKeys) : undefined;
    // the header goes out at once, before any note on stderr, as every row is flushed before the
    // notes that follow it
    csv?.header();
    csv?.flush();
    const conditions = conditionsOf(illuminants, observers);
    const m = conditions.length;
    const emit = (sliceRows: ColorRow[]) => {
      if (csv) csv.rows(sliceRows);
      else for (const r of sliceRows) rows.push(r);
    };
    const streamed = uncertainty
      ? undefined
      : (file: string, read: ReadOptions, base: AlphaBase) =>
        colorStreamed(file, read, base, conditions, pathMm, reflection);
    const failed = await forEachFile(args.positionals, args, (spectra, file, sums) => {
      for (const s of spectra) note(s, pathMm);
      const options = {
        illuminants,
        observers,
        reflection,
        ...(pathMm === undefined ? {} : { pathMm }),
      };
      if (sums) {
        // a table coloured a stretch of rows at a time: one grid, one path, one file
        const first = spectra[0]!;
        const labels = {
          samples: spectra.map((s) => s.meta.sample),
          pathMm: pathMm ?? first.thicknessMm ?? null,
          file,
        };
        // a spectrum at a time: its rows die as soon as they are written
        for (let from = 0; from < spectra.length; from++) {
          emit(spectraXyzRows(sums, labels, from, from + 1));
        }
      } else {
        for (let from = 0; from < spectra.length; from += SLICE) {
          const slice = spectra.slice(from, from + SLICE);
          const plain = fileColorRows(slice, conditions, pathMm, reflection);
          emit(
            uncertainty
              ? slice.flatMap((s, k) =>
                withColorUncertainty(plain.slice(k * m, k * m + m), s, uncertainty, options, file)
              )
              : plain,
          );
        }
      }
      csv?.flush();
      const s = spectra[0]!;
      const lo = s.wavelengthNm[0]!, hi = s.wavelengthNm[s.wavelengthNm.length - 1]!;
      if (lo > 380 || hi < 780) {
        log(
          `crystint: ${file}: data cover ${lo}–${hi} nm only; ends extended by constant values (CIE 15)`,
        );
      }
    }, streamed);
    csv?.flush();
    const records = rows as unknown as Record<string, unknown>[];
    if (format === "json") console.log(JSON.stringify(rows, null, 2));
    else if (format === "table") {
      const shown = records.map((r) => {
        const o: Record<string, unknown> = {};
        for (const c of [...COLOR_KEYS, "srgb", ...SHOWN_SD]) {
          o[c] = round(r[c], ["x", "y"].includes(c) || SHOWN_SD.includes(c) ? 4 : 2);
        }
        if (r["srgbOutOfGamut"]) o["srgb"] = `${o["srgb"]} ${MARKS.outOfGamut.symbol}`;
        return o;
      });
      const sd = uncertainty ? SHOWN_SD : [];
      console.log(toTable(shown, [...COLOR_KEYS.filter((c) => c !== "file"), "srgb", ...sd]));
      if (records.some((r) => r["srgbOutOfGamut"])) {
        console.log(`${MARKS.outOfGamut.symbol} ${MARKS.outOfGamut.text}`);
      }
    }
    return failed > 0 ? EXIT.someFailed : EXIT.ok;
  },
};

/**
 * The colour rows of a file's spectra, spectrum after spectrum and condition after condition
 * (the rows `spectrumColor` gives each spectrum): spectra on one grid at one path go through one
 * pass for all conditions (`spectraColorRows`).
 */
export function fileColorRows(
  spectra: Spectrum[],
  conditions: ReturnType<typeof conditionsOf>,
  pathMm: number | undefined,
  reflection: Parameters<typeof transmittanceForPath>[2],
): ColorRow[] {
  const rows: ColorRow[] = [];
  for (let from = 0; from < spectra.length;) {
    const first = spectra[from]!;
    const path = pathMm ?? first.thicknessMm ?? null;
    let to = from + 1;
    while (
      to < spectra.length && sameGrid(spectra[to]!.wavelengthNm, first.wavelengthNm) &&
      (pathMm ?? spectra[to]!.thicknessMm ?? null) === path &&
      spectra[to]!.meta.sourceFile === first.meta.sourceFile
    ) to++;
    const run = spectra.slice(from, to);
    const values = run.map((s) => transmittanceForPath(s, pathMm, reflection).values);
    const labels = { samples: run.map((s) => s.meta.sample), pathMm: path };
    const runRows = spectraColorRows(
      { wavelengthNm: first.wavelengthNm, values },
      conditions,
      first.meta.sourceFile === undefined ? labels : { ...labels, file: first.meta.sourceFile },
    );
    for (const r of runRows) rows.push(r);
    from = to;
  }
  return rows;
}

/**
 * A file's colour sums, its table read a stretch of rows at a time (`streamSpectra`) so neither
 * the file nor its table is ever held: the same spectra (without values) and the same XYZ as
 * reading it whole and colouring it with {@linkcode fileColorRows}. Undefined when the file is
 * not read that way or anything goes wrong: the caller then reads it whole, which says exactly
 * what is wrong and where. A slab rescaled to a shorter path (whose photometric-floor note looks
 * at all values) and PCHIP grids are read whole too.
 */
export async function colorStreamed(
  file: string,
  options: ReadOptions,
  base: AlphaBase,
  conditions: ReturnType<typeof conditionsOf>,
  pathMm: number | undefined,
  reflection: ReflectionSettings,
): Promise<StreamedFile<SpectraXyz> | undefined> {
  let source;
  try {
    source = await openInputSource(file, options.limits);
  } catch {
    return undefined;
  }
  try {
    const text = indexSourceLines(source, STREAM_MAX_LINES);
    if (!text) return undefined;
    let read: readonly Spectrum[] = [], shells: Spectrum[] = [];
    let sums: XyzSums | undefined;
    // runs of spectra that take the path alike: one transmittance call per run and stretch
    let runs: number[] = [];
    let grid = new Float64Array(0);
    let asRead = false;
    const spectra = streamSpectra(text, file, options, {
      begin(given) {
        read = given;
        shells = given.map((s) => naturalAlpha(s, base));
        if (shells.some((s) => floorMatters(s, pathMm))) throw new Error("read whole");
        sums = new XyzSums(shells[0]!.wavelengthNm, conditions, shells.length);
        runs = [0];
        for (let s = 1; s < shells.length; s++) {
          const a = shells[s - 1]!, b = shells[s]!;
          if (
            a.quantity !== b.quantity || a.thicknessMm !== b.thicknessMm ||
            a.polarisation !== b.polarisation
          ) runs.push(s);
        }
        runs.push(shells.length);
        // transmittance as read: the values go to the sums as they are (no copy per stretch)
        asRead = shells.every((s) => pathTransmittanceIsValues(s, pathMm, reflection));
      },
      stretch(values, n, from) {
        if (asRead) return sums!.addMany(0, values, n, from);
        // the grid points of the stretch, once per spectrum, beside the values
        const nm = shells[0]!.wavelengthNm;
        if (grid.length < values.length) grid = new Float64Array(values.length);
        for (let s = 0, at = 0; s < shells.length; s++) {
          for (let k = 0; k < n; k++) grid[at++] = nm[from + k]!;
        }
        for (let r = 0; r + 1 < runs.length; r++) {
          const a = runs[r]!, b = runs[r + 1]!;
          // every step from values to transmittance is point by point, so a run's stretches
          // side by side give each point what the spectrum read whole gives it
          const part = naturalAlpha({
            ...read[a]!,
            wavelengthNm: grid.subarray(a * n, b * n),
            values: values.subarray(a * n, b * n),
          }, base);
          const t = transmittanceForPath(part, pathMm, reflection).values;
          sums!.addMany(a, t, n, from);
        }
      },
    });
    if (!spectra || !sums) return undefined;
    // the spectra `begin` was given, where no value was clipped
    const kept = spectra.map((s, k) => s === read[k] ? shells[k]! : naturalAlpha(s, base));
    return { spectra: kept, result: sums.result() };
  } catch {
    return undefined;
  } finally {
    source.close();
  }
}

/** Whether two wavelength grids are the same array or hold the same values. */
function sameGrid(a: Float64Array, b: Float64Array): boolean {
  if (a === b) return true;
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

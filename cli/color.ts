/**
 * `crystint color`: CIE colour of each spectrum under each illuminant and observer.
 *
 * @module
 */
import { readSpectrumFile } from "../lib/io/read_file.ts";
import { axisFromText, ordinateFromText } from "../lib/io/header_units.ts";
import type { ReadOptions } from "../lib/io/read_spectra.ts";
import { customIlluminant, getIlluminant, type Illuminant } from "../lib/cie/illuminants.ts";
import { getObserver } from "../lib/cie/observers.ts";
import { type ColourRow, spectrumColour } from "../lib/cie/spectrum_colour.ts";
import {
  EXIT,
  listOption,
  log,
  parseCommandArgs,
  positiveNumber,
  reportFailure,
  round,
  toCsv,
  toTable,
  UsageError,
} from "./_shared.ts";

export const COLOR_HELP = `crystint color — CIE colour of measured spectra

Usage:
  crystint color FILE… [options]

Options:
  --ordinate KIND     what the values are: transmittance | percent | absorbance | alpha
                      (default: read from the header or preamble)
  --axis UNIT         x axis unit: nm | um | cm-1 | ev (default: read from the header)
  --thickness MM      thickness of the measured slab, mm (overrides the file's metadata)
  --path MM           path length to compute the colour for, mm (Beer–Lambert rescaling)
  --illuminant LIST   comma list: A, C, D50, D55, D65, D75, E, F1…F12, D<cct>K, or an SPD
                      file (default: D65,A)
  --observer LIST     2 (CIE 1931) and/or 10 (CIE 1964) (default: 2)
  --json              print a JSON array of rows on stdout
  --csv               print CSV with a header row on stdout
  -h, --help          show this help

Each row: sample, file, illuminant, observer, pathMm, X, Y, Z, x, y, L, a, b, C, h
(L*a*b* relative to the white of the illuminant used; h in degrees).
Exit codes: 0 all files done, 1 usage error, 2 some files failed.

Example:
  crystint color stones/ruby-03.csv --thickness 2 --path 6 --illuminant D65,A --json
`;

const COLUMNS = [
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

/** Reading options shared by the commands that take spectrum files. */
export function readOptionsFrom(
  values: { ordinate?: string; axis?: string; thickness?: string },
): ReadOptions {
  const options: ReadOptions = {};
  if (values.ordinate !== undefined) {
    const kind = ordinateFromText(values.ordinate);
    if (!kind) {
      throw new UsageError(
        `Unknown --ordinate "${values.ordinate}": use transmittance, percent, absorbance or alpha`,
      );
    }
    options.ordinate = kind;
  }
  if (values.axis !== undefined) {
    const axis = axisFromText(values.axis);
    if (!axis) throw new UsageError(`Unknown --axis "${values.axis}": use nm, um, cm-1 or ev`);
    options.axis = axis;
  }
  const thickness = positiveNumber(values.thickness, "thickness");
  if (thickness !== undefined) options.thicknessMm = thickness;
  return options;
}

/** Resolves illuminant names or SPD files. */
export async function resolveIlluminants(names: string[]): Promise<Illuminant[]> {
  const out: Illuminant[] = [];
  for (const name of names) {
    if (/[\\/]|\.(csv|txt|tsv|dat|spd|jdx)$/i.test(name)) {
      // An SPD is relative power, not a transmittance: read the raw values without the 0..1
      // checks (the absorbance reading applies none) and use them as they are.
      const [spd] = await readSpectrumFile(name, { ordinate: "absorbance" }).catch((e) => {
        throw new UsageError(`Cannot read illuminant SPD: ${(e as Error).message}`);
      });
      out.push(customIlluminant(name, spd!.wavelengthNm, spd!.values));
      continue;
    }
    try {
      out.push(getIlluminant(name));
    } catch (e) {
      throw new UsageError((e as Error).message);
    }
  }
  return out;
}

/** Runs the command; returns the exit code. */
export async function colorCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    ordinate: { type: "string" },
    axis: { type: "string" },
    thickness: { type: "string" },
    path: { type: "string" },
    illuminant: { type: "string" },
    observer: { type: "string" },
    json: { type: "boolean" },
    csv: { type: "boolean" },
    help: { type: "boolean", short: "h" },
  });
  if (values.help) {
    console.log(COLOR_HELP);
    return EXIT.ok;
  }
  if (positionals.length === 0) {
    throw new UsageError("No input files: give one or more spectrum files");
  }
  if (values.json && values.csv) throw new UsageError("Give only one of --json and --csv");
  const readOptions = readOptionsFrom(values);
  const pathMm = positiveNumber(values.path, "path");
  const observers = listOption(values.observer, ["2"]);
  for (const o of observers) {
    try {
      getObserver(o);
    } catch (e) {
      throw new UsageError((e as Error).message);
    }
  }
  const illuminants = await resolveIlluminants(listOption(values.illuminant, ["D65", "A"]));
  const rows: ColourRow[] = [];
  let failed = 0;
  for (const file of positionals) {
    try {
      const spectra = await readSpectrumFile(file, readOptions);
      const fileRows: ColourRow[] = [];
      for (const s of spectra) {
        for (const w of s.meta.warnings ?? []) log(`crystint: ${file}: ${s.meta.sample}: ${w}`);
        const opts = pathMm === undefined
          ? { illuminants, observers }
          : { illuminants, observers, pathMm };
        fileRows.push(...spectrumColour(s, opts));
      }
      if (fileRows.some((r) => r.extrapolated)) {
        const s = spectra[0]!;
        const lo = s.wavelengthNm[0]!, hi = s.wavelengthNm[s.wavelengthNm.length - 1]!;
        if (lo > 380 || hi < 780) {
          log(
            `crystint: ${file}: data cover ${lo}–${hi} nm only; ends extended by constant values (CIE 15)`,
          );
        }
      }
      rows.push(...fileRows);
    } catch (e) {
      failed++;
      reportFailure(e, file);
    }
  }
  if (values.json) {
    console.log(JSON.stringify(rows, null, 2));
  } else if (values.csv) {
    const all = [...COLUMNS, "uPrime", "vPrime", "method", "extrapolated"];
    Deno.stdout.writeSync(
      new TextEncoder().encode(toCsv(rows as unknown as Record<string, unknown>[], all)),
    );
  } else {
    const shown = rows.map((r) => {
      const o: Record<string, unknown> = {};
      for (const c of COLUMNS) {
        o[c] = round((r as unknown as Record<string, unknown>)[c], ["x", "y"].includes(c) ? 4 : 2);
      }
      return o;
    });
    console.log(toTable(shown, COLUMNS.filter((c) => c !== "file")));
  }
  if (failed > 0) log(`crystint: ${failed} of ${positionals.length} file(s) failed`);
  return failed > 0 ? EXIT.someFailed : EXIT.ok;
}

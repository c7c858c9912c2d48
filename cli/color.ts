/**
 * `crystint color`: CIE colour of each spectrum under each illuminant and observer.
 *
 * @module
 */
import { type ColourRow, spectrumColour } from "../lib/cie/spectrum_colour.ts";
import {
  EXIT,
  listOption,
  log,
  parseCommandArgs,
  positiveNumber,
  round,
  toCsv,
  toTable,
  UsageError,
} from "./_shared.ts";
import {
  checkObservers,
  forEachFile,
  readOptionsFrom,
  reflectionFrom,
  resolveIlluminants,
  SPECTRUM_OPTIONS,
  SPECTRUM_OPTIONS_HELP,
} from "./_spectrum_options.ts";
import {
  COLOR_UNCERTAINTY_COLUMNS,
  normaliseUncertaintyArgs,
  UNCERTAINTY_OPTIONS,
  UNCERTAINTY_OPTIONS_HELP,
  uncertaintyFrom,
  withColorUncertainty,
} from "./_uncertainty_options.ts";

export const COLOR_HELP = `crystint color — CIE colour of measured spectra

Usage:
  crystint color FILE… [options]

Options:
${SPECTRUM_OPTIONS_HELP}
  --illuminant LIST   comma list: A, C, D50, D55, D65, D75, E, F1…F12, LED-B1…LED-V2,
                      D<cct>K, or an SPD
                      file (default: D65,A)
  --observer LIST     2 (CIE 1931) and/or 10 (CIE 1964) (default: 2)
${UNCERTAINTY_OPTIONS_HELP}
  -h, --help          show this help

Each row: sample, file, illuminant, observer, pathMm, X, Y, Z, x, y, L, a, b, C, h
(L*a*b* relative to the white of the illuminant used; h in degrees), then u′v′, dominant
wavelength and purity, sRGB / Display P3 swatches with out-of-gamut flags. With
--uncertainty also LSd, aSd, bSd, CSd, hSd (standard uncertainties, k = 1) and, in --json,
labCovariance (3×3) and the sources used.
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
const EXTRA = [
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

const SHOWN_SD = ["LSd", "aSd", "bSd"];

/** Runs the command; returns the exit code. */
export async function colorCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(normaliseUncertaintyArgs(args), {
    ...SPECTRUM_OPTIONS,
    ...UNCERTAINTY_OPTIONS,
    illuminant: { type: "string" },
    observer: { type: "string" },
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
  const reflection = reflectionFrom(values);
  const pathMm = positiveNumber(values.path, "path");
  const observers = checkObservers(listOption(values.observer, ["2"]));
  const illuminants = await resolveIlluminants(listOption(values.illuminant, ["D65", "A"]));
  const uncertainty = uncertaintyFrom(values);
  const rows: ColourRow[] = [];
  const failed = await forEachFile(positionals, readOptions, (spectra, file) => {
    const options = {
      illuminants,
      observers,
      reflection,
      ...(pathMm === undefined ? {} : { pathMm }),
    };
    const fileRows = spectra.flatMap((s) => {
      const plain = spectrumColour(s, options);
      return uncertainty ? withColorUncertainty(plain, s, uncertainty, options, file) : plain;
    });
    const s = spectra[0]!;
    const lo = s.wavelengthNm[0]!, hi = s.wavelengthNm[s.wavelengthNm.length - 1]!;
    if (lo > 380 || hi < 780) {
      log(
        `crystint: ${file}: data cover ${lo}–${hi} nm only; ends extended by constant values (CIE 15)`,
      );
    }
    rows.push(...fileRows);
  });
  const records = rows as unknown as Record<string, unknown>[];
  if (values.json) {
    console.log(JSON.stringify(rows, null, 2));
  } else if (values.csv) {
    Deno.stdout.writeSync(new TextEncoder().encode(toCsv(records, [
      ...COLUMNS,
      ...EXTRA,
      ...(uncertainty ? COLOR_UNCERTAINTY_COLUMNS : []),
    ])));
  } else {
    const shown = records.map((r) => {
      const o: Record<string, unknown> = {};
      for (const c of [...COLUMNS, "srgb", ...SHOWN_SD]) {
        o[c] = round(r[c], ["x", "y"].includes(c) || SHOWN_SD.includes(c) ? 4 : 2);
      }
      if (r["srgbOutOfGamut"]) o["srgb"] = `${o["srgb"]}*`;
      return o;
    });
    const sd = uncertainty ? SHOWN_SD : [];
    console.log(toTable(shown, [...COLUMNS.filter((c) => c !== "file"), "srgb", ...sd]));
    if (records.some((r) => r["srgbOutOfGamut"])) {
      log("* outside the sRGB gamut: the swatch is chroma-reduced");
    }
  }
  return failed > 0 ? EXIT.someFailed : EXIT.ok;
}

/**
 * `crystint pleochroism`: colours of an o/e pair, the unpolarised colour, and ΔE00 between them.
 *
 * @module
 */
import type { Spectrum } from "../lib/spectrum/spectrum.ts";
import { resampleLinear } from "../lib/spectrum/linear_resample.ts";
import {
  type ReflectionSettings,
  transmittanceForPath,
  unpolarisedTransmittance,
} from "../lib/optics/path_transmittance.ts";
import { spectrumColor } from "../lib/cie/spectrum_color.ts";
import { deltaE2000 } from "../lib/cie/delta_e.ts";
import type { CommandSpec } from "./_command.ts";
import {
  EXIT,
  listOption,
  log,
  outputFormat,
  positiveNumber,
  round,
  toCsv,
  toTable,
  UsageError,
  withFlagHint,
  writeStdout,
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
  checkObservers,
  readWithOptions,
  reflectionFrom,
  resolveIlluminants,
  surfaceLossNote,
} from "./_spectrum_options.ts";
import type { ParsedArgs } from "./_command.ts";

/** Transmittance at the path, with a missing thickness reported as a usage error. */
export function transmittanceOrUsage(
  s: Spectrum,
  pathMm: number | undefined,
  reflection: ReflectionSettings,
): Float64Array<ArrayBuffer> {
  try {
    return transmittanceForPath(s, pathMm, reflection).values;
  } catch (e) {
    throw new UsageError(`${s.meta.sourceFile ?? s.meta.sample}: ${withFlagHint(e)}`);
  }
}

/** The first spectrum of each of two files, or the first two of one file. */
export async function readPair(args: ParsedArgs): Promise<[Spectrum, Spectrum]> {
  const files = args.positionals;
  try {
    if (files.length === 2) {
      const [a] = await readWithOptions(files[0]!, args);
      const [b] = await readWithOptions(files[1]!, args);
      return [a!, b!];
    }
    const spectra = await readWithOptions(files[0]!, args);
    if (spectra.length < 2) {
      throw new Error("the file holds one spectrum; give the two files");
    }
    return [spectra[0]!, spectra[1]!];
  } catch (e) {
    throw new UsageError(withFlagHint(e));
  }
}

/**
 * Checks the polarisation the files state against the order they were given in (o first,
 * e second); a contradiction is refused unless `force`, then only warned about.
 */
function checkOrder(o: Spectrum, e: Spectrum, force: boolean): void {
  const wrong = [
    ...(o.polarisation === "e"
      ? [`${o.meta.sourceFile ?? o.meta.sample} says polarisation e`]
      : []),
    ...(e.polarisation === "o"
      ? [`${e.meta.sourceFile ?? e.meta.sample} says polarisation o`]
      : []),
  ];
  if (wrong.length === 0) return;
  const what = `The o spectrum comes first and the e spectrum second, but ${wrong.join(" and ")}`;
  if (!force) {
    throw new UsageError(`${what}: swap them, or give --force-order to keep the order given`);
  }
  log(`crystint: ${what}; --force-order keeps the order given`);
}

const ROW_KEYS = [
  "sampleO",
  "sampleE",
  "illuminant",
  "observer",
  "pathMm",
  "Lo",
  "ao",
  "bo",
  "Co",
  "ho",
  "Le",
  "ae",
  "be",
  "Ce",
  "he",
  "Lu",
  "au",
  "bu",
  "Cu",
  "hu",
  "dE00oe",
  "srgbO",
  "srgbE",
  "srgbU",
];

/** The command table of `crystint pleochroism`. */
export const PLEOCHROISM_COMMAND: CommandSpec = {
  name: "pleochroism",
  summary: "colours of an o/e pair, unpolarised colour, ΔE00 between o and e",
  usage: [
    "O_FILE E_FILE [options]",
    "PAIR_FILE [options]      (a file with two spectra: o first, e second)",
  ],
  positionals: "O_FILE E_FILE: the ordinary (E⊥c) spectrum first, the extraordinary (E∥c) " +
    "second. When a file's preamble states its polarisation and it contradicts that order, the " +
    "command refuses unless --force-order.",
  options: [
    illuminantOption("D65,A"),
    observerOption(),
    {
      name: "force-order",
      type: "boolean",
      help: "use the argument order even when the files' polarisation says otherwise",
    },
    ...READING_OPTIONS,
    ...OPTICS_OPTIONS,
    ...OUTPUT_OPTIONS,
  ],
  notes: [
    "Each row: sampleO, sampleE, illuminant, observer, pathMm, L/a/b/C/h for o, e and " +
    "unpolarised light (Lo … hu), dE00oe (the pleochroism), and sRGB swatches. Unpolarised " +
    "light is the mean of the two transmittances.",
    OBSERVER_NOTE,
    ALPHA_NOTE,
  ],
  examples: ["slab_o.csv slab_e.csv --thickness 2 --path 6 --host corundum --json"],
  async run(args) {
    if (args.positionals.length < 1 || args.positionals.length > 2) {
      throw new UsageError("Give the o and e files, or one file with both");
    }
    const format = outputFormat(args.flag("json"), args.flag("csv"));
    const [readO, readE] = await readPair(args);
    checkOrder(readO, readE, args.flag("force-order"));
    const o: Spectrum = { ...readO, polarisation: "o" };
    const e: Spectrum = { ...readE, polarisation: "e" };
    const reflection = reflectionFrom(args);
    const pathMm = positiveNumber(args.string("path"), "path");
    const note = surfaceLossNote(reflection, args);
    note(o, pathMm);
    const tO = transmittanceOrUsage(o, pathMm, reflection);
    const tE = resampleLinear(
      e.wavelengthNm,
      transmittanceOrUsage(e, pathMm, reflection),
      o.wavelengthNm,
    );
    const tU = unpolarisedTransmittance(tO, tE);
    const illuminants = await resolveIlluminants(
      listOption(args.string("illuminant"), ["D65", "A"]),
    );
    const observers = checkObservers(listOption(args.string("observer"), [DEFAULT_OBSERVER]));
    const opts = { illuminants, observers };
    const rowsO = spectrumColor(o, { ...opts, transmittance: tO });
    const rowsE = spectrumColor({ ...o, meta: e.meta }, { ...opts, transmittance: tE });
    const rowsU = spectrumColor(o, { ...opts, transmittance: tU });
    const rows = rowsO.map((ro, i) => {
      const re = rowsE[i]!, ru = rowsU[i]!;
      return {
        sampleO: o.meta.sample,
        sampleE: e.meta.sample,
        illuminant: ro.illuminant,
        observer: ro.observer,
        pathMm: pathMm ?? o.thicknessMm ?? null,
        Lo: ro.L,
        ao: ro.a,
        bo: ro.b,
        Co: ro.C,
        ho: ro.h,
        Le: re.L,
        ae: re.a,
        be: re.b,
        Ce: re.C,
        he: re.h,
        Lu: ru.L,
        au: ru.a,
        bu: ru.b,
        Cu: ru.C,
        hu: ru.h,
        dE00oe: deltaE2000(ro, re),
        srgbO: ro.srgb,
        srgbE: re.srgb,
        srgbU: ru.srgb,
      };
    });
    if (format === "json") console.log(JSON.stringify(rows, null, 2));
    else if (format === "csv") writeStdout(toCsv(rows, ROW_KEYS));
    else {
      const shown = rows.map((r) =>
        Object.fromEntries(Object.entries(r).map(([k, v]) => [k, round(v, 2)]))
      );
      console.log(
        toTable(shown, [
          "illuminant",
          "observer",
          "Lo",
          "Co",
          "ho",
          "Le",
          "Ce",
          "he",
          "Lu",
          "Cu",
          "hu",
          "dE00oe",
          "srgbO",
          "srgbE",
        ]),
      );
    }
    return EXIT.ok;
  },
};

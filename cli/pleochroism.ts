/**
 * `crystint pleochroism`: colours of an o/e pair, the unpolarised colour, and ΔE00 between them.
 *
 * @module
 */
import { readSpectrumFile } from "../lib/io/read_file.ts";
import type { Spectrum } from "../lib/spectrum/spectrum.ts";
import { resampleLinear } from "../lib/spectrum/linear_resample.ts";
import {
  transmittanceForPath,
  unpolarisedTransmittance,
} from "../lib/optics/path_transmittance.ts";
import { spectrumColour } from "../lib/cie/spectrum_colour.ts";
import { deltaE2000 } from "../lib/cie/delta_e.ts";
import { metamerismIndex } from "../lib/cie/metamerism.ts";
import {
  EXIT,
  listOption,
  parseCommandArgs,
  positiveNumber,
  round,
  toTable,
  UsageError,
} from "./_shared.ts";
import {
  checkObservers,
  readOptionsFrom,
  reflectionFrom,
  resolveIlluminants,
  SPECTRUM_OPTIONS,
  SPECTRUM_OPTIONS_HELP,
} from "./_spectrum_options.ts";

export const PLEOCHROISM_HELP = `crystint pleochroism — colour along and across the optic axis

Usage:
  crystint pleochroism O_FILE E_FILE [options]
  crystint pleochroism PAIR_FILE [options]      (a file with two spectra: o first, e second)

Options:
  --illuminant LIST   default D65,A
  --observer 2|10     default 10
${SPECTRUM_OPTIONS_HELP}

Each row: illuminant, observer, pathMm, L/a/b for o, e and unpolarised light, dE00oe (the
pleochroism), and sRGB swatches. Unpolarised light is the mean of the two transmittances.

Example:
  crystint pleochroism slab_o.csv slab_e.csv --thickness 2 --path 6 --host corundum --json
`;

/** Transmittance at the path, with a missing thickness reported as a usage error. */
function atPath(
  s: Spectrum,
  pathMm: number | undefined,
  reflection: ReturnType<typeof reflectionFrom>,
) {
  try {
    return transmittanceForPath(s, pathMm, reflection).values;
  } catch (e) {
    throw new UsageError(`${s.meta.sourceFile ?? s.meta.sample}: ${(e as Error).message}`);
  }
}

async function pair(
  positionals: string[],
  read: ReturnType<typeof readOptionsFrom>,
): Promise<[Spectrum, Spectrum]> {
  try {
    if (positionals.length === 2) {
      const [o] = await readSpectrumFile(positionals[0]!, read);
      const [e] = await readSpectrumFile(positionals[1]!, read);
      return [{ ...o!, polarisation: "o" }, { ...e!, polarisation: "e" }];
    }
    const spectra = await readSpectrumFile(positionals[0]!, read);
    if (spectra.length < 2) throw new Error("the file holds one spectrum; give the o and e files");
    return [{ ...spectra[0]!, polarisation: "o" }, { ...spectra[1]!, polarisation: "e" }];
  } catch (e) {
    throw new UsageError((e as Error).message);
  }
}

/** Runs the command; returns the exit code. */
export async function pleochroismCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    ...SPECTRUM_OPTIONS,
    illuminant: { type: "string" },
    observer: { type: "string" },
  });
  if (values.help) {
    console.log(PLEOCHROISM_HELP);
    return EXIT.ok;
  }
  if (positionals.length < 1 || positionals.length > 2) {
    throw new UsageError("Give the o and e files, or one file with both");
  }
  const [o, e] = await pair(positionals, readOptionsFrom(values));
  const reflection = reflectionFrom(values);
  const pathMm = positiveNumber(values.path, "path");
  const tO = atPath(o, pathMm, reflection);
  const tE = resampleLinear(e.wavelengthNm, atPath(e, pathMm, reflection), o.wavelengthNm);
  const tU = unpolarisedTransmittance(tO, tE);
  const illuminants = await resolveIlluminants(listOption(values.illuminant, ["D65", "A"]));
  const observers = checkObservers(listOption(values.observer, ["10"]));
  const opts = { illuminants, observers };
  const rowsO = spectrumColour(o, { ...opts, transmittance: tO });
  const rowsE = spectrumColour({ ...o, meta: e.meta }, { ...opts, transmittance: tE });
  const rowsU = spectrumColour(o, { ...opts, transmittance: tU });
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
  if (values.json) console.log(JSON.stringify(rows, null, 2));
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
}

export const METAMERISM_HELP =
  `crystint metamerism — CIE special metamerism index for a change of illuminant

Usage:
  crystint metamerism FILE1 FILE2 [--reference D65] [--test A,F11] [--observer 10] [--json] [options]

The two specimens are first corrected (multiplicatively, CIE 15 §9.2.2) to match under the
reference illuminant; the index is their colour difference under each test illuminant, as
ΔE*ab (the CIE form) and ΔE00. mismatchReference says how close the uncorrected match was.

Example:
  crystint metamerism stone.csv imitation.csv --reference D65 --test A,F11 --json
`;

/** Runs the command; returns the exit code. */
export async function metamerismCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    ...SPECTRUM_OPTIONS,
    reference: { type: "string" },
    test: { type: "string" },
    observer: { type: "string" },
  });
  if (values.help) {
    console.log(METAMERISM_HELP);
    return EXIT.ok;
  }
  if (positionals.length !== 2) throw new UsageError("Give exactly two spectrum files");
  const [a, b] = await pair(positionals, readOptionsFrom(values));
  const reflection = reflectionFrom(values);
  const pathMm = positiveNumber(values.path, "path");
  const tA = atPath(a, pathMm, reflection);
  const tB = resampleLinear(b.wavelengthNm, atPath(b, pathMm, reflection), a.wavelengthNm);
  const [reference] = await resolveIlluminants([values.reference ?? "D65"]);
  const tests = listOption(values.test, ["A"]);
  await resolveIlluminants(tests);
  const [observer] = checkObservers([values.observer ?? "10"]);
  const rows = tests.map((t) => ({
    sample1: a.meta.sample,
    sample2: b.meta.sample,
    ...metamerismIndex(a.wavelengthNm, tA, tB, reference!.name, t, observer!),
  }));
  if (values.json) console.log(JSON.stringify(rows, null, 2));
  else {
    const shown = rows.map((r) =>
      Object.fromEntries(Object.entries(r).map(([k, v]) => [k, round(v, 3)]))
    );
    console.log(
      toTable(shown, [
        "sample1",
        "sample2",
        "reference",
        "test",
        "observer",
        "mismatchReference",
        "indexAb",
        "index00",
      ]),
    );
  }
  return EXIT.ok;
}

/**
 * `crystint change`: colour change of each spectrum between two illuminants.
 *
 * @module
 */
import { colourChange } from "../lib/cie/colour_change.ts";
import { transmittanceForPath } from "../lib/optics/path_transmittance.ts";
import {
  EXIT,
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
  changeUncertainty,
  normaliseUncertaintyArgs,
  UNCERTAINTY_OPTIONS,
  UNCERTAINTY_OPTIONS_HELP,
  uncertaintyFrom,
} from "./_uncertainty_options.ts";

export const CHANGE_HELP = `crystint change — colour change between two illuminants

Usage:
  crystint change FILE… [--from D65] [--to A] [--observer 2|10] [--adapt cat16|bradford] [options]

Options:
  --from NAME         first illuminant (default D65)
  --to NAME           second illuminant (default A)
  --observer 2|10     observer (default 2)
  --adapt METHOD      compare after adapting the second colour to the first white
                      (cat16 or bradford); default: each under its own white
${SPECTRUM_OPTIONS_HELP}
${UNCERTAINTY_OPTIONS_HELP}
  -h, --help          show this help

Each row: sample, file, from, to, observer, dE00, dEab, dL, dC, dh (dh signed, degrees,
wrapped to −180…180), then L1 a1 b1 C1 h1 under the first and L2 a2 b2 C2 h2 under the second.
With --uncertainty also dE00Sd (standard uncertainty of dE00, the two colours correlated).
Colour change is a measurement, not a grading: any threshold is a setting (common practice).

Example:
  crystint change lot/X01a.csv --from D65 --to A --observer 10 --json
`;

const COLUMNS = ["sample", "file", "from", "to", "observer", "dE00", "dEab", "dL", "dC", "dh"];
const EXTRA = ["L1", "a1", "b1", "C1", "h1", "L2", "a2", "b2", "C2", "h2", "adapt", "pathMm"];

const CHANGE_SD = ["dE00Sd", "uncertaintyMode", "noiseSd", "noiseSource"];

/** Runs the command; returns the exit code. */
export async function changeCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(normaliseUncertaintyArgs(args), {
    ...SPECTRUM_OPTIONS,
    ...UNCERTAINTY_OPTIONS,
    from: { type: "string" },
    to: { type: "string" },
    observer: { type: "string" },
    adapt: { type: "string" },
  });
  if (values.help) {
    console.log(CHANGE_HELP);
    return EXIT.ok;
  }
  if (positionals.length === 0) {
    throw new UsageError("No input files: give one or more spectrum files");
  }
  const adapt = values.adapt ?? "none";
  if (!["none", "cat16", "bradford"].includes(adapt)) {
    throw new UsageError(`Unknown --adapt "${adapt}": use cat16 or bradford`);
  }
  const [observer] = checkObservers([values.observer ?? "2"]);
  const [from, to] = await resolveIlluminants([values.from ?? "D65", values.to ?? "A"]);
  const readOptions = readOptionsFrom(values);
  const reflection = reflectionFrom(values);
  const pathMm = positiveNumber(values.path, "path");
  const uncertainty = uncertaintyFrom(values);
  const rows: Record<string, unknown>[] = [];
  const failed = await forEachFile(positionals, readOptions, (spectra, file) => {
    for (const s of spectra) {
      const t = transmittanceForPath(s, pathMm, reflection).values;
      const c = colourChange(s.wavelengthNm, t, from!, to!, observer!, adapt as "none");
      rows.push({
        sample: s.meta.sample,
        file,
        from: c.from,
        to: c.to,
        observer: c.observer,
        dE00: c.dE00,
        dEab: c.dEab,
        dL: c.dL,
        dC: c.dC,
        dh: c.dh,
        L1: c.labFrom.L,
        a1: c.labFrom.a,
        b1: c.labFrom.b,
        C1: c.chromaFrom,
        h1: c.hueFrom,
        L2: c.labTo.L,
        a2: c.labTo.a,
        b2: c.labTo.b,
        C2: c.chromaTo,
        h2: c.hueTo,
        adapt: c.adapt,
        pathMm: pathMm ?? s.thicknessMm ?? null,
        ...(uncertainty
          ? changeUncertainty(s, from!, to!, observer!, uncertainty, {
            adapt: adapt as "none",
            reflection,
            ...(pathMm === undefined ? {} : { pathMm }),
          })
          : {}),
      });
    }
  });
  if (values.json) console.log(JSON.stringify(rows, null, 2));
  else if (values.csv) {
    Deno.stdout.writeSync(
      new TextEncoder().encode(
        toCsv(rows, [...COLUMNS, ...EXTRA, ...(uncertainty ? CHANGE_SD : [])]),
      ),
    );
  } else {
    const shown = rows.map((r) =>
      Object.fromEntries(Object.entries(r).map(([k, v]) => [k, round(v, k === "dE00Sd" ? 4 : 2)]))
    );
    const sd = uncertainty ? ["dE00Sd"] : [];
    console.log(
      toTable(shown, [...COLUMNS.filter((c) => c !== "file"), "C1", "h1", "C2", "h2", ...sd]),
    );
  }
  return failed > 0 ? EXIT.someFailed : EXIT.ok;
}

/**
 * `crystint change`: colour change of each spectrum between two illuminants.
 *
 * @module
 */
import { colorChange } from "../lib/cie/color_change.ts";
import { transmittanceForPath } from "../lib/optics/path_transmittance.ts";
import type { CommandSpec } from "./_command.ts";
import {
  EXIT,
  outputFormat,
  positiveNumber,
  round,
  toCsv,
  toTable,
  UsageError,
  writeStdout,
} from "./_shared.ts";
import {
  ALPHA_NOTE,
  DEFAULT_OBSERVER,
  OBSERVER_NOTE,
  observerOption,
  OPTICS_OPTIONS,
  OUTPUT_OPTIONS,
  READING_OPTIONS,
} from "./_options.ts";
import {
  checkObservers,
  forEachFile,
  reflectionFrom,
  resolveIlluminants,
  surfaceLossNote,
} from "./_spectrum_options.ts";
import {
  changeUncertainty,
  normaliseUncertaintyArgs,
  UNCERTAINTY_OPTIONS,
  uncertaintyFromArgs,
} from "./_uncertainty_options.ts";

const COLUMNS = ["sample", "file", "from", "to", "observer", "dE00", "dEab", "dL", "dC", "dh"];
const EXTRA = ["L1", "a1", "b1", "C1", "h1", "L2", "a2", "b2", "C2", "h2", "adapt", "pathMm"];

/** Uncertainty columns of a change row. */
const CHANGE_SD = ["dE00Sd", "uncertaintyMode", "noiseSd", "noiseSource"];

/** The command table of `crystint change`. */
export const CHANGE_COMMAND: CommandSpec = {
  name: "change",
  summary: "colour change between two illuminants (ΔE00, ΔL*, ΔC*, Δh)",
  usage: ["FILE… [--from D65] [--to A] [--observer 2|10] [--adapt cat16|bradford] [options]"],
  positionals: "FILE… spectrum exports.",
  options: [
    { name: "from", type: "string", arg: "NAME", help: "first illuminant", default: "D65" },
    { name: "to", type: "string", arg: "NAME", help: "second illuminant", default: "A" },
    observerOption(false),
    {
      name: "adapt",
      type: "string",
      arg: "METHOD",
      help: "compare after adapting the second colour to the first white (cat16 or bradford)",
      default: "each under its own white",
    },
    ...READING_OPTIONS,
    ...OPTICS_OPTIONS,
    ...UNCERTAINTY_OPTIONS,
    ...OUTPUT_OPTIONS,
  ],
  prepareArgs: normaliseUncertaintyArgs,
  notes: [
    "Each row: sample, file, from, to, observer, dE00, dEab, dL, dC, dh (dh signed, degrees, " +
    "wrapped to −180…180), then L1 a1 b1 C1 h1 under the first and L2 a2 b2 C2 h2 under the " +
    "second. Colour change is a measurement, not a grading: any threshold is a setting " +
    "(common practice). With --uncertainty also dE00Sd (standard uncertainty of dE00, the " +
    "two colours correlated).",
    OBSERVER_NOTE,
    ALPHA_NOTE,
  ],
  examples: ["lot/X01a.csv --from D65 --to A --observer 2 --json"],
  async run(args) {
    if (args.positionals.length === 0) {
      throw new UsageError("No input files: give one or more spectrum files");
    }
    const format = outputFormat(args.flag("json"), args.flag("csv"));
    const adapt = args.string("adapt") ?? "none";
    if (!["none", "cat16", "bradford"].includes(adapt)) {
      throw new UsageError(`Unknown --adapt "${adapt}": use cat16 or bradford`);
    }
    const [observer] = checkObservers([args.string("observer") ?? DEFAULT_OBSERVER]);
    const [from, to] = await resolveIlluminants([
      args.string("from") ?? "D65",
      args.string("to") ?? "A",
    ]);
    const reflection = reflectionFrom(args);
    const pathMm = positiveNumber(args.string("path"), "path");
    const note = surfaceLossNote(reflection, args);
    const uncertainty = uncertaintyFromArgs(args);
    const rows: Record<string, unknown>[] = [];
    const failed = await forEachFile(args.positionals, args, (spectra, file) => {
      for (const s of spectra) {
        note(s, pathMm);
        const t = transmittanceForPath(s, pathMm, reflection).values;
        const c = colorChange(s.wavelengthNm, t, from!, to!, observer!, adapt as "none");
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
    if (format === "json") console.log(JSON.stringify(rows, null, 2));
    else if (format === "csv") {
      writeStdout(toCsv(rows, [...COLUMNS, ...EXTRA, ...(uncertainty ? CHANGE_SD : [])]));
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
  },
};

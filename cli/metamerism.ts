/**
 * `crystint metamerism`: CIE special metamerism index of two specimens for a change of
 * illuminant.
 *
 * @module
 */
import { resampleLinear } from "../lib/spectrum/linear_resample.ts";
import { metamerismIndex } from "../lib/cie/metamerism.ts";
import type { CommandSpec } from "./_command.ts";
import {
  EXIT,
  listOption,
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
  reflectionFrom,
  resolveIlluminants,
  surfaceLossNote,
} from "./_spectrum_options.ts";
import { readPair, transmittanceOrUsage } from "./pleochroism.ts";

const ROW_KEYS = [
  "sample1",
  "sample2",
  "reference",
  "test",
  "observer",
  "mismatchReference",
  "indexAb",
  "index00",
];

/** The command table of `crystint metamerism`. */
export const METAMERISM_COMMAND: CommandSpec = {
  name: "metamerism",
  summary: "CIE special metamerism index of two specimens for a change of illuminant",
  usage: ["FILE1 FILE2 [--reference D65] [--test A,F11] [--observer 2|10] [options]"],
  positionals: "FILE1 FILE2: the two specimens (e.g. a stone and its imitation).",
  options: [
    {
      name: "reference",
      type: "string",
      arg: "NAME",
      help: "illuminant under which the two are matched",
      default: "D65",
    },
    { name: "test", type: "string", arg: "LIST", help: "test illuminants", default: "A" },
    observerOption(false),
    ...READING_OPTIONS,
    ...OPTICS_OPTIONS,
    ...OUTPUT_OPTIONS,
  ],
  notes: [
    "The two specimens are first corrected (multiplicatively, CIE 15 §9.2.2) to match under the " +
    "reference illuminant; the index is their colour difference under each test illuminant, as " +
    "ΔE*ab (the CIE form) and ΔE00. mismatchReference says how close the uncorrected match was. " +
    "Each row: sample1, sample2, reference, test, observer, mismatchReference, indexAb, index00.",
    OBSERVER_NOTE,
    ALPHA_NOTE,
  ],
  examples: ["stone.csv imitation.csv --reference D65 --test A,F11 --json"],
  async run(args) {
    if (args.positionals.length !== 2) throw new UsageError("Give exactly two spectrum files");
    const format = outputFormat(args.flag("json"), args.flag("csv"));
    const [a, b] = await readPair(args);
    const reflection = reflectionFrom(args);
    const pathMm = positiveNumber(args.string("path"), "path");
    surfaceLossNote(reflection, args)(a, pathMm);
    const tA = transmittanceOrUsage(a, pathMm, reflection);
    const tB = resampleLinear(
      b.wavelengthNm,
      transmittanceOrUsage(b, pathMm, reflection),
      a.wavelengthNm,
    );
    const [reference] = await resolveIlluminants([args.string("reference") ?? "D65"]);
    const tests = listOption(args.string("test"), ["A"]);
    await resolveIlluminants(tests);
    const [observer] = checkObservers([args.string("observer") ?? DEFAULT_OBSERVER]);
    const rows = tests.map((t) => ({
      sample1: a.meta.sample,
      sample2: b.meta.sample,
      ...metamerismIndex(a.wavelengthNm, tA, tB, reference!.name, t, observer!),
    }));
    if (format === "json") console.log(JSON.stringify(rows, null, 2));
    else if (format === "csv") writeStdout(toCsv(rows, ROW_KEYS));
    else {
      const shown = rows.map((r) =>
        Object.fromEntries(Object.entries(r).map(([k, v]) => [k, round(v, 3)]))
      );
      console.log(toTable(shown, ROW_KEYS));
    }
    return EXIT.ok;
  },
};

/**
 * `crystint series`: colour of the crystal as the path grows.
 *
 * @module
 */
import { thicknessSeries } from "../lib/cie/thickness_series.ts";
import { spectrumColor } from "../lib/cie/spectrum_color.ts";
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
  illuminantOption,
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

const ROW_KEYS = [
  "sample",
  "file",
  "illuminant",
  "observer",
  "pathMm",
  "L",
  "a",
  "b",
  "C",
  "h",
  "srgb",
];

interface SeriesPoint {
  pathMm: number;
  L: number;
  a: number;
  b: number;
  C: number;
  h: number | null;
  srgb: string;
}

/** The command table of `crystint series`. */
export const SERIES_COMMAND: CommandSpec = {
  name: "series",
  summary: "colour against path length: maximum chroma, path to a target L*",
  usage: [
    "FILE… [--from MM] [--to MM] [--step MM | --steps N] [--target-l L] [options]",
    "FILE… --path MM[,MM…] [options]",
  ],
  positionals: "FILE… spectrum exports of slabs of known thickness (or α files).",
  options: [
    { name: "from", type: "string", arg: "MM", help: "start of the path range", default: "0.5" },
    { name: "to", type: "string", arg: "MM", help: "end of the path range", default: "12" },
    {
      name: "step",
      type: "string",
      arg: "MM",
      help: "distance between rows; the range ends at the last whole step",
      default: "0.5",
    },
    {
      name: "steps",
      type: "string",
      arg: "N",
      help: "number of equal intervals between --from and --to (instead of --step)",
    },
    {
      name: "path",
      type: "string",
      arg: "LIST",
      help: "rows at exactly these paths, mm (comma list), instead of the range's rows",
    },
    {
      name: "target-l",
      type: "string",
      arg: "L",
      help: "also find the path in the range where L* reaches this value",
    },
    illuminantOption("D65", false),
    observerOption(false),
    ...READING_OPTIONS,
    ...OPTICS_OPTIONS.filter((o) => o.name !== "path"),
    ...OUTPUT_OPTIONS,
  ],
  notes: [
    "The table and --csv give one row per (sample, path): sample, file, illuminant, observer, " +
    "pathMm, L, a, b, C, h, srgb. --json prints one object per sample: {sample, file, " +
    "illuminant, observer, points: [{pathMm, L, a, b, C, h, srgb}], maxChromaPathMm, maxChroma, " +
    "targetLightnessPathMm}. Maximum chroma and the target L* path are searched over the range " +
    "--from…--to.",
    OBSERVER_NOTE,
    ALPHA_NOTE,
  ],
  examples: [
    "slab.csv --thickness 2 --from 1 --to 15 --step 1 --target-l 45 --host corundum --json",
    "slab.csv --thickness 2 --path 4,6,8 --host corundum --csv",
  ],
  async run(args) {
    if (args.positionals.length === 0) {
      throw new UsageError("No input files: give one or more spectrum files");
    }
    const format = outputFormat(args.flag("json"), args.flag("csv"));
    const fromMm = positiveNumber(args.string("from"), "from") ?? 0.5;
    let toMm = positiveNumber(args.string("to"), "to") ?? 12;
    if (!(toMm > fromMm)) throw new UsageError("Option --to must exceed --from");
    const stepsText = args.string("steps"), stepText = args.string("step");
    if (stepsText !== undefined && stepText !== undefined) {
      throw new UsageError("Give only one of --step and --steps");
    }
    let steps: number;
    if (stepsText !== undefined) steps = Math.round(positiveNumber(stepsText, "steps")!);
    else {
      const step = positiveNumber(stepText, "step") ?? 0.5;
      steps = Math.max(1, Math.floor((toMm - fromMm) / step + 1e-9));
      toMm = fromMm + steps * step;
    }
    if (steps > 10000) throw new UsageError("Too many rows: give a larger --step");
    const paths = args.string("path") === undefined
      ? undefined
      : listOption(args.string("path"), []).map((p) => positiveNumber(p, "path")!);
    const targetText = args.string("target-l");
    const targetL = targetText === undefined ? undefined : Number(targetText.replace(",", "."));
    if (targetL !== undefined && !Number.isFinite(targetL)) {
      throw new UsageError("Option --target-l needs a number");
    }
    const [illuminant] = await resolveIlluminants([args.string("illuminant") ?? "D65"]);
    const [observer] = checkObservers([args.string("observer") ?? DEFAULT_OBSERVER]);
    const reflection = reflectionFrom(args);
    const note = surfaceLossNote(reflection, args);
    const out: {
      sample: string;
      file: string;
      illuminant: string;
      observer: string;
      points: SeriesPoint[];
      maxChromaPathMm: number;
      maxChroma: number;
      maxChromaAtRangeEnd: boolean;
      targetLightnessPathMm?: number;
    }[] = [];
    const failed = await forEachFile(args.positionals, args, (spectra, file) => {
      for (const s of spectra) {
        note(s, paths?.[0] ?? toMm);
        const series = thicknessSeries(s, {
          fromMm,
          toMm,
          steps,
          illuminant: illuminant!.name,
          observer: observer!,
          reflection,
          ...(targetL === undefined ? {} : { targetL }),
        });
        const points: SeriesPoint[] = paths === undefined
          ? series.points.map((p) => ({ ...p }))
          : paths.map((pathMm) => {
            const [c] = spectrumColor(s, {
              illuminants: [illuminant!],
              observers: [observer!],
              reflection,
              pathMm,
            });
            return { pathMm, L: c!.L, a: c!.a, b: c!.b, C: c!.C, h: c!.h, srgb: c!.srgb };
          });
        out.push({ sample: s.meta.sample, file, ...series, points });
      }
    });
    const rows = out.flatMap((s) =>
      s.points.map((p) => ({
        sample: s.sample,
        file: s.file,
        illuminant: s.illuminant,
        observer: s.observer,
        ...p,
      }))
    );
    if (format === "json") console.log(JSON.stringify(out, null, 2));
    else if (format === "csv") writeStdout(toCsv(rows, ROW_KEYS));
    else {
      for (const s of out) {
        console.log(
          `${s.sample} (${s.illuminant}, ${s.observer}° observer): ` +
            (s.maxChromaAtRangeEnd
              ? `chroma largest at the end of the range searched: ${round(s.maxChroma, 2)} at ` +
                `${round(s.maxChromaPathMm, 2)} mm (widen --from/--to to find its maximum)`
              : `maximum chroma ${round(s.maxChroma, 2)} at ${round(s.maxChromaPathMm, 2)} mm`) +
            (targetL === undefined
              ? ""
              : s.targetLightnessPathMm === undefined
              ? `; L* ${targetL} not reached between ${fromMm} and ${round(toMm, 3)} mm`
              : `; L* ${targetL} at ${round(s.targetLightnessPathMm, 2)} mm`),
        );
        console.log(
          toTable(
            s.points.map((p) =>
              Object.fromEntries(Object.entries(p).map(([k, v]) => [k, round(v, 2)]))
            ),
            ["pathMm", "L", "a", "b", "C", "h", "srgb"],
          ),
        );
      }
    }
    return failed > 0 ? EXIT.someFailed : EXIT.ok;
  },
};

/**
 * `crystint series`: colour of the crystal as the path grows.
 *
 * @module
 */
import { thicknessSeries } from "../lib/cie/thickness_series.ts";
import { EXIT, parseCommandArgs, positiveNumber, round, toTable, UsageError } from "./_shared.ts";
import {
  checkObservers,
  forEachFile,
  readOptionsFrom,
  reflectionFrom,
  resolveIlluminants,
  SPECTRUM_OPTIONS,
  SPECTRUM_OPTIONS_HELP,
} from "./_spectrum_options.ts";

export const SERIES_HELP = `crystint series — colour against path length

Usage:
  crystint series FILE… [--from MM] [--to MM] [--steps N] [--target-l L] [--illuminant D65]
                  [--observer 2|10] [options]

Options:
  --from MM / --to MM   path range (default 0.5 to 12 mm)
  --steps N             number of intervals (default 24)
  --target-l L          also find the path where L* reaches this value
  --illuminant NAME     default D65
  --observer 2|10       default 10
${SPECTRUM_OPTIONS_HELP}

--json prints one object per sample: {sample, file, illuminant, observer, points: [{pathMm, L,
C, h, a, b, srgb}], maxChromaPathMm, maxChroma, targetLightnessPathMm}.

Example:
  crystint series slab.csv --thickness 2 --from 1 --to 15 --target-l 45 --host corundum --json
`;

/** Runs the command; returns the exit code. */
export async function seriesCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    ...SPECTRUM_OPTIONS,
    from: { type: "string" },
    to: { type: "string" },
    steps: { type: "string" },
    "target-l": { type: "string" },
    illuminant: { type: "string" },
    observer: { type: "string" },
  });
  if (values.help) {
    console.log(SERIES_HELP);
    return EXIT.ok;
  }
  if (positionals.length === 0) {
    throw new UsageError("No input files: give one or more spectrum files");
  }
  const fromMm = positiveNumber(values.from, "from") ?? 0.5;
  const toMm = positiveNumber(values.to, "to") ?? 12;
  if (!(toMm > fromMm)) throw new UsageError("Option --to must exceed --from");
  const steps = Math.round(positiveNumber(values.steps, "steps") ?? 24);
  const targetL = values["target-l"] === undefined ? undefined : Number(values["target-l"]);
  if (targetL !== undefined && !Number.isFinite(targetL)) {
    throw new UsageError("Option --target-l needs a number");
  }
  const [illuminant] = await resolveIlluminants([values.illuminant ?? "D65"]);
  const [observer] = checkObservers([values.observer ?? "10"]);
  const reflection = reflectionFrom(values);
  const out: Record<string, unknown>[] = [];
  const failed = await forEachFile(positionals, readOptionsFrom(values), (spectra, file) => {
    for (const s of spectra) {
      const series = thicknessSeries(s, {
        fromMm,
        toMm,
        steps,
        illuminant: illuminant!.name,
        observer: observer!,
        reflection,
        ...(targetL === undefined ? {} : { targetL }),
      });
      out.push({ sample: s.meta.sample, file, ...series });
    }
  });
  if (values.json) console.log(JSON.stringify(out, null, 2));
  else {
    for (
      const s of out as {
        sample: string;
        points: Record<string, number>[];
        maxChromaPathMm: number;
        targetLightnessPathMm?: number;
      }[]
    ) {
      console.log(
        `${s.sample}: maximum chroma at ${round(s.maxChromaPathMm, 2)} mm` +
          (s.targetLightnessPathMm === undefined
            ? ""
            : `; L* ${targetL} at ${round(s.targetLightnessPathMm, 2)} mm`),
      );
      console.log(
        toTable(
          s.points.map((p) =>
            Object.fromEntries(Object.entries(p).map(([k, v]) => [k, round(v, 2)]))
          ),
          ["pathMm", "L", "C", "h", "srgb"],
        ),
      );
    }
  }
  return failed > 0 ? EXIT.someFailed : EXIT.ok;
}

/**
 * `crystint predict`: dopant concentration of measured samples from a saved calibration.
 *
 * @module
 */
import type { Calibration } from "../lib/dopant/linear_calibration.ts";
import { predictConcentration } from "../lib/dopant/linear_calibration.ts";
import {
  type MetricOptions,
  type ResponseMetric,
  spectrumResponse,
} from "../lib/dopant/response_metric.ts";
import type { CommandSpec, ParsedArgs } from "./_command.ts";
import { EXIT, outputFormat, round, toCsv, toTable, UsageError, writeStdout } from "./_shared.ts";
import { ALPHA_NOTE, OUTPUT_OPTIONS, READING_OPTIONS } from "./_options.ts";
import { forEachFile } from "./_spectrum_options.ts";

/** The command table of `crystint predict`. */
export const PREDICT_COMMAND: CommandSpec = {
  name: "predict",
  summary: "dopant concentration of samples from a saved calibration",
  usage: ["FILE… --calibration CAL.json [--thickness MM] [--json|--csv]"],
  positionals: "FILE… spectrum exports of the samples.",
  options: [
    {
      name: "calibration",
      type: "string",
      arg: "CAL.json",
      help: 'calibration written by "crystint calibrate --out" (required)',
    },
    ...READING_OPTIONS,
    ...OUTPUT_OPTIONS,
  ],
  notes: [
    "Each row: sample, file, response, responseSigma, concentration, concentrationSigma, " +
    "halfWidth95, unit, outsideRange (true when the value lies outside the calibrated range).",
    ALPHA_NOTE,
  ],
  examples: ["slabs/*.csv --calibration cr-cal.json --json"],
  run: predictCommand,
};

/** Reads a calibration file written by `crystint calibrate --out`. */
export async function readCalibration(path: string): Promise<Calibration> {
  let parsed: Calibration & { kind?: string };
  try {
    parsed = JSON.parse(await Deno.readTextFile(path));
  } catch (e) {
    throw new UsageError(`Cannot read calibration ${path}: ${(e as Error).message}`);
  }
  if (parsed.kind !== "crystint-calibration" || typeof parsed.slope !== "number") {
    throw new UsageError(`${path} is not a crystint calibration file`);
  }
  return parsed;
}

/** Runs the command; returns the exit code. */
async function predictCommand(args: ParsedArgs): Promise<number> {
  const positionals = args.positionals;
  const values = { calibration: args.string("calibration") };
  const format = outputFormat(args.flag("json"), args.flag("csv"));
  if (!values.calibration) throw new UsageError("Option --calibration CAL.json is required");
  if (positionals.length === 0) {
    throw new UsageError("No input files: give one or more spectrum files");
  }
  const cal = await readCalibration(values.calibration);
  const calBase = (cal as { alphaBase?: string }).alphaBase;
  if (calBase !== undefined && calBase !== "e") {
    throw new UsageError(
      `${values.calibration} records α base "${calBase}"; crystint calibrations use natural α (e)`,
    );
  }
  if (cal.metric === "response") {
    throw new UsageError("This calibration was made from ready responses; it cannot read spectra");
  }
  const rows: Record<string, unknown>[] = [];
  const failed = await forEachFile(positionals, args, (spectra, file) => {
    for (const s of spectra) {
      const r = spectrumResponse(
        s,
        cal.metric as ResponseMetric,
        cal.metricOptions as MetricOptions,
      );
      const p = predictConcentration(cal, r.value, r.sigma);
      rows.push({
        sample: s.meta.sample,
        file,
        response: r.value,
        responseSigma: r.sigma,
        concentration: p.x,
        concentrationSigma: p.sigma,
        halfWidth95: p.halfWidth95,
        unit: cal.unit,
        outsideRange: p.outsideRange,
      });
    }
  });
  const cols = [
    "sample",
    "file",
    "response",
    "responseSigma",
    "concentration",
    "concentrationSigma",
    "halfWidth95",
    "unit",
    "outsideRange",
  ];
  if (format === "json") console.log(JSON.stringify(rows, null, 2));
  else if (format === "csv") writeStdout(toCsv(rows, cols));
  else {
    console.log(
      toTable(
        rows.map((r) => Object.fromEntries(Object.entries(r).map(([k, v]) => [k, round(v, 4)]))),
        cols.filter((c) => c !== "file"),
      ),
    );
  }
  return failed > 0 ? EXIT.someFailed : EXIT.ok;
}

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
import { EXIT, parseCommandArgs, round, toCsv, toTable, UsageError } from "./_shared.ts";
import { forEachFile, readOptionsFrom } from "./_spectrum_options.ts";

export const PREDICT_HELP = `crystint predict — dopant concentration from a calibration

Usage:
  crystint predict FILE… --calibration CAL.json [--thickness MM] [--json|--csv]

Each row: sample, file, response, responseSigma, concentration, concentrationSigma,
halfWidth95, unit, outsideRange (true when the value lies outside the calibrated range).

Example:
  crystint predict slabs/*.csv --calibration cr-cal.json --json
`;

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
export async function predictCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    calibration: { type: "string" },
    ordinate: { type: "string" },
    axis: { type: "string" },
    thickness: { type: "string" },
    json: { type: "boolean" },
    csv: { type: "boolean" },
    help: { type: "boolean", short: "h" },
  });
  if (values.help) {
    console.log(PREDICT_HELP);
    return EXIT.ok;
  }
  if (!values.calibration) throw new UsageError("Option --calibration CAL.json is required");
  if (positionals.length === 0) {
    throw new UsageError("No input files: give one or more spectrum files");
  }
  const cal = await readCalibration(values.calibration);
  if (cal.metric === "response") {
    throw new UsageError("This calibration was made from ready responses; it cannot read spectra");
  }
  const rows: Record<string, unknown>[] = [];
  const failed = await forEachFile(positionals, readOptionsFrom(values), (spectra, file) => {
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
  if (values.json) console.log(JSON.stringify(rows, null, 2));
  else if (values.csv) Deno.stdout.writeSync(new TextEncoder().encode(toCsv(rows, cols)));
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

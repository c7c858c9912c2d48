/**
 * `crystint calibrate`: straight-line calibration of a band response against standards.
 *
 * @module
 */
import { dirname, resolve } from "node:path";
import {
  type CalibrationMode,
  type CalibrationPoint,
  fitCalibration,
} from "../lib/dopant/linear_calibration.ts";
import {
  type MetricOptions,
  type ResponseMetric,
  spectrumResponse,
} from "../lib/dopant/response_metric.ts";
import { parseStandardsTable } from "../lib/dopant/standards.ts";
import { readSpectrumFile } from "../lib/io/read_file.ts";
import { InputError } from "../lib/io/input_error.ts";
import { writeTextAtomic } from "../lib/batch/atomic_write.ts";
import {
  EXIT,
  log,
  outputFormat,
  positiveNumber,
  reportFailure,
  round,
  toCsv,
  toTable,
  UsageError,
  writeStdout,
} from "./_shared.ts";
import type { CommandSpec, ParsedArgs } from "./_command.ts";
import { ALPHA_NOTE, OUTPUT_OPTIONS, READING_OPTIONS } from "./_options.ts";
import { alphaBaseFrom, naturalAlpha, readOptionsFrom } from "./_spectrum_options.ts";

/** The command table of `crystint calibrate`. */
export const CALIBRATE_COMMAND: CommandSpec = {
  name: "calibrate",
  summary: "straight-line calibration of a band response against analysed standards",
  usage: [
    "STANDARDS.csv [--metric band-area|band-height|alpha-at] [--mode ols|origin|weighted] " +
    "[--band-nm 555] [--at-nm 555] [--window-nm 720-760] [--out CAL.json] [--json|--csv]",
  ],
  positionals: 'STANDARDS.csv columns: sample, concentration (unit in a "unit" column or the ' +
    'header, e.g. "Cr2O3 (wt%)"), optional concentration_sigma, and either file (a spectrum, ' +
    "path relative to the table; thickness from the file or a thickness_mm column) or response " +
    "(+ response_sigma). A response column is used directly.",
  options: [
    {
      name: "metric",
      type: "string",
      arg: "METRIC",
      help: "band-area, band-height (fitted band nearest --band-nm), or alpha-at (α at --at-nm " +
        "above the mean α in --window-nm); all in natural α units (cm⁻¹)",
      default: "band-area",
    },
    {
      name: "mode",
      type: "string",
      arg: "MODE",
      help: "ols with intercept, origin (through zero, Beer–Lambert), weighted (1/σ², effective " +
        "variance when concentrations carry uncertainties)",
      default: "ols",
    },
    { name: "band-nm", type: "string", arg: "NM", help: "band position for band-height" },
    { name: "at-nm", type: "string", arg: "NM", help: "wavelength for alpha-at" },
    {
      name: "window-nm",
      type: "string",
      arg: "FROM-TO",
      help: "reference window for alpha-at",
    },
    {
      name: "out",
      type: "string",
      arg: "CAL.json",
      help: 'save the calibration (JSON, with its α base) for "crystint predict" and batch runs',
    },
    ...READING_OPTIONS,
    ...OUTPUT_OPTIONS,
  ],
  notes: [
    "Prints slope, intercept, slopeSigma, interceptSigma, r2, lod, loq (LOD = 3·s_y/x / slope, " +
    "LOQ = 10·s_y/x / slope), residuals and the 95 % t factor. --csv prints one row: metric, " +
    "mode, unit, alphaBase, slope, intercept, slopeSigma, interceptSigma, r2, syx, lod, loq, n.",
    ALPHA_NOTE,
  ],
  examples: ["standards/cr.csv --metric band-area --band-nm 555 --out cr-cal.json"],
  run: calibrateCommand,
};

const CSV_KEYS = [
  "metric",
  "mode",
  "unit",
  "alphaBase",
  "slope",
  "intercept",
  "slopeSigma",
  "interceptSigma",
  "r2",
  "syx",
  "lod",
  "loq",
  "n",
];

/** Runs the command; returns the exit code. */
async function calibrateCommand(args: ParsedArgs): Promise<number> {
  const positionals = args.positionals;
  const values = {
    metric: args.string("metric"),
    mode: args.string("mode"),
    "band-nm": args.string("band-nm"),
    "at-nm": args.string("at-nm"),
    "window-nm": args.string("window-nm"),
    out: args.string("out"),
  };
  const format = outputFormat(args.flag("json"), args.flag("csv"));
  const readOptions = readOptionsFrom(args);
  const alphaBase = alphaBaseFrom(args);
  if (positionals.length !== 1) throw new UsageError("Give exactly one standards table");
  const metric = (values.metric ?? "band-area") as ResponseMetric;
  if (!["band-area", "band-height", "alpha-at"].includes(metric)) {
    throw new UsageError(`Unknown --metric "${metric}"`);
  }
  const mode = (values.mode ?? "ols") as CalibrationMode;
  if (!["ols", "origin", "weighted"].includes(mode)) {
    throw new UsageError(`Unknown --mode "${mode}"`);
  }
  const options: MetricOptions = {};
  const band = positiveNumber(values["band-nm"], "band-nm"),
    at = positiveNumber(values["at-nm"], "at-nm");
  if (band) options.bandNm = band;
  if (at) options.atNm = at;
  if (values["window-nm"]) {
    const m = /^(\d+(?:\.\d+)?)\s*-\s*(\d+(?:\.\d+)?)$/.exec(values["window-nm"]);
    if (!m) throw new UsageError(`Option --window-nm needs FROM-TO, got "${values["window-nm"]}"`);
    options.windowNm = [Number(m[1]), Number(m[2])];
  }
  const table = positionals[0]!;
  let rows, named;
  try {
    const parsed = parseStandardsTable(await Deno.readTextFile(table), table);
    rows = parsed.rows;
    named = parsed.response;
  } catch (e) {
    if (e instanceof InputError) throw new UsageError(e.message);
    throw new UsageError(`Cannot read ${table}: ${(e as Error).message}`);
  }
  const points: CalibrationPoint[] = [];
  let failed = 0;
  for (const row of rows) {
    try {
      // a response column whose header says decadic α holds α₁₀: stored as natural α (× ln 10)
      const scale = named?.alphaBase === "10" ? Math.LN10 : 1;
      let y = row.response === undefined ? undefined : row.response * scale;
      let sy = row.responseSigma === undefined ? undefined : row.responseSigma * scale;
      if (y === undefined) {
        const path = resolve(dirname(table), row.file!);
        const [read] = await readSpectrumFile(path, {
          ...readOptions,
          ...(row.thicknessMm ? { thicknessMm: row.thicknessMm } : {}),
        });
        const r = spectrumResponse(naturalAlpha(read!, alphaBase), metric, options);
        y = r.value;
        sy = r.sigma;
      }
      const p: CalibrationPoint = { sample: row.sample, x: row.concentration, y };
      if (sy !== undefined) p.sigmaY = sy;
      if (row.concentrationSigma !== undefined) p.sigmaX = row.concentrationSigma;
      points.push(p);
    } catch (e) {
      failed++;
      reportFailure(e, `${table}:${row.line}`);
    }
  }
  // ready responses keep the metric their column header names (so predict can apply it to
  // spectra); a bare "response" column stays "response", which predict refuses for spectra
  const fromSpectra = rows.some((r) => r.response === undefined);
  const calMetric = fromSpectra ? metric : named?.metric ?? "response";
  const calOptions = fromSpectra || !named?.metric ? { ...options } : { ...named.options };
  if (!fromSpectra && named) {
    log(
      `crystint: ${table}: responses read as ${
        named.metric ?? "an unnamed response (predict cannot apply it to spectra)"
      } from the header "${named.header}"${named.alphaBase === "10" ? ", decadic α × ln 10" : ""}`,
    );
  }
  let cal;
  try {
    cal = fitCalibration(points, mode, rows[0]?.unit ?? "", calMetric, calOptions);
  } catch (e) {
    throw new UsageError((e as Error).message);
  }
  if (values.out) {
    await writeTextAtomic(
      values.out,
      JSON.stringify({ kind: "crystint-calibration", alphaBase: "e", ...cal }, null, 2) + "\n",
    );
  }
  if (format === "json") console.log(JSON.stringify(cal, null, 2));
  else if (format === "csv") {
    writeStdout(toCsv([{ ...cal, alphaBase: "e", n: points.length }], CSV_KEYS));
  } else {
    const keys = [
      "slope",
      "intercept",
      "slopeSigma",
      "interceptSigma",
      "r2",
      "syx",
      "lod",
      "loq",
    ] as const;
    console.log(
      toTable(keys.map((k) => ({ quantity: k, value: round(cal[k], 6) })), ["quantity", "value"]),
    );
    console.log(
      toTable(
        points.map((p, i) => ({
          standard: p.sample,
          concentration: p.x,
          response: round(p.y, 4),
          residual: round(cal.residuals[i], 4),
        })),
        ["standard", "concentration", "response", "residual"],
      ),
    );
    log(`crystint: ${cal.lodConvention}`);
  }
  return failed > 0 ? EXIT.someFailed : EXIT.ok;
}

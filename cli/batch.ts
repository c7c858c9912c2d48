/**
 * `crystint batch`: a folder of exports in, results.csv, results.json and index.html out.
 *
 * @module
 */
import cliProgress from "cli-progress";
import process from "node:process";
import { NoInputsError, runBatch } from "../lib/batch/run_batch.ts";
import { OutputError } from "../lib/batch/output_error.ts";
import { OutputLockedError } from "../lib/batch/output_lock.ts";
import { escapeControls } from "../lib/batch/escape_controls.ts";
import {
  type BatchSettings,
  defaultSettings,
  readSettingsFile,
  SettingsError,
} from "../lib/batch/mod.ts";
import type { CommandSpec, ParsedArgs } from "./_command.ts";
import { EXIT, log, positiveNumber, UsageError } from "./_shared.ts";
import { OBSERVER_NOTE, READING_OPTIONS } from "./_options.ts";
import { alphaBaseFrom, axisFrom, ordinateFrom } from "./_spectrum_options.ts";

/** Every key a settings file may hold, with what it sets. */
export const SETTINGS_KEYS: [string, string][] = [
  ["illuminants", "illuminants of the colour rows (list)"],
  ["observers", "observers of the colour rows: 2 and/or 10 (list)"],
  ["change", "{from, to, observer, adapt}: the colour change reported per sample"],
  ["pathMm", "path length of the finished stone, mm (a sheet column overrides it)"],
  ["thicknessMm", "measured thickness when neither file nor sheet says, mm"],
  ["reflection", "none or host (surface treatment when rescaling the path)"],
  ["host", "host crystal for n(λ)"],
  ["n", "constant refractive index"],
  ["sellmeier", "your own Sellmeier coefficients, as for --sellmeier"],
  ["ordinate", "what the values are, for files that do not say (as --ordinate)"],
  ["axis", "x axis unit, for files that do not say (as --axis)"],
  [
    "target",
    "target colour every sample is checked against: L,a,b or {L, a, b, illuminant, " +
    "observer, toleranceDE00, under, spectrum, spectrumPathMm}",
  ],
  ["targets", "named targets the sheet's target column may refer to"],
  ["series", "{fromMm, toMm, steps, targetL}: thickness series range"],
  [
    "changeHueThresholdDeg",
    "hue difference from which a change is called marked (common practice)",
  ],
  ["changeMinChroma", "smallest C*ab for a change to be called marked (common practice)"],
  ["calibration", "calibration file applied to every sample"],
  ["calibrations", "named calibration files the sheet's calibration column may refer to"],
  ["alphaBase", "e or 10: base of α inputs; 10 (decadic, A = α·d) is multiplied by ln 10"],
  [
    "uncertainty",
    "{enabled (default true), noiseSd (default: estimated from the spectrum, and said so), " +
    "offsetSd, wavelengthSdNm, thicknessSdMm, pathSdMm (σ ≥ 0, default 0), passAt (0.95), " +
    "failAt (0.05)}: standard uncertainties (GUM first order) and target verdicts; the " +
    "sheet's thickness_sd and path_sd columns override thicknessSdMm and pathSdMm",
  ],
  ["report", "{title, lab, client, operator, note, date, audience}: the report's header"],
  ["limits", "{maxFileMb, fileTimeoutSeconds, maxMemoryMb}: per-file limits"],
];

/** The command table of `crystint batch`. */
export const BATCH_COMMAND: CommandSpec = {
  name: "batch",
  summary: "process folders of exports into results.csv, results.json and an HTML report",
  usage: ["INPUT… --out DIR [--manifest SAMPLES.csv] [--settings FILE] [--quiet]"],
  positionals: 'INPUT… files, folders (searched recursively) or glob patterns ("lot/**/*.csv").',
  options: [
    {
      name: "out",
      type: "string",
      arg: "DIR",
      help: "output folder: results.csv, results.json, index.html (required)",
    },
    {
      name: "manifest",
      type: "string",
      arg: "FILE",
      help: "sample sheet (CSV): sample, file, thickness_mm, path_mm, host, polarisation, " +
        "thickness_sd, path_sd, alpha_base, target, calibration, notes; other columns are carried along",
    },
    {
      name: "settings",
      type: "string",
      arg: "FILE",
      help: "settings in JSON or YAML on top of the defaults (keys below)",
    },
    ...READING_OPTIONS.filter((o) => o.name !== "thickness").map((o) => ({
      ...o,
      help: `${o.help}; for files that do not say (overrides the setting)`,
    })),
    {
      name: "workers",
      type: "string",
      arg: "N",
      help: "number of worker threads",
      default: "one per core, at most 8",
    },
    {
      name: "plain-json",
      type: "boolean",
      help:
        "results.json with every record written out in full (a list of objects per sample, numbers unrounded) instead of packed; larger, but readable without crystint (jq, a spreadsheet plug-in)",
    },
    { name: "quiet", type: "boolean", help: "no progress output" },
  ],
  notes: [
    "Settings keys: " + SETTINGS_KEYS.map(([k, what]) => `${k} — ${what}`).join("; ") + ".",
    "Defaults: " + JSON.stringify(defaultSettings()) + ".",
    "Results are cached per input (content hash + settings hash) in DIR/.cache, so a rerun " +
    "after a crash or after adding files only computes what is new. Outputs are written " +
    "atomically. When no input matches a file, nothing is written and the exit code is 1.",
    OBSERVER_NOTE,
    "Exit codes: 0 all inputs done, 1 usage or settings error, 2 some inputs failed.",
  ],
  examples: [
    "spectra/demo --manifest spectra/demo/manifest.csv --out reports/demo",
    "'lot/*.dat' --ordinate transmittance --axis nm --out reports/lot",
  ],
  run: batchCommand,
};

/** The settings the run uses: the file's (or the defaults) with the reading options on top. */
async function settingsFor(args: ParsedArgs): Promise<BatchSettings | undefined> {
  const ordinate = args.string("ordinate"), axis = args.string("axis");
  const alphaBase = args.string("alpha-base") === undefined ? undefined : alphaBaseFrom(args);
  if (ordinate === undefined && axis === undefined && alphaBase === undefined) return undefined;
  // the same checks as every other command
  ordinateFrom(args);
  axisFrom(args);
  const path = args.string("settings");
  const settings = path ? await readSettingsFile(path) : defaultSettings();
  if (ordinate !== undefined) settings.ordinate = ordinate;
  if (axis !== undefined) settings.axis = axis;
  if (alphaBase !== undefined) settings.alphaBase = alphaBase;
  return settings;
}

/** Runs the command; returns the exit code. */
async function batchCommand(args: ParsedArgs): Promise<number> {
  const positionals = args.positionals;
  const values = {
    out: args.string("out"),
    manifest: args.string("manifest"),
    settings: args.string("settings"),
  };
  if (positionals.length === 0) {
    throw new UsageError("No inputs: give files, folders or glob patterns");
  }
  if (!values.out) throw new UsageError("Option --out DIR is required");
  const workers = positiveNumber(args.string("workers"), "workers");
  const quiet = args.flag("quiet");
  const plainJson = args.flag("plain-json");
  let settings: BatchSettings | undefined;
  try {
    settings = await settingsFor(args);
  } catch (e) {
    if (e instanceof SettingsError) throw new UsageError(e.message);
    throw e;
  }
  const tty = Deno.stderr.isTerminal();
  let bar: cliProgress.SingleBar | undefined;
  let lastLine = 0;
  const started = Date.now();
  const onProgress = (done: number, total: number) => {
    if (quiet) return;
    if (tty) {
      if (!bar) {
        bar = new cliProgress.SingleBar({
          stream: process.stderr,
          format: "crystint {bar} {value}/{total} files · {rate}/s · ETA {eta_formatted}",
          hideCursor: true,
        }, cliProgress.Presets.shades_classic);
        bar.start(total, 0, { rate: "0.0" });
      }
      const rate = done / Math.max(0.001, (Date.now() - started) / 1000);
      bar.update(done, { rate: rate.toFixed(1) });
      return;
    }
    const now = Date.now();
    if (done === total || now - lastLine > 2000) {
      lastLine = now;
      const rate = done / Math.max(0.001, (now - started) / 1000);
      const eta = rate > 0 ? Math.round((total - done) / rate) : 0;
      log(`crystint: ${done}/${total} files, ${rate.toFixed(1)}/s, about ${eta} s left`);
    }
  };
  try {
    const summary = await runBatch({
      inputs: positionals,
      outDir: values.out,
      ...(values.manifest ? { manifestPath: values.manifest } : {}),
      ...(settings ? { settings } : values.settings ? { settingsPath: values.settings } : {}),
      ...(workers ? { workers: Math.round(workers) } : {}),
      ...(plainJson ? { plainJson } : {}),
      onProgress,
      log: quiet ? () => {} : (m) => log(escapeControls(m)),
    });
    bar?.stop();
    for (const e of summary.errors) log(`crystint: ${escapeControls(e.message)}`);
    if (!quiet) {
      log(
        `crystint: ${summary.samples} sample(s) from ${
          summary.files - summary.errors.length
        } of ${summary.files} file(s)` +
          ` (${summary.cached} from cache); ${summary.errors.length} failed`,
      );
    }
    console.log(summary.outputs.html);
    return summary.errors.length > 0 ? EXIT.someFailed : EXIT.ok;
  } catch (e) {
    bar?.stop();
    if (e instanceof SettingsError) throw new UsageError(escapeControls(e.message));
    if (
      e instanceof NoInputsError || e instanceof OutputError || e instanceof OutputLockedError
    ) {
      log(`crystint batch: ${escapeControls(e.message)}`);
      return EXIT.usage;
    }
    throw e;
  }
}

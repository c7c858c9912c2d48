/**
 * `crystint batch`: a folder of exports in, results.csv, results.json and index.html out.
 *
 * @module
 */
import cliProgress from "cli-progress";
import process from "node:process";
import { NoInputsError, runBatch } from "../lib/batch/run_batch.ts";
import { SettingsError } from "../lib/batch/settings_schema.ts";
import { OutputError } from "../lib/batch/output_error.ts";
import { OutputLockedError } from "../lib/batch/output_lock.ts";
import { escapeControls } from "../lib/batch/escape_controls.ts";
import { EXIT, log, parseCommandArgs, positiveNumber, UsageError } from "./_shared.ts";

export const BATCH_HELP = `crystint batch — process a whole set of exports and write a report

Usage:
  crystint batch INPUT… --out DIR [--manifest SAMPLES.csv] [--settings FILE] [--quiet]

INPUT may be files, folders (searched recursively) or glob patterns ("lot/**/*.csv").

Options:
  --out DIR           output folder: results.csv, results.json, index.html (required)
  --manifest FILE     sample sheet (CSV): sample, file, thickness_mm, path_mm, host,
                      polarisation, target, calibration, notes; other columns are carried along
  --settings FILE     defaults in JSON or YAML (illuminants, observers, pathMm, reflection,
                      host, target, targets, change, series)
  --workers N         number of worker threads (default: one per core, at most 8)
  --quiet             no progress output
  -h, --help          show this help

Results are cached per input (content hash + settings hash) in DIR/.cache, so a rerun after a
crash or after adding files only computes what is new. Outputs are written atomically.
One run writes an output folder at a time (DIR/.crystint-lock); the three outputs are
replaced together or not at all. Limits per file (settings "limits": maxFileMb, default 64;
fileTimeoutSeconds, default 60) fail only the file that breaks them.
Exit codes: 0 all inputs done, 1 usage, settings or output-folder error (or no input
matched), 2 some inputs failed.

Example:
  crystint batch spectra/demo --manifest spectra/demo/manifest.csv --out reports/demo
`;

/** Runs the command; returns the exit code. */
export async function batchCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    out: { type: "string" },
    manifest: { type: "string" },
    settings: { type: "string" },
    workers: { type: "string" },
    quiet: { type: "boolean" },
    help: { type: "boolean", short: "h" },
  });
  if (values.help) {
    console.log(BATCH_HELP);
    return EXIT.ok;
  }
  if (positionals.length === 0) {
    throw new UsageError("No inputs: give files, folders or glob patterns");
  }
  if (!values.out) throw new UsageError("Option --out DIR is required");
  const workers = positiveNumber(values.workers, "workers");
  const quiet = values.quiet ?? false;
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
      ...(values.settings ? { settingsPath: values.settings } : {}),
      ...(workers ? { workers: Math.round(workers) } : {}),
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

/**
 * A batch run: read the settings and the sample sheet, plan the inputs, compute or reuse each
 * file's results (process_inputs.ts), then write results.json, results.csv and index.html
 * atomically (write_outputs.ts).
 *
 * @module
 */
import { VERSION } from "../version.ts";
import type { ResultsError, ResultsHeader } from "../analysis/results_document.ts";
import { removeStaleTemporaries } from "./atomic_write.ts";
import { type ManifestRow, readManifest } from "./manifest.ts";
import { planInputs } from "./plan_inputs.ts";
import { type BatchSettings, defaultSettings } from "./settings_schema.ts";
import { readSettingsFile } from "./read_settings.ts";
import { calibrationSummaries, loadCalibrations } from "./load_calibrations.ts";
import { resolveTargetSpectra } from "./resolve_target_spectra.ts";
import { settingsSummary } from "./settings_summary.ts";
import { processInputs } from "./process_inputs.ts";
import { readCached } from "./result_cache.ts";
import { type OutputPaths, outputPaths, writeOutputs } from "./write_outputs.ts";

/** What to run. */
export interface BatchOptions {
  /** Files, folders or glob patterns. */
  inputs: string[];
  /** Output folder. */
  outDir: string;
  /** Sample sheet (CSV). */
  manifestPath?: string;
  /** Settings file (JSON or YAML). */
  settingsPath?: string;
  /** Settings given directly (used when no settings file is named). */
  settings?: BatchSettings;
  /** Worker count (default: one per core, at most 8). */
  workers?: number;
  /** Called after each file. */
  onProgress?: (done: number, total: number) => void;
  /** Receives notes for the user (sample-sheet mismatches). */
  log?: (message: string) => void;
  /** Charts are embedded for at most this many samples (the rest stay in results.json). */
  detailLimit?: number;
}

/** A failed input. */
export type BatchError = ResultsError;

/** What the run did. */
export interface BatchSummary {
  /** Files planned. */
  files: number;
  /** Samples (spectra) with results. */
  samples: number;
  /** Files whose results came from the cache. */
  cached: number;
  /** Files analysed in this run. */
  computed: number;
  /** Failed inputs. */
  errors: BatchError[];
  /** Notes about the sample sheet. */
  manifestNotes: string[];
  /** The outputs written. */
  outputs: OutputPaths;
}

/**
 * Runs a batch.
 *
 * @throws {SettingsError} For an unreadable settings file or manifest (exit code 1).
 */
export async function runBatch(options: BatchOptions): Promise<BatchSummary> {
  const log = options.log ?? (() => {});
  const settings = options.settingsPath
    ? await readSettingsFile(options.settingsPath)
    : options.settings ?? defaultSettings();
  const rows: ManifestRow[] = options.manifestPath ? await readManifest(options.manifestPath) : [];
  await resolveTargetSpectra(settings);
  const calibrations = await loadCalibrations(settings);
  const outDir = options.outDir.replace(/\/$/, "");
  const cacheDir = `${outDir}/.cache`;
  await Deno.mkdir(cacheDir, { recursive: true });
  await removeStaleTemporaries(outDir);
  await removeStaleTemporaries(cacheDir);
  const skip = [outDir, options.manifestPath, options.settingsPath].filter((p): p is string => !!p);
  const plan = await planInputs(options.inputs, skip);
  const errors: BatchError[] = plan.missing.map((m) => ({
    file: m,
    message: `${m}: no such file, folder or match`,
  }));
  const computed = await processInputs(plan.files, {
    settings,
    rows,
    calibrations,
    cacheDir,
    ...(options.workers === undefined ? {} : { workers: options.workers }),
    ...(options.onProgress ? { onProgress: options.onProgress } : {}),
  });
  for (const o of computed.outcomes) if (o.error) errors.push(o.error);
  for (const n of computed.manifestNotes) log(`crystint: ${n}`);

  const header: ResultsHeader = {
    version: VERSION,
    settings,
    settingsSummary: settingsSummary(settings),
    calibrations: calibrationSummaries(calibrations),
    detailLimit: options.detailLimit ?? 2000,
    report: {
      audience: "internal",
      ...settings.report,
      date: settings.report?.date ?? new Date().toISOString().slice(0, 10),
    },
  };
  async function* cachedResults() {
    for (const o of computed.outcomes) {
      if (o.cacheFile) yield* (await readCached(o.cacheFile)) ?? [];
    }
  }
  const outputs = outputPaths(outDir);
  const samples = await writeOutputs(
    outputs,
    header,
    cachedResults,
    errors,
    computed.manifestNotes,
    [...new Set(rows.flatMap((r) => Object.keys(r.extra)))],
  );
  return {
    files: plan.files.length,
    samples,
    cached: computed.cached,
    computed: computed.computed,
    errors,
    manifestNotes: computed.manifestNotes,
    outputs,
  };
}

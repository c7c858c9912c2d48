/**
 * A batch run: read the settings and the sample sheet, plan the inputs, compute or reuse each
 * file's results (process_inputs.ts), then write results.json, results.csv and index.html
 * atomically (write_outputs.ts). One run writes an output folder at a time (output_lock.ts);
 * errors of the environment (read-only folder, disk full) are an {@linkcode OutputError}
 * naming the path, and a run that matched no input throws {@linkcode NoInputsError} before it
 * writes anything.
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
import { type FileOutcome, processInputs } from "./process_inputs.ts";
import { lockOutput, OutputLockedError } from "./output_lock.ts";
import { OutputError } from "./output_error.ts";
import { batchLimits } from "./batch_limits.ts";
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
  /**
   * results.json with every record in full (lists of objects, numbers unrounded) instead of
   * packed (`lib/analysis/results_packing.ts`); larger, readable without crystint.
   */
  plainJson?: boolean;
  /** Called after each file. */
  onProgress?: (done: number, total: number) => void;
  /** Receives notes for the user (sample-sheet mismatches, skipped links, unknown settings). */
  log?: (message: string) => void;
  /** Called with each file's outcome as it is known (watch prints a line per file). */
  onFile?: (outcome: FileOutcome) => void;
  /** Only planned files this accepts are processed (watch leaves out files still being written). */
  accept?: (file: string) => boolean;
  /** Charts are embedded for at most this many samples (the rest stay in results.json). */
  detailLimit?: number;
}

/** No input named a file: nothing is written (exit code 1). */
export class NoInputsError extends Error {
  constructor(inputs: string[]) {
    super(`no files matched ${inputs.map((i) => JSON.stringify(i)).join(" ")}`);
    this.name = "NoInputsError";
  }
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
 * @throws {NoInputsError} When no input names a file (nothing is written).
 * @throws {OutputLockedError} When another live run writes the same output folder.
 * @throws {OutputError} When the output folder cannot be written (nothing half-written).
 */
export async function runBatch(options: BatchOptions): Promise<BatchSummary> {
  const log = options.log ?? (() => {});
  const settings = options.settingsPath
    ? await readSettingsFile(options.settingsPath, (w) => log(`crystint: ${w}`))
    : options.settings ?? defaultSettings();
  const { maxFileBytes } = batchLimits(settings);
  const rows: ManifestRow[] = options.manifestPath
    ? await readManifest(options.manifestPath, maxFileBytes)
    : [];
  await resolveTargetSpectra(settings);
  const calibrations = await loadCalibrations(settings);
  const outDir = options.outDir.replace(/(.)\/$/, "$1");
  const cacheDir = `${outDir}/.cache`;
  const skip = [outDir, options.manifestPath, options.settingsPath].filter((p): p is string => !!p);
  const plan = await planInputs(options.inputs, skip);
  for (const s of plan.skipped) log(`crystint: ${s}`);
  const files = options.accept ? plan.files.filter(options.accept) : plan.files;
  if (plan.files.length === 0) throw new NoInputsError(options.inputs);
  try {
    await Deno.mkdir(cacheDir, { recursive: true });
  } catch (e) {
    throw new OutputError(outDir, e);
  }
  const lock = await lockOutput(outDir).catch((e) => {
    throw e instanceof OutputLockedError ? e : new OutputError(outDir, e);
  });
  const locked = async (): Promise<BatchSummary> => {
    await removeStaleTemporaries(outDir);
    await removeStaleTemporaries(cacheDir);
    const errors: BatchError[] = plan.missing.map((m) => ({
      file: m,
      message: `${m}: no such file, folder or match`,
    }));
    const computed = await processInputs(files, {
      settings,
      rows,
      calibrations,
      cacheDir,
      relative: plan.relative,
      ...(options.onFile ? { onFile: options.onFile } : {}),
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
    const cachedResults = async function* () {
      for (const o of computed.outcomes) {
        if (o.cacheFile) yield* (await readCached(o.cacheFile)) ?? [];
      }
    };
    const outputs = outputPaths(outDir);
    const samples = await writeOutputs(
      outputs,
      header,
      cachedResults,
      errors,
      computed.manifestNotes,
      [...new Set(rows.flatMap((r) => Object.keys(r.extra)))],
      options.plainJson ?? false,
    );
    return {
      files: files.length,
      samples,
      cached: computed.cached,
      computed: computed.computed,
      errors,
      manifestNotes: computed.manifestNotes,
      outputs,
    };
  };
  try {
    return await locked();
  } finally {
    await lock.release();
  }
}

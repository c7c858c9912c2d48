/**
 * The compute phase of a batch: for each planned file, join its sample-sheet row, reuse the
 * cached results or analyse it in the worker pool. One bad file never stops the others: a
 * file that cannot be read within the limits, is ambiguous in the sheet, runs past its time
 * budget or kills its worker is listed as failed and the rest go on.
 *
 * @module
 */
import type { Calibration } from "../dopant/linear_calibration.ts";
import type { ResultsError } from "../analysis/results_document.ts";
import type { SampleSettings } from "../analysis/sample_settings.ts";
import { joinSheet, type ManifestRow } from "./manifest.ts";
import { settingsForSample } from "./sample_settings_from_sheet.ts";
import type { BatchSettings } from "./settings_schema.ts";
import { cacheFileFor, readCached, writeCachedJson } from "./result_cache.ts";
import { WorkerPool } from "./pool.ts";
import { batchLimits } from "./batch_limits.ts";
import { LimitedReadError, readFileLimited } from "./read_limited.ts";
import { OutputError } from "./output_error.ts";

/** What became of one input. */
export interface FileOutcome {
  /** The input file. */
  file: string;
  /** Its cache entry, when it has results. */
  cacheFile?: string;
  /** Why it failed, when it did. */
  error?: ResultsError;
  /** True when the results came from the cache. */
  cached?: boolean;
  /** Samples (spectra) found, when analysed in this run. */
  samples?: number;
}

/** What the compute phase did. */
export interface ComputeSummary {
  /** One outcome per planned file, in input order. */
  outcomes: FileOutcome[];
  /** Inputs whose results came from the cache. */
  cached: number;
  /** Inputs analysed in this run. */
  computed: number;
  /** Notes about the sample sheet. */
  manifestNotes: string[];
}

/** How to run the compute phase. */
export interface ComputeOptions {
  /** Settings of the run. */
  settings: BatchSettings;
  /** Sample-sheet rows. */
  rows: ManifestRow[];
  /** Loaded calibrations by name. */
  calibrations: Record<string, Calibration>;
  /** Cache folder. */
  cacheDir: string;
  /** Each file's path relative to the batch root (for the sheet join). */
  relative?: Map<string, string>;
  /** Worker count (default: one per core, at most 8). */
  workers?: number;
  /** Called after each file. */
  onProgress?: (done: number, total: number) => void;
  /** Called with each file's outcome as it is known. */
  onFile?: (outcome: FileOutcome) => void;
}

/** Analyses (or finds cached) results for every file. */
export async function processInputs(
  files: string[],
  options: ComputeOptions,
): Promise<ComputeSummary> {
  const { rows, settings, calibrations, cacheDir } = options;
  const { maxFileBytes, fileTimeoutMs, maxRssBytes } = batchLimits(settings);
  const manifestNotes: string[] = [];
  const join = joinSheet(rows, files, options.relative);
  const outcomes: FileOutcome[] = files.map((file) => ({ file }));
  let pool: WorkerPool | undefined;
  let done = 0, cached = 0, computed = 0;
  const total = files.length;
  const finished = (outcome: FileOutcome) => {
    options.onFile?.(outcome);
    options.onProgress?.(++done, total);
  };
  const inFlight = new Set<Promise<void>>();
  try {
    for (const outcome of outcomes) {
      const file = outcome.file;
      const ambiguous = join.ambiguous.get(file);
      if (ambiguous) {
        outcome.error = { file, message: ambiguous, problem: "sample-sheet", line: null };
        finished(outcome);
        continue;
      }
      const row = join.rows.get(file);
      if (!row && rows.length > 0) {
        manifestNotes.push(`${file}: not listed in the sample sheet (defaults used)`);
      }
      let bytes: Uint8Array<ArrayBuffer>;
      let perFile: SampleSettings;
      try {
        bytes = await readFileLimited(file, maxFileBytes);
        perFile = settingsForSample(settings, row, calibrations);
      } catch (e) {
        outcome.error = e instanceof LimitedReadError
          ? { file, message: e.message, problem: e.reason, line: null }
          : { file, message: `${file}: ${(e as Error).message}` };
        finished(outcome);
        continue;
      }
      const { key, path } = await cacheFileFor(cacheDir, file, bytes, perFile);
      if (await readCached(path)) {
        outcome.cacheFile = path;
        outcome.cached = true;
        cached++;
        finished(outcome);
        continue;
      }
      pool ??= new WorkerPool(options.workers, { timeoutMs: fileTimeoutMs, maxRssBytes });
      const job = pool.run(file, bytes, perFile).then(async (result) => {
        if (result.ok) {
          try {
            await writeCachedJson(path, file, key, result.json);
          } catch (e) {
            throw new OutputError(path, e);
          }
          outcome.cacheFile = path;
          outcome.samples = result.count;
          computed++;
        } else {
          outcome.error = { file, ...result.error };
        }
        finished(outcome);
      });
      inFlight.add(job);
      job.then(() => inFlight.delete(job), () => inFlight.delete(job));
      if (inFlight.size >= 2 * pool.size) await Promise.race(inFlight);
    }
    await Promise.all(inFlight);
  } finally {
    pool?.close();
  }
  for (const r of join.unused) {
    manifestNotes.push(
      `sample sheet line ${r.line}${r.sample ? ` (${r.sample})` : ""}: no matching file${
        r.file ? ` "${r.file}"` : ""
      }`,
    );
  }
  return { outcomes, cached, computed, manifestNotes };
}

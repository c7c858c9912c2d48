/**
 * The compute phase of a batch: for each planned file, join its sample-sheet row, reuse the
 * cached results or analyse it in the worker pool. One bad file never stops the others.
 *
 * @module
 */
import type { Calibration } from "../dopant/linear_calibration.ts";
import type { ResultsError } from "../analysis/results_document.ts";
import type { SampleSettings } from "../analysis/sample_settings.ts";
import { type ManifestRow, matchRow } from "./manifest.ts";
import { settingsForSample } from "./sample_settings_from_sheet.ts";
import type { BatchSettings } from "./settings_schema.ts";
import { cacheFileFor, readCached, writeCached } from "./result_cache.ts";
import { WorkerPool } from "./pool.ts";

/** What became of one input. */
export interface FileOutcome {
  /** The input file. */
  file: string;
  /** Its cache entry, when it has results. */
  cacheFile?: string;
  /** Why it failed, when it did. */
  error?: ResultsError;
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
  /** Worker count (default: one per core, at most 8). */
  workers?: number;
  /** Called after each file. */
  onProgress?: (done: number, total: number) => void;
}

/** Analyses (or finds cached) results for every file. */
export async function processInputs(
  files: string[],
  options: ComputeOptions,
): Promise<ComputeSummary> {
  const { rows, settings, calibrations, cacheDir } = options;
  const manifestNotes: string[] = [];
  const usedRows = new Set<ManifestRow>();
  const outcomes: FileOutcome[] = files.map((file) => ({ file }));
  const pool = files.length > 0 ? new WorkerPool(options.workers) : undefined;
  let done = 0, cached = 0, computed = 0;
  const total = files.length;
  const progress = () => options.onProgress?.(++done, total);
  const inFlight = new Set<Promise<void>>();
  try {
    for (const outcome of outcomes) {
      const file = outcome.file;
      const row = matchRow(rows, file);
      if (row) usedRows.add(row);
      else if (rows.length > 0) {
        manifestNotes.push(`${file}: not listed in the sample sheet (defaults used)`);
      }
      let bytes: Uint8Array<ArrayBuffer>;
      let perFile: SampleSettings;
      try {
        bytes = await Deno.readFile(file);
        perFile = settingsForSample(settings, row, calibrations);
      } catch (e) {
        outcome.error = { file, message: `${file}: ${(e as Error).message}` };
        progress();
        continue;
      }
      const { key, path } = await cacheFileFor(cacheDir, file, bytes, perFile);
      if (await readCached(path)) {
        outcome.cacheFile = path;
        cached++;
        progress();
        continue;
      }
      const job = pool!.run(file, bytes, perFile).then(async (result) => {
        if (result.ok) {
          await writeCached(path, file, key, result.results);
          outcome.cacheFile = path;
          computed++;
        } else {
          outcome.error = { file, ...result.error };
        }
        progress();
      });
      inFlight.add(job);
      job.finally(() => inFlight.delete(job));
      if (inFlight.size >= 2 * pool!.size) await Promise.race(inFlight);
    }
    await Promise.all(inFlight);
  } finally {
    pool?.close();
  }
  for (const r of rows) {
    if (!usedRows.has(r)) {
      manifestNotes.push(
        `sample sheet line ${r.line}${r.sample ? ` (${r.sample})` : ""}: no matching file${
          r.file ? ` "${r.file}"` : ""
        }`,
      );
    }
  }
  return { outcomes, cached, computed, manifestNotes };
}

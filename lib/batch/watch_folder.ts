/**
 * Watching an export folder: what is there is processed, then every new or changed file once
 * it is completely written — its size and modification time unchanged over a settle interval —
 * through the same batch run (cache, lock, atomic outputs), so results.json, results.csv and
 * index.html always hold each finished export exactly once. Stopping (the signal) lets the run
 * in progress finish its writes first.
 *
 * @module
 */
import { runBatch } from "./run_batch.ts";
import { planInputs } from "./plan_inputs.ts";
import { lockOutput, OutputLockedError } from "./output_lock.ts";
import { OutputError } from "./output_error.ts";
import type { FileOutcome } from "./process_inputs.ts";
import type { BatchSummary } from "./run_batch.ts";

/** What to watch. */
export interface WatchOptions {
  /** The export folder. */
  dir: string;
  /** Output folder. */
  outDir: string;
  /** Sample sheet (CSV), re-read on every update. */
  manifestPath?: string;
  /** Settings file, re-read on every update. */
  settingsPath?: string;
  /** How often the folder is looked at, ms (default 500). */
  pollMs?: number;
  /** How long size and mtime must stay unchanged before a file counts as written, ms (default 1000). */
  settleMs?: number;
  /** Worker count. */
  workers?: number;
  /** results.json with plain records instead of packed ones (see BatchOptions). */
  plainJson?: boolean;
  /** Stops the watch (after the run in progress has written its outputs). */
  signal: AbortSignal;
  /** Called once per new or changed file after its analysis (or failure). */
  onFile?: (outcome: FileOutcome) => void;
  /** Called after each update of the outputs. */
  onUpdate?: (summary: BatchSummary) => void;
  /** Notes and errors of later updates (the first update's errors are thrown). */
  log?: (message: string) => void;
}

interface Seen {
  size: number;
  mtime: number;
  since: number;
}

function sleep(ms: number, signal: AbortSignal): Promise<void> {
  return new Promise((resolve) => {
    if (signal.aborted) return resolve();
    const done = () => {
      clearTimeout(timer);
      signal.removeEventListener("abort", done);
      resolve();
    };
    const timer = setTimeout(done, ms);
    signal.addEventListener("abort", done);
  });
}

/**
 * Watches a folder until the signal aborts; returns the number of updates written.
 *
 * @throws Whatever the first update throws (settings, sheet, output folder); later failures go
 * to `log` and the watch goes on.
 */
export async function watchFolder(options: WatchOptions): Promise<number> {
  const pollMs = options.pollMs ?? 500;
  const settleMs = options.settleMs ?? 1000;
  const log = options.log ?? (() => {});
  const outDir = options.outDir.replace(/(.)\/$/, "$1");
  const lock = await Deno.mkdir(outDir, { recursive: true }).then(() => lockOutput(outDir)).catch(
    (e) => {
      throw e instanceof OutputLockedError ? e : new OutputError(outDir, e);
    },
  );
  const seen = new Map<string, Seen>();
  /** size:mtime of each file as last processed. */
  const processed = new Map<string, string>();
  let updates = 0;
  let lastConfig = "";
  const skip = [outDir, options.manifestPath, options.settingsPath].filter((p): p is string => !!p);
  try {
    while (!options.signal.aborted) {
      const now = Date.now();
      const plan = await planInputs([options.dir], skip);
      const present = new Set(plan.files);
      for (const f of seen.keys()) if (!present.has(f)) seen.delete(f);
      const stable = new Map<string, string>();
      for (const f of plan.files) {
        const info = await Deno.stat(f).catch(() => undefined);
        if (!info) continue;
        const size = info.size, mtime = info.mtime?.getTime() ?? 0;
        const s = seen.get(f);
        if (!s || s.size !== size || s.mtime !== mtime) {
          seen.set(f, { size, mtime, since: now });
          continue;
        }
        if (now - s.since >= settleMs) stable.set(f, `${size}:${mtime}`);
      }
      // the sheet and settings are part of every result: an edit of either re-renders all
      const config = (await Promise.all(
        skip.slice(1).map((p) =>
          Deno.stat(p).then((i) => `${i.size}:${i.mtime?.getTime()}`, () => "-")
        ),
      )).join("|");
      const changed = [...stable].some(([f, sig]) => processed.get(f) !== sig) ||
        [...processed.keys()].some((f) => !present.has(f)) || config !== lastConfig;
      if (changed && stable.size > 0) {
        const fresh = new Set(
          [...stable].filter(([f, sig]) => processed.get(f) !== sig).map(
            ([f]) => f,
          ),
        );
        try {
          const summary = await runBatch({
            inputs: [options.dir],
            outDir,
            ...(options.manifestPath ? { manifestPath: options.manifestPath } : {}),
            ...(options.settingsPath ? { settingsPath: options.settingsPath } : {}),
            ...(options.workers ? { workers: options.workers } : {}),
            ...(options.plainJson ? { plainJson: true } : {}),
            accept: (f) => stable.has(f),
            onFile: (o) => {
              if (fresh.has(o.file)) options.onFile?.(o);
            },
            log,
          });
          updates++;
          options.onUpdate?.(summary);
        } catch (e) {
          if (updates === 0) throw e;
          log(`crystint: ${(e as Error).message}`);
        }
        processed.clear();
        for (const [f, sig] of stable) processed.set(f, sig);
        lastConfig = config;
      }
      await sleep(pollMs, options.signal);
    }
  } finally {
    await lock.release();
  }
  return updates;
}

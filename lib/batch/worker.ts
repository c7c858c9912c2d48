/// <reference lib="deno.worker" />
/**
 * Batch worker: computes the results of one file per message (see lib/analysis) and sends
 * them back as JSON text, so a result too large to serialise fails only its own file.
 *
 * @module
 */
import { analyseFile } from "../analysis/analyse_sample.ts";
import type { SampleSettings } from "../analysis/sample_settings.ts";
import { InputError } from "../io/input_error.ts";

/** A job sent to the worker. */
export interface WorkerJob {
  id: number;
  file: string;
  bytes: Uint8Array<ArrayBuffer>;
  settings: SampleSettings;
}

self.onmessage = (event: MessageEvent<WorkerJob>) => {
  const { id, file, bytes, settings } = event.data;
  try {
    const results = analyseFile(bytes, file, settings);
    let json: string;
    try {
      json = JSON.stringify(results);
    } catch (e) {
      throw new RangeError(`results too large to store (${(e as Error).message})`);
    }
    self.postMessage({ id, ok: true, json, count: results.length });
  } catch (e) {
    const error = e instanceof InputError
      ? { message: e.message, problem: e.problem, line: e.line ?? null }
      : { message: `${file}: ${(e as Error).message}`, problem: "processing", line: null };
    self.postMessage({ id, ok: false, error });
  }
};

// the modules are loaded: the pool counts a job's time budget from here
self.postMessage({ ready: true });

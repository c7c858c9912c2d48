/**
 * The per-file result cache: OUT/.cache/<key>.json, key = SHA-256 of (file bytes, path,
 * per-file settings, version), written atomically.
 *
 * @module
 */
import { VERSION } from "../version.ts";
import type { SampleResult } from "../analysis/sample_result.ts";
import type { SampleSettings } from "../analysis/sample_settings.ts";
import { writeTextAtomic } from "./atomic_write.ts";
import { sha256Hex, stableJson } from "./hash.ts";

/** The cache file of one input under its settings. */
export async function cacheFileFor(
  cacheDir: string,
  file: string,
  bytes: Uint8Array,
  settings: SampleSettings,
): Promise<{ key: string; path: string }> {
  // The path is part of the key: results carry the file and the sample name derived from it.
  const key = await sha256Hex(
    `${await sha256Hex(bytes)}|${file}|${stableJson(settings)}|${VERSION}`,
  );
  return { key, path: `${cacheDir}/${key}.json` };
}

/** The cached results, or undefined when the entry is missing or unreadable. */
export async function readCached(path: string): Promise<SampleResult[] | undefined> {
  try {
    const parsed = JSON.parse(await Deno.readTextFile(path));
    return Array.isArray(parsed.results) ? parsed.results : undefined;
  } catch {
    return undefined;
  }
}

/** Stores the results of one input. */
export async function writeCached(
  path: string,
  file: string,
  key: string,
  results: SampleResult[],
): Promise<void> {
  await writeTextAtomic(path, JSON.stringify({ file, key, version: VERSION, results }));
}

/** Stores the results of one input given as JSON text (as the worker sends them). */
export async function writeCachedJson(
  path: string,
  file: string,
  key: string,
  resultsJson: string,
): Promise<void> {
  await writeTextAtomic(
    path,
    `{"file":${JSON.stringify(file)},"key":${JSON.stringify(key)},"version":${
      JSON.stringify(VERSION)
    },"results":${resultsJson}}`,
  );
}

/**
 * Re-renders index.html from a saved results.json, through the same builder the batch uses,
 * so the page is the batch's page byte for byte.
 *
 * @module
 */
import type { ReportHeader, ResultsDocument } from "../analysis/results_document.ts";
import { type SharedTables, unpackResults } from "../analysis/results_packing.ts";
import { renderResultsParts } from "../report/report_input.ts";
import { readChartBundle } from "./chart_bundle.ts";
import { writeChunksAtomic } from "./atomic_write.ts";
import { SettingsError } from "./settings_schema.ts";
import { readTextLimited } from "./read_limited.ts";
import { parseFailure } from "./read_settings.ts";
import { OutputError } from "./output_error.ts";

/** Largest results.json re-rendered, bytes (near the longest string the engine can hold). */
export const MAX_RESULTS_BYTES = 512 * 1024 * 1024;

/** The report block of a results file, keeping only text fields of the known names. */
function reportHeaderOf(v: unknown): ReportHeader | undefined {
  if (!v || typeof v !== "object") return undefined;
  const o = v as Record<string, unknown>;
  const text = (k: string) => (typeof o[k] === "string" ? { [k]: o[k] as string } : {});
  return {
    ...text("title"),
    ...text("lab"),
    ...text("client"),
    ...text("operator"),
    ...text("note"),
    date: typeof o.date === "string" ? o.date : "",
    audience: o.audience === "client" ? "client" : "internal",
  };
}

/** Checks the shape of a parsed results document. */
function checkResults(
  parsed: unknown,
  resultsPath: string,
): ResultsDocument & { shared?: SharedTables } {
  const doc = parsed as Partial<ResultsDocument> & { shared?: SharedTables } | null;
  if (
    !doc || typeof doc !== "object" || !Array.isArray(doc.samples) || !Array.isArray(doc.errors)
  ) {
    throw new SettingsError(
      `${resultsPath} is not a crystint results file (needs "samples" and "errors")`,
    );
  }
  const shared = doc.shared;
  if (
    shared !== undefined &&
    (!shared || !Array.isArray(shared.shapes) || !Array.isArray(shared.catalogue))
  ) {
    throw new SettingsError(`${resultsPath} has a "shared" block without shapes and catalogue`);
  }
  return {
    version: typeof doc.version === "string" ? doc.version : "unknown",
    settings: doc.settings ?? null,
    settingsSummary: doc.settingsSummary && typeof doc.settingsSummary === "object"
      ? doc.settingsSummary
      : {},
    calibrations: Array.isArray(doc.calibrations) ? doc.calibrations : [],
    detailLimit: typeof doc.detailLimit === "number" ? doc.detailLimit : 2000,
    ...(doc.report ? { report: reportHeaderOf(doc.report)! } : {}),
    samples: doc.samples,
    errors: doc.errors,
    manifest: Array.isArray(doc.manifest) ? doc.manifest : [],
    ...(shared ? { shared } : {}),
  };
}

/**
 * Reads results.json and writes DIR/index.html; returns the page's path.
 *
 * @throws {SettingsError} When the results file cannot be read or is not crystint results.
 */
export async function reportFromResults(resultsPath: string, outDir: string): Promise<string> {
  let text: string;
  try {
    text = await readTextLimited(resultsPath, MAX_RESULTS_BYTES);
  } catch (e) {
    throw new SettingsError(`Cannot read results ${(e as Error).message}`);
  }
  let parsed: unknown;
  try {
    parsed = JSON.parse(text);
  } catch (e) {
    throw new SettingsError(`Cannot read results ${resultsPath}: ${parseFailure(e, text)}`);
  }
  const doc = checkResults(parsed, resultsPath);
  let html: string[];
  try {
    html = renderResultsParts(unpackResults(doc), await readChartBundle());
  } catch (e) {
    throw new SettingsError(
      `${resultsPath} holds results the report cannot show: ${(e as Error).message}`,
    );
  }
  const out = `${outDir.replace(/\/$/, "")}/index.html`;
  try {
    await Deno.mkdir(outDir, { recursive: true });
    await writeChunksAtomic(out, html);
  } catch (e) {
    // one line naming the path and the cause (exit code 1), as for the batch
    throw new SettingsError(new OutputError(out, e).message);
  }
  return out;
}

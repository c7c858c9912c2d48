/**
 * Re-renders index.html from a saved results.json.
 *
 * @module
 */
import {
  locusForReport,
  type ReportDetail,
  reportDetail,
  reportRow,
} from "../report/report_data.ts";
import { renderReport } from "../report/render_report.ts";
import { readChartBundle } from "./chart_bundle.ts";
import { writeTextAtomic } from "./atomic_write.ts";
import { SettingsError } from "./settings.ts";
import type { SampleResult } from "./sample_result.ts";

/**
 * Reads results.json and writes DIR/index.html.
 *
 * @throws {SettingsError} When the results file cannot be read or is not crystint results.
 */
export async function reportFromResults(
  resultsPath: string,
  outDir: string,
  detailLimit = 2000,
): Promise<string> {
  let parsed: {
    version?: string;
    samples?: SampleResult[];
    errors?: { file: string; message: string }[];
    manifest?: string[];
    settings?: Record<string, unknown>;
  };
  try {
    parsed = JSON.parse(await Deno.readTextFile(resultsPath));
  } catch (e) {
    throw new SettingsError(`Cannot read results ${resultsPath}: ${(e as Error).message}`);
  }
  if (!Array.isArray(parsed.samples) || !Array.isArray(parsed.errors)) {
    throw new SettingsError(
      `${resultsPath} is not a crystint results file (needs "samples" and "errors")`,
    );
  }
  const details: Record<number, ReportDetail> = {};
  const rows = parsed.samples.map((s, i) => {
    if (i < detailLimit) details[i] = reportDetail(s);
    return reportRow(s, i);
  });
  const html = renderReport({
    version: parsed.version ?? "unknown",
    settingsSummary: { source: resultsPath },
    rows,
    details,
    detailLimit,
    errors: parsed.errors,
    manifestNotes: parsed.manifest ?? [],
    locus: locusForReport(),
  }, await readChartBundle());
  await Deno.mkdir(outDir, { recursive: true });
  const out = `${outDir.replace(/\/$/, "")}/index.html`;
  await writeTextAtomic(out, html);
  return out;
}

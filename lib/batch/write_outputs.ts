/**
 * Writes a batch's three outputs from the cached results, streaming so memory does not grow
 * with the batch: results.json first, then results.csv, then index.html rendered through the
 * same report builder `crystint report` uses. All three go to temporaries first and are renamed
 * into place only when every one is complete, so a failure (disk full, permission) leaves the
 * previous outputs as they were: all replaced or none.
 *
 * @module
 */
import type { SampleResult } from "../analysis/sample_result.ts";
import type { ResultsError, ResultsHeader } from "../analysis/results_document.ts";
import { ReportInputBuilder } from "../report/report_input.ts";
import { renderReport } from "../report/render_report.ts";
import { writeChunksToTemp } from "./atomic_write.ts";
import { readChartBundle } from "./chart_bundle.ts";
import { resultsCsvHeader, resultsCsvRows } from "./results_csv.ts";
import { OutputError } from "./output_error.ts";

/** Where the outputs go. */
export interface OutputPaths {
  /** results.csv */
  csv: string;
  /** results.json */
  json: string;
  /** index.html */
  html: string;
}

/** The three output paths in a folder. */
export function outputPaths(outDir: string): OutputPaths {
  return {
    csv: `${outDir}/results.csv`,
    json: `${outDir}/results.json`,
    html: `${outDir}/index.html`,
  };
}

/** A source of the sample results in input order, read afresh on each call. */
export type ResultSource = () => AsyncIterable<SampleResult>;

/**
 * Writes results.json, results.csv and index.html; returns the number of samples.
 *
 * The page is rendered from the same records results.json holds, so re-rendering that file
 * gives the same page byte for byte.
 */
export async function writeOutputs(
  paths: OutputPaths,
  header: ResultsHeader,
  results: ResultSource,
  errors: ResultsError[],
  manifestNotes: string[],
  extraColumns: string[],
): Promise<number> {
  const builder = new ReportInputBuilder(header);
  let samples = 0;
  async function* jsonChunks() {
    const { version, settings, settingsSummary, calibrations, detailLimit, report } = header;
    yield `{"version":${JSON.stringify(version)},"settings":${JSON.stringify(settings)},` +
      `"settingsSummary":${JSON.stringify(settingsSummary)},` +
      `"calibrations":${JSON.stringify(calibrations)},"detailLimit":${detailLimit},` +
      `${report ? `"report":${JSON.stringify(report)},` : ""}"samples":[`;
    let first = true;
    for await (const result of results()) {
      yield `${first ? "" : ","}\n${JSON.stringify(result)}`;
      first = false;
      samples++;
      builder.add(result);
    }
    yield `\n],"errors":${JSON.stringify(errors)},"manifest":${JSON.stringify(manifestNotes)}}\n`;
  }
  const temps: [string, string][] = [];
  try {
    temps.push([await writeChunksToTemp(paths.json, jsonChunks()), paths.json]);
    const csvChunks = async function* () {
      yield resultsCsvHeader(extraColumns);
      for await (const result of results()) yield resultsCsvRows(result, extraColumns);
    };
    temps.push([await writeChunksToTemp(paths.csv, csvChunks()), paths.csv]);
    const html = renderReport(builder.finish(errors, manifestNotes), await readChartBundle());
    temps.push([await writeChunksToTemp(paths.html, [html]), paths.html]);
    for (const [tmp, path] of temps) await Deno.rename(tmp, path);
  } catch (e) {
    for (const [tmp] of temps) await Deno.remove(tmp).catch(() => {});
    throw new OutputError(temps.length < 3 ? pathBeingWritten(paths, temps.length) : paths.html, e);
  }
  return samples;
}

function pathBeingWritten(paths: OutputPaths, done: number): string {
  return [paths.json, paths.csv, paths.html][done]!;
}

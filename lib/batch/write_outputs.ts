/**
 * Writes a batch's three outputs from the cached results, streaming so memory does not grow
 * with the batch: results.json and results.csv in one pass, then index.html rendered through the
 * same report builder `crystint report` uses. All three go to temporaries first and are renamed
 * into place only when every one is complete, so a failure (disk full, permission) leaves the
 * previous outputs as they were: all replaced or none.
 *
 * @module
 */
import type { SampleResult } from "../analysis/sample_result.ts";
import type { ResultsError, ResultsHeader } from "../analysis/results_document.ts";
import { plainResult, ResultsPacker, unpackSample } from "../analysis/results_packing.ts";
import { ReportInputBuilder } from "../report/report_input.ts";
import { renderReportParts } from "../report/render_report.ts";
import { openTemp, type TempWriter, writeChunksToTemp } from "./atomic_write.ts";
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

/** A source of the sample results in input order (read once). */
export type ResultSource = () => AsyncIterable<SampleResult>;

/**
 * Writes results.json, results.csv and index.html; returns the number of samples.
 *
 * results.json holds the samples packed (`results_packing.ts`), or as they are with `plain`;
 * the page is rendered from the records results.json holds (unpacked), so re-rendering that file
 * gives the same page byte for byte.
 */
export async function writeOutputs(
  paths: OutputPaths,
  header: ResultsHeader,
  results: ResultSource,
  errors: ResultsError[],
  manifestNotes: string[],
  extraColumns: string[],
  plain = false,
): Promise<number> {
  const builder = new ReportInputBuilder(header);
  let samples = 0;
  const temps: [string, string][] = [];
  // results.json and results.csv are written in one pass over the cached results
  const writers: [TempWriter, string][] = [];
  try {
    const json = await openTemp(paths.json);
    writers.push([json, paths.json]);
    const csv = await openTemp(paths.csv);
    writers.push([csv, paths.csv]);
    const { version, settings, settingsSummary, calibrations, detailLimit, report } = header;
    await json.write(
      `{"version":${JSON.stringify(version)},"settings":${JSON.stringify(settings)},` +
        `"settingsSummary":${JSON.stringify(settingsSummary)},` +
        `"calibrations":${JSON.stringify(calibrations)},"detailLimit":${detailLimit},` +
        `${report ? `"report":${JSON.stringify(report)},` : ""}"samples":[`,
    );
    await csv.write(resultsCsvHeader(extraColumns));
    const packer = new ResultsPacker();
    for await (const result of results()) {
      const stored = plain ? plainResult(result) : packer.pack(result);
      await json.write(`${samples === 0 ? "" : ","}\n${JSON.stringify(stored)}`);
      await csv.write(resultsCsvRows(result, extraColumns));
      samples++;
      // the page is drawn from what results.json holds, as `crystint report` reads it back
      builder.add(
        plain
          ? stored as SampleResult
          : unpackSample(stored as Record<string, unknown>, packer.shared),
      );
    }
    await json.write(
      `\n],"errors":${JSON.stringify(errors)},"manifest":${JSON.stringify(manifestNotes)}` +
        (plain ? "}\n" : `,"shared":${JSON.stringify(packer.shared)}}\n`),
    );
    for (const [w, path] of writers.splice(0)) temps.push([await w.finish(), path]);
    const html = renderReportParts(builder.finish(errors, manifestNotes), await readChartBundle());
    temps.push([await writeChunksToTemp(paths.html, html), paths.html]);
    for (const [tmp, path] of temps) await Deno.rename(tmp, path);
  } catch (e) {
    for (const [w] of writers) await w.abandon();
    for (const [tmp] of temps) await Deno.remove(tmp).catch(() => {});
    throw new OutputError(temps.length < 3 ? pathBeingWritten(paths, temps.length) : paths.html, e);
  }
  return samples;
}

function pathBeingWritten(paths: OutputPaths, done: number): string {
  return [paths.json, paths.csv, paths.html][done]!;
}

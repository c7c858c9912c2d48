/**
 * A batch run: plan the inputs, join the sample sheet, reuse cached results (content hash of
 * the file + hash of its settings + version), compute the rest in a worker pool, and write
 * results.csv, results.json and index.html atomically. One bad file never stops the batch.
 *
 * @module
 */
import { stringify } from "csv-stringify/sync";
import { VERSION } from "../version.ts";
import { removeStaleTemporaries, writeChunksAtomic, writeTextAtomic } from "./atomic_write.ts";
import { sha256Hex, stableJson } from "./hash.ts";
import { type ManifestRow, matchRow, readManifest } from "./manifest.ts";
import { planInputs } from "./plan_inputs.ts";
import { type SampleResult, type SampleSettings, sampleSettings } from "./sample_result.ts";
import {
  type BatchSettings,
  defaultSettings,
  readSettingsFile,
  SettingsError,
} from "./settings.ts";
import type { Calibration } from "../dopant/linear_calibration.ts";
import { WorkerPool } from "./pool.ts";
import { readChartBundle } from "./chart_bundle.ts";
import {
  locusForReport,
  type ReportDetail,
  reportDetail,
  type ReportRow,
  reportRow,
} from "../report/report_data.ts";
import { renderReport, ROW_LIMIT } from "../report/render_report.ts";
import { readSpectrumFile } from "../io/read_file.ts";
import { transmittanceForPath } from "../optics/path_transmittance.ts";
import { spectrumColour } from "../cie/spectrum_colour.ts";

/** What to run. */
export interface BatchOptions {
  inputs: string[];
  outDir: string;
  manifestPath?: string;
  settingsPath?: string;
  /** Settings given directly (used when no settings file is named). */
  settings?: BatchSettings;
  workers?: number;
  onProgress?: (done: number, total: number) => void;
  log?: (message: string) => void;
  /** Charts are embedded for at most this many samples (the rest stay in results.json). */
  detailLimit?: number;
}

/** A failed input. */
export interface BatchError {
  file: string;
  message: string;
  problem?: string;
  line?: number | null;
}

/** What the run did. */
export interface BatchSummary {
  files: number;
  samples: number;
  cached: number;
  computed: number;
  errors: BatchError[];
  manifestNotes: string[];
  outputs: { csv: string; json: string; html: string };
}

interface FileOutcome {
  file: string;
  cacheFile?: string;
  error?: BatchError;
}

const CSV_COLUMNS = [
  "sample",
  "file",
  "illuminant",
  "observer",
  "path (mm)",
  "thickness (mm)",
  "X",
  "Y",
  "Z",
  "x",
  "y",
  "u'",
  "v'",
  "L*",
  "a*",
  "b*",
  "C*ab",
  "h_ab (deg)",
  "dominant or complementary (nm)",
  "complementary",
  "excitation purity",
  "sRGB",
  "outside sRGB",
  "change dE00",
  "change dh (deg)",
  "target",
  "target dE00",
  "target pass",
  "target miss",
  "notes",
];

function csvRows(result: SampleResult): unknown[][] {
  const r4 = (v: number | null) => (v === null ? "" : Number(v.toFixed(4)));
  return result.colour.map((c) => [
    result.sample,
    result.file,
    c.illuminant,
    c.observer,
    c.pathMm ?? "",
    result.thicknessMm ?? "",
    r4(c.X),
    r4(c.Y),
    r4(c.Z),
    r4(c.x),
    r4(c.y),
    r4(c.uPrime),
    r4(c.vPrime),
    r4(c.L),
    r4(c.a),
    r4(c.b),
    r4(c.C),
    r4(c.h),
    c.dominantNm === null ? "" : Number(c.dominantNm.toFixed(1)),
    c.complementary,
    r4(c.purity),
    c.srgb,
    c.srgbOutOfGamut,
    r4(result.change.dE00),
    r4(result.change.dh),
    result.target?.name ?? "",
    result.target ? r4(result.target.dE00) : "",
    result.target?.pass ?? "",
    result.target?.words ?? "",
    result.notes,
    ...Object.values(result.extra),
  ]);
}

async function readCached(path: string): Promise<SampleResult[] | undefined> {
  try {
    const parsed = JSON.parse(await Deno.readTextFile(path));
    return Array.isArray(parsed.results) ? parsed.results : undefined;
  } catch {
    return undefined;
  }
}

/** Fills in the target colours of targets given as a reference spectrum. */
async function resolveTargetSpectra(settings: BatchSettings): Promise<void> {
  const all = [...(settings.target ? [settings.target] : []), ...Object.values(settings.targets)];
  for (const t of all) {
    if (!t.spectrum) continue;
    let spectrum;
    try {
      [spectrum] = await readSpectrumFile(t.spectrum);
    } catch (e) {
      throw new SettingsError(
        `Cannot read the target's reference spectrum: ${(e as Error).message}`,
      );
    }
    const values = transmittanceForPath(spectrum!, t.spectrumPathMm).values;
    const rows = spectrumColour(spectrum!, {
      illuminants: [t.illuminant, ...t.also.map((c) => c.illuminant)],
      observers: [t.observer],
      transmittance: values,
    });
    [t, ...t.also].forEach((c, i) =>
      Object.assign(c, { L: rows[i]!.L, a: rows[i]!.a, b: rows[i]!.b })
    );
  }
}

/**
 * Runs a batch.
 *
 * @throws {SettingsError} For an unreadable settings file or manifest (exit code 1).
 */
export async function runBatch(options: BatchOptions): Promise<BatchSummary> {
  const log = options.log ?? (() => {});
  const settings = options.settingsPath
    ? await readSettingsFile(options.settingsPath)
    : options.settings ?? defaultSettings();
  const rows: ManifestRow[] = options.manifestPath ? await readManifest(options.manifestPath) : [];
  await resolveTargetSpectra(settings);
  const calibrations: Record<string, Calibration> = {};
  const named = {
    ...settings.calibrations,
    ...(settings.calibration ? { default: settings.calibration } : {}),
  };
  for (const [name, path] of Object.entries(named)) {
    try {
      const parsed = JSON.parse(await Deno.readTextFile(path));
      if (parsed.kind !== "crystint-calibration") {
        throw new Error("not a crystint calibration file");
      }
      calibrations[name] = parsed;
    } catch (e) {
      throw new SettingsError(
        `Cannot read calibration "${name}" (${path}): ${(e as Error).message}`,
      );
    }
  }
  const outDir = options.outDir.replace(/\/$/, "");
  const cacheDir = `${outDir}/.cache`;
  await Deno.mkdir(cacheDir, { recursive: true });
  await removeStaleTemporaries(outDir);
  await removeStaleTemporaries(cacheDir);
  const skip = [outDir, options.manifestPath, options.settingsPath].filter((p): p is string => !!p);
  const plan = await planInputs(options.inputs, skip);
  const errors: BatchError[] = plan.missing.map((m) => ({
    file: m,
    message: `${m}: no such file, folder or match`,
  }));
  const manifestNotes: string[] = [];
  const usedRows = new Set<ManifestRow>();

  const outcomes: FileOutcome[] = plan.files.map((file) => ({ file }));
  const pool = plan.files.length > 0 ? new WorkerPool(options.workers) : undefined;
  let done = 0, cached = 0, computed = 0;
  const total = plan.files.length;
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
        perFile = sampleSettings(settings, row, calibrations);
      } catch (e) {
        outcome.error = { file, message: `${file}: ${(e as Error).message}` };
        options.onProgress?.(++done, total);
        continue;
      }
      // The path is part of the key: results carry the file and the sample name derived from it.
      const key = await sha256Hex(
        `${await sha256Hex(bytes)}|${file}|${stableJson(perFile)}|${VERSION}`,
      );
      const cacheFile = `${cacheDir}/${key}.json`;
      if (await readCached(cacheFile)) {
        outcome.cacheFile = cacheFile;
        cached++;
        options.onProgress?.(++done, total);
        continue;
      }
      const job = pool!.run(file, bytes, perFile).then(async (result) => {
        if (result.ok) {
          await writeTextAtomic(
            cacheFile,
            JSON.stringify({ file, key, version: VERSION, results: result.results }),
          );
          outcome.cacheFile = cacheFile;
          computed++;
        } else {
          outcome.error = { file, ...result.error };
        }
        options.onProgress?.(++done, total);
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
  for (const o of outcomes) if (o.error) errors.push(o.error);
  for (const n of manifestNotes) log(`crystint: ${n}`);

  // Outputs: stream results from the cache so memory does not grow with the batch.
  const extraColumns = [...new Set(rows.flatMap((r) => Object.keys(r.extra)))];
  const csvPath = `${outDir}/results.csv`,
    jsonPath = `${outDir}/results.json`,
    htmlPath = `${outDir}/index.html`;
  const reportRows: ReportRow[] = [];
  const placed: Record<string, { sample: string; x: number; y: number }[]> = {};
  let targeted = 0, passed = 0;
  const details: Record<number, ReportDetail> = {};
  const detailLimit = options.detailLimit ?? 2000;
  let samples = 0;
  async function* jsonChunks() {
    yield `{"version":${JSON.stringify(VERSION)},"settings":${
      JSON.stringify(settings)
    },"samples":[`;
    let first = true;
    for (const o of outcomes) {
      if (!o.cacheFile) continue;
      for (const result of (await readCached(o.cacheFile)) ?? []) {
        yield `${first ? "" : ","}\n${JSON.stringify(result)}`;
        first = false;
        const index = samples++;
        // only the rows the page shows are kept, so memory stays flat in large batches
        if (index < ROW_LIMIT) reportRows.push(reportRow(result, index));
        if (result.target) {
          targeted++;
          if (result.target.pass) passed++;
        }
        if (result.dopant && (placed[result.dopant.calibration] ??= []).length < 5000) {
          placed[result.dopant.calibration]!.push({
            sample: result.sample,
            x: result.dopant.concentration,
            y: result.dopant.response,
          });
        }
        if (index < detailLimit) details[index] = reportDetail(result);
      }
    }
    yield `\n],"errors":${
      JSON.stringify(
        errors.map(({ file, message, problem, line }) => ({ file, message, problem, line })),
      )
    },` +
      `"manifest":${JSON.stringify(manifestNotes)}}\n`;
  }
  await writeChunksAtomic(jsonPath, jsonChunks());
  async function* csvChunks() {
    yield stringify([[...CSV_COLUMNS, ...extraColumns]]);
    for (const o of outcomes) {
      if (!o.cacheFile) continue;
      for (const result of (await readCached(o.cacheFile)) ?? []) {
        const rowsOut = csvRows(result).map((r) => [
          ...r.slice(0, CSV_COLUMNS.length),
          ...extraColumns.map((k) => result.extra[k] ?? ""),
        ]);
        yield stringify(rowsOut);
      }
    }
  }
  await writeChunksAtomic(csvPath, csvChunks());
  const html = renderReport({
    version: VERSION,
    settingsSummary: {
      illuminants: settings.illuminants.join(", "),
      observers: settings.observers.map((o) => `${o}°`).join(", "),
      change: `${settings.change.from} → ${settings.change.to}, ${settings.change.observer}°${
        settings.change.adapt === "none" ? "" : `, ${settings.change.adapt}`
      }`,
      surfaces: settings.reflection === "host"
        ? `Fresnel (${settings.host ?? (settings.n ? `n ${settings.n}` : "per sample")})`
        : "Beer–Lambert only",
    },
    rows: reportRows,
    totals: { samples, targeted, passed },
    details,
    detailLimit,
    errors: errors.map(({ file, message }) => ({ file, message })),
    manifestNotes,
    locus: locusForReport(),
    calibrations: Object.entries(calibrations).map(([name, c]) => ({
      name,
      unit: c.unit,
      metric: c.metric,
      slope: c.slope,
      intercept: c.intercept,
      r2: c.r2,
      lod: c.lod,
      standards: c.points.map((p) => ({ sample: p.sample ?? "", x: p.x, y: p.y })),
      samples: placed[name] ?? [],
    })),
  }, await readChartBundle());
  await writeTextAtomic(htmlPath, html);
  return {
    files: total,
    samples,
    cached,
    computed,
    errors,
    manifestNotes,
    outputs: { csv: csvPath, json: jsonPath, html: htmlPath },
  };
}

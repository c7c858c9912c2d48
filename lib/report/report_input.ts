/**
 * The report's input builder: takes the results header and the sample results one at a time
 * (so a large batch streams through it) and gives the data the page is rendered from. Batch
 * and `report` both render through it, so the page depends on the results alone.
 *
 * @module
 */
import type { SampleResult } from "../analysis/sample_result.ts";
import type { ResultsError, ResultsHeader } from "../analysis/results_document.ts";
import {
  fileLabel,
  locusForReport,
  type ReportCalibration,
  type ReportDetail,
  reportDetail,
  type ReportInput,
  type ReportRow,
  reportRow,
} from "./report_data.ts";
import { renderReportParts, ROW_LIMIT } from "./render_report.ts";

/** Most samples placed on one calibration plot. */
const PLACED_LIMIT = 5000;

/** Most distinct uncertainty notes and rules the methods list (each said once). */
const NOTE_LIMIT = 12;

/** Collects what the page shows, keeping only the rows and details the page embeds. */
export class ReportInputBuilder {
  readonly #header: ResultsHeader;
  readonly #rows: ReportRow[] = [];
  readonly #details: Record<number, ReportDetail> = {};
  readonly #placed = new Map<string, { sample: string; x: number; y: number }[]>();
  #samples = 0;
  #targeted = 0;
  #passed = 0;
  #observers = new Set<string>();
  #uncertaintyNotes = new Set<string>();
  #verdicts = { pass: 0, undecided: 0, fail: 0 };

  /** @param header The results header (settings summary, calibrations, limits). */
  constructor(header: ResultsHeader) {
    this.#header = header;
  }

  /** Adds the next sample result, in results order. */
  add(result: SampleResult): void {
    const index = this.#samples++;
    for (const row of result.color) this.#observers.add(row.observer);
    if (index < ROW_LIMIT) this.#rows.push(reportRow(result, index));
    if (index < this.#header.detailLimit) this.#details[index] = reportDetail(result);
    const notes = [
      ...(result.target?.rule ? [`Verdict: ${result.target.rule}.`] : []),
      ...(result.uncertainty?.notes ?? []).map((n) => `Uncertainty: ${n}.`),
    ];
    for (const n of notes) {
      if (this.#uncertaintyNotes.size < NOTE_LIMIT) this.#uncertaintyNotes.add(n);
    }
    if (result.target?.verdict) this.#verdicts[result.target.verdict]++;
    if (result.target) {
      this.#targeted++;
      if (result.target.pass) this.#passed++;
    }
    const d = result.dopant;
    if (d) {
      const list = this.#placed.get(d.calibration) ?? [];
      this.#placed.set(d.calibration, list);
      if (list.length < PLACED_LIMIT) {
        list.push({ sample: result.sample, x: d.concentration, y: d.response });
      }
    }
  }

  /** The report input, once every sample has been added. */
  finish(errors: ResultsError[], manifestNotes: string[]): ReportInput {
    const calibrations: ReportCalibration[] = this.#header.calibrations.map((c) => ({
      ...c,
      samples: this.#placed.get(c.name) ?? [],
    }));
    const xyObserver = this.#observers.has("2") || this.#observers.size === 0
      ? "2"
      : [...this.#observers].sort()[0]!;
    return {
      version: this.#header.version,
      report: this.#header.report ?? null,
      settingsSummary: this.#header.settingsSummary,
      rows: this.#rows,
      totals: { samples: this.#samples, targeted: this.#targeted, passed: this.#passed },
      details: this.#details,
      detailLimit: this.#header.detailLimit,
      errors: errors.map(({ file, message }) => ({
        file: fileLabel(file),
        message: withoutFolders(message, file),
      })),
      manifestNotes,
      loci: { [xyObserver]: locusForReport(xyObserver) },
      xyObserver,
      calibrations,
      ...(this.#uncertaintyNotes.size ? { uncertaintyNotes: [...this.#uncertaintyNotes] } : {}),
      ...(Object.values(this.#verdicts).some((v) => v > 0) ? { verdicts: this.#verdicts } : {}),
    };
  }
}

/** A message with the folders of its file removed (the page names files by name alone). */
function withoutFolders(message: string, file: string): string {
  const cut = Math.max(file.lastIndexOf("/"), file.lastIndexOf("\\"));
  return cut < 0 ? message : message.split(file.slice(0, cut + 1)).join("");
}

/** The results document a page is rendered from. */
type WholeResults = ResultsHeader & {
  samples: SampleResult[];
  errors: ResultsError[];
  manifest: string[];
};

/** Renders the page of a whole results document (what `crystint report` does), in parts. */
export function renderResultsParts(doc: WholeResults, chartJs: string): string[] {
  const builder = new ReportInputBuilder(doc);
  for (const s of doc.samples) builder.add(s);
  return renderReportParts(builder.finish(doc.errors, doc.manifest), chartJs);
}

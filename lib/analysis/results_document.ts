/**
 * The results document (results.json): a header saying how the run was set up, the sample
 * results, and the failed inputs. It carries everything the report shows, so the page can be
 * rendered again from this file alone.
 *
 * @module
 */
import type { SampleResult } from "./sample_result.ts";

/** A calibration used in the run, as the report shows it. */
export interface CalibrationSummary {
  /** Name the settings give it. */
  name: string;
  /** Concentration unit. */
  unit: string;
  /** Response metric. */
  metric: string;
  /** Slope of the line. */
  slope: number;
  /** Intercept of the line. */
  intercept: number;
  /** Coefficient of determination. */
  r2: number;
  /** Limit of detection. */
  lod: number;
  /** The standards it was made from. */
  standards: { sample: string; x: number; y: number }[];
}

/** A failed input. */
export interface ResultsError {
  /** The file. */
  file: string;
  /** What went wrong, naming file and line. */
  message: string;
  /** The problem alone. */
  problem?: string;
  /** The line, when known. */
  line?: number | null;
}

/** Who the report is for and what it says about itself (the settings' `report:` block). */
export interface ReportHeader {
  /** Report title (default: "Colour report"). */
  title?: string;
  /** Laboratory or workshop issuing the report. */
  lab?: string;
  /** Client the report is for. */
  client?: string;
  /** Person who measured. */
  operator?: string;
  /** Free note shown under the title. */
  note?: string;
  /** Report date as written (default: the run's date, YYYY-MM-DD, recorded so re-renders match). */
  date: string;
  /** `internal` shows the full workshop cautions; `client` the short measurement caution only. */
  audience: "internal" | "client";
}

/** The header of a results document: everything but the samples and the errors. */
export interface ResultsHeader {
  /** crystint version that computed the results. */
  version: string;
  /** The run's settings as resolved (for the record). */
  settings: unknown;
  /** The settings line of the report: illuminants, observers, change, surfaces. */
  settingsSummary: Record<string, string>;
  /** Calibrations used. */
  calibrations: CalibrationSummary[];
  /** Charts are embedded for at most this many samples. */
  detailLimit: number;
  /** Title, lab, client, date and audience of the report (absent in older results files). */
  report?: ReportHeader;
}

/** The whole results document. */
export interface ResultsDocument extends ResultsHeader {
  /** One result per spectrum, in input order. */
  samples: SampleResult[];
  /** Inputs that failed. */
  errors: ResultsError[];
  /** Notes about the sample sheet (unmatched rows, unlisted files). */
  manifest: string[];
}

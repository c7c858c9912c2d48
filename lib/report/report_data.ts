/**
 * The report's view of batch results: one small summary row per sample (always) and a detail
 * record per sample (charts data), both plain JSON.
 *
 * @module
 */
import type { SampleResult } from "../analysis/sample_result.ts";
import type { CalibrationSummary, ReportHeader } from "../analysis/results_document.ts";
import { roundTo } from "../numeric/round.ts";
import { spectralLocus } from "../cie/dominant_wavelength.ts";

/** One line of the summary table. */
export interface ReportRow {
  index: number;
  sample: string;
  file: string;
  from: string;
  to: string;
  observer: string;
  pathMm: number | null;
  lchFrom: [number, number, number];
  lchTo: [number, number, number];
  swatchFrom: string;
  swatchTo: string;
  dE00: number;
  dh: number;
  marked: boolean;
  target: { name: string; pass: boolean; dE00: number; words: string } | null;
  dopant: string | null;
  warnings: string[];
  notes: string;
  outOfGamut: boolean;
}

/** Chart data for one sample. */
export interface ReportDetail {
  sample: string;
  file: string;
  plot: { nm: number[]; t: number[] };
  bands: {
    nm: number[];
    data: number[];
    model: number[];
    residual: number[];
    ordinate: string;
    table: {
      centerNm: number;
      centerNmSigma: number;
      fwhmCm1: number;
      height: number;
      assignment: string;
    }[];
  } | null;
  series:
    | { pathMm: number[]; L: number[]; C: number[]; srgb: string[]; maxChromaPathMm: number }
    | null;
  /** Chromaticity under each illuminant and observer, with that white's chromaticity. */
  xy: { illuminant: string; observer: string; x: number; y: number; wx: number; wy: number }[];
  abFrom: [number, number];
  abTo: [number, number];
  color: {
    illuminant: string;
    observer: string;
    L: number;
    a: number;
    b: number;
    C: number;
    h: number;
    srgb: string;
    outOfGamut: boolean;
    dominantNm: number | null;
    complementary: boolean;
    purity: number | null;
  }[];
  extra: Record<string, string>;
  thicknessMm: number | null;
  polarisation: string | null;
  host: string | null;
}

/** Everything the report is rendered from. */
export interface ReportInput {
  version: string;
  settingsSummary: Record<string, string>;
  rows: ReportRow[];
  /** Detail records by row index (possibly for only the first `detailLimit` rows). */
  details: Record<number, ReportDetail>;
  detailLimit: number;
  errors: { file: string; message: string }[];
  manifestNotes: string[];
  /** Spectral loci by observer ("2", "10"), for the chromaticity diagrams. */
  loci: Record<string, { nm: number[]; x: number[]; y: number[] }>;
  /** The observer the chromaticity diagrams use: 2° when computed, else the one there is. */
  xyObserver: string;
  /** Title, lab, client, date, audience; null for results files written before they existed. */
  report: ReportHeader | null;
  /** Calibrations used, with their standards and the samples placed on them. */
  calibrations?: ReportCalibration[];
  /**
   * Counts over all samples, when `rows` holds only the first of them (large batches keep
   * at most the rows the page shows); default: counted from `rows`.
   */
  totals?: { samples: number; targeted: number; passed: number };
}

/** A calibration line for the report's calibration plot. */
export interface ReportCalibration extends CalibrationSummary {
  /** The samples placed on the line: their estimate and response. */
  samples: { sample: string; x: number; y: number }[];
}

const r = (v: number | null, d = 2): number => (typeof v === "number" ? roundTo(v, d) : NaN);

const precision = (v: number | null, digits: number) =>
  typeof v === "number" && Number.isFinite(v) ? v.toPrecision(digits) : "?";

/** The summary row of a sample result. */
export function reportRow(result: SampleResult, index: number): ReportRow {
  const c = result.change;
  return {
    index,
    sample: result.sample,
    file: fileLabel(result.file),
    from: c.from,
    to: c.to,
    observer: c.observer,
    pathMm: result.pathMm,
    lchFrom: [r(c.labFrom.L), r(c.chromaFrom), r(c.hueFrom, 1)],
    lchTo: [r(c.labTo.L), r(c.chromaTo), r(c.hueTo, 1)],
    swatchFrom: c.swatchFrom,
    swatchTo: c.swatchTo,
    dE00: r(c.dE00),
    dh: r(c.dh, 1),
    marked: c.marked,
    target: result.target
      ? {
        name: result.target.name,
        pass: result.target.pass,
        dE00: r(result.target.dE00),
        words: result.target.words,
      }
      : null,
    dopant: result.dopant
      ? `${precision(result.dopant.concentration, 3)} ± ${
        precision(result.dopant.sigma, 2)
      } ${result.dopant.unit}${result.dopant.outsideRange ? " (outside calibration)" : ""}`
      : null,
    warnings: result.warnings,
    notes: result.notes,
    outOfGamut: result.color.some((row) => row.srgbOutOfGamut),
  };
}

/** The chart data of a sample result. */
export function reportDetail(result: SampleResult): ReportDetail {
  const c = result.change;
  return {
    sample: result.sample,
    file: fileLabel(result.file),
    plot: result.plot,
    bands: result.bands
      ? {
        nm: result.bands.curve.nm,
        model: result.bands.curve.model,
        residual: result.bands.curve.data.map((v, i) => r(v - result.bands!.curve.model[i]!, 5)),
        data: result.bands.curve.data,
        ordinate: result.bands.ordinate,
        table: result.bands.bands.map((b, i) => ({
          centerNm: r(b.centerNm, 1),
          centerNmSigma: r(b.centerNmSigma, 1),
          fwhmCm1: r(b.fwhmCm1, 0),
          height: r(b.height, 4),
          assignment: result.bands!.assignments.filter((a) => a.bandIndex === i).map((a) =>
            `${a.ion} ${a.transition} (score ${a.score.toFixed(2)})`
          )[0] ?? "",
        })),
      }
      : null,
    series: result.series
      ? {
        pathMm: result.series.points.map((p) => r(p.pathMm, 3)),
        L: result.series.points.map((p) => r(p.L)),
        C: result.series.points.map((p) => r(p.C)),
        srgb: result.series.points.map((p) => p.srgb),
        maxChromaPathMm: r(result.series.maxChromaPathMm, 2),
      }
      : null,
    xy: result.color.map((row) => {
      const sum = row.whiteX + row.whiteY + row.whiteZ;
      return {
        illuminant: row.illuminant,
        observer: row.observer,
        x: r(row.x, 5),
        y: r(row.y, 5),
        wx: r(row.whiteX / sum, 5),
        wy: r(row.whiteY / sum, 5),
      };
    }),
    abFrom: [r(c.labFrom.a), r(c.labFrom.b)],
    abTo: [r(c.labTo.a), r(c.labTo.b)],
    color: result.color.map((row) => ({
      illuminant: row.illuminant,
      observer: row.observer,
      L: r(row.L),
      a: r(row.a),
      b: r(row.b),
      C: r(row.C),
      h: r(row.h, 1),
      srgb: row.srgb,
      outOfGamut: row.srgbOutOfGamut,
      dominantNm: row.dominantNm === null ? null : r(row.dominantNm, 1),
      complementary: row.complementary,
      purity: row.purity === null ? null : r(row.purity, 3),
    })),
    extra: result.extra,
    thicknessMm: result.thicknessMm,
    polarisation: result.polarisation,
    host: result.host,
  };
}

/**
 * The file as the report shows it: its name alone, so a page sent out carries no folder
 * layout of the machine that made it.
 */
export function fileLabel(path: string): string {
  return path.split(/[\\/]/).pop() ?? path;
}

/** A spectral locus (CIE 15:2018, 1931 2° or 1964 10°), 380–700 nm, for the chromaticity diagram. */
export function locusForReport(observer = "2"): { nm: number[]; x: number[]; y: number[] } {
  const l = spectralLocus(observer);
  const keep = l.nm.map((nm, i) => (nm >= 380 && nm <= 700 ? i : -1)).filter((i) => i >= 0);
  return {
    nm: keep.map((i) => l.nm[i]!),
    x: keep.map((i) => r(l.x[i]!, 5)),
    y: keep.map((i) => r(l.y[i]!, 5)),
  };
}

/**
 * The report's view of batch results: one small summary row per sample (always) and a detail
 * record per sample (charts data), both plain JSON.
 *
 * @module
 */
import type { StoredAxis, StoredCurve } from "../analysis/chart_curves.ts";
import type { SampleResult } from "../analysis/sample_result.ts";
import type { CalibrationSummary, ReportHeader } from "../analysis/results_document.ts";
import { roundTo } from "../numeric/round.ts";
import { spectralLocus } from "../cie/dominant_wavelength.ts";
import { coverageEllipse } from "./ellipse.ts";
import { packCurve, packFitCurves } from "./packed_curve.ts";

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
  /** Standard uncertainties (k = 1) of L*, C*, h under each light and of ΔE00; null when off. */
  lchFromSd?: [number, number, number] | null;
  lchToSd?: [number, number, number] | null;
  dE00Sd?: number | null;
  dh: number;
  marked: boolean;
  target: {
    name: string;
    pass: boolean;
    dE00: number;
    words: string;
    /** Guard-banded verdict and pass probability, when uncertainties are on. */
    verdict?: "pass" | "fail" | "undecided";
    passProbability?: number;
  } | null;
  dopant: string | null;
  warnings: string[];
  notes: string;
  outOfGamut: boolean;
}

/** Chart data for one sample. */
export interface ReportDetail {
  sample: string;
  file: string;
  /** Transmittance; the axis as stored (from/step/count for equal steps: see `axisValues`). */
  plot: { nm: StoredAxis; t: StoredCurve };
  /** The band fit; the residual is data − model, formed where it is drawn. */
  bands: {
    nm: StoredAxis;
    data: StoredCurve;
    model: StoredCurve;
    ordinate: string;
    /** Stretches left out of the fit. */
    excluded?: { fromNm: number; toNm: number; reason: string }[];
    table: {
      centerNm: number;
      centerNmSigma: number;
      fwhmCm1: number;
      height: number;
      assignment: string;
    }[];
  } | null;
  series:
    | {
      pathMm: number[];
      L: number[];
      C: number[];
      srgb: string[];
      maxChromaPathMm: number;
      maxChromaAtRangeEnd: boolean;
    }
    | null;
  /** Chromaticity under each illuminant and observer, with that white's chromaticity. */
  xy: { illuminant: string; observer: string; x: number; y: number; wx: number; wy: number }[];
  abFrom: [number, number];
  abTo: [number, number];
  /** 95 % coverage ellipses of (a*, b*) under the two lights, when uncertainties are on. */
  ellipseFrom?: [number, number][] | null;
  ellipseTo?: [number, number][] | null;
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
    /** Standard uncertainties (k = 1), when uncertainties are on. */
    sd?: { L: number; C: number; h: number | null; a: number; b: number } | null;
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
  /** Counts of the guard-banded target verdicts over all samples, when uncertainties are on. */
  verdicts?: { pass: number; undecided: number; fail: number };
  /** The decision rules of the verdicts and the uncertainty sources, each said once. */
  uncertaintyNotes?: string[];
}

/** A calibration line for the report's calibration plot. */
export interface ReportCalibration extends CalibrationSummary {
  /** The samples placed on the line: their estimate and response. */
  samples: { sample: string; x: number; y: number }[];
}

const r = (v: number | null, d = 2): number => (typeof v === "number" ? roundTo(v, d) : NaN);

const precision = (v: number | null, digits: number) =>
  typeof v === "number" && Number.isFinite(v) ? v.toPrecision(digits) : "?";

/** The uncertainty row of a light under the change's observer. */
function sdRow(result: SampleResult, illuminant: string) {
  return result.uncertainty?.rows.find((u) =>
    u.illuminant === illuminant && u.observer === result.change.observer
  );
}

const lchSd = (u: ReturnType<typeof sdRow>): [number, number, number] | null =>
  u ? [r(u.LSd), r(u.CSd), r(u.hSd, 1)] : null;

/** The 95 % ellipse of (a*, b*) from the a*, b* block of a row's covariance. */
function abEllipse(u: ReturnType<typeof sdRow>, lab: { a: number; b: number }) {
  if (!u) return null;
  const m = u.labCovariance;
  return coverageEllipse([lab.a, lab.b], [[m[1]![1]!, m[1]![2]!], [m[2]![1]!, m[2]![2]!]], 0.95)
    .map(([a, b]) => [r(a), r(b)] as [number, number]);
}

/** The summary row of a sample result. */
export function reportRow(result: SampleResult, index: number): ReportRow {
  const c = result.change;
  const un = result.uncertainty;
  const t = result.target;
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
    ...(un
      ? {
        lchFromSd: lchSd(sdRow(result, c.from)),
        lchToSd: lchSd(sdRow(result, c.to)),
        dE00Sd: un.changeDE00Sd === null ? null : r(un.changeDE00Sd),
      }
      : {}),
    dh: r(c.dh, 1),
    marked: c.marked,
    target: t
      ? {
        name: t.name,
        pass: t.pass,
        dE00: r(t.dE00),
        words: t.words,
        ...(t.verdict ? { verdict: t.verdict } : {}),
        ...(t.passProbability === undefined ? {} : { passProbability: r(t.passProbability, 3) }),
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
  const un = result.uncertainty;
  return {
    sample: result.sample,
    file: fileLabel(result.file),
    plot: { nm: result.plot.nm, t: packCurve(result.plot.t) },
    bands: result.bands
      ? {
        nm: result.bands.curve.nm,
        ...packFitCurves(result.bands.curve.data, result.bands.curve.model),
        ordinate: result.bands.ordinate,
        excluded: result.bands.excluded.map((x) => ({
          fromNm: r(x.fromNm, 1),
          toNm: r(x.toNm, 1),
          reason: x.reason,
        })),
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
        maxChromaAtRangeEnd: result.series.maxChromaAtRangeEnd === true,
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
    ...(un
      ? {
        ellipseFrom: abEllipse(sdRow(result, c.from), c.labFrom),
        ellipseTo: abEllipse(sdRow(result, c.to), c.labTo),
      }
      : {}),
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
      ...(un ? { sd: colorSd(result, row.illuminant, row.observer) } : {}),
    })),
    extra: result.extra,
    thicknessMm: result.thicknessMm,
    polarisation: result.polarisation,
    host: result.host,
  };
}

function colorSd(result: SampleResult, illuminant: string, observer: string) {
  const u = result.uncertainty?.rows.find((x) =>
    x.illuminant === illuminant && x.observer === observer
  );
  return u
    ? {
      L: r(u.LSd),
      C: r(u.CSd),
      h: u.hSd === null ? null : r(u.hSd, 1),
      a: r(u.aSd),
      b: r(u.bSd),
    }
    : null;
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

/**
 * Straight-line calibration of a spectral response against analysed standards, and inverse
 * prediction with its uncertainty (Miller & Miller, Statistics and Chemometrics for
 * Analytical Chemistry, ch. 5; weighted fits with the effective-variance method for
 * uncertainties in concentration, Orear, Am. J. Phys. 50, 912 (1982)).
 * LOD = 3·s/b and LOQ = 10·s/b with s the residual standard deviation s_y/x of the line
 * (IUPAC-style 3σ/10σ; the blank is represented by the calibration line itself).
 *
 * @module
 */
import { studentTQuantile } from "../numeric/student_t.ts";

/** One standard: concentration x (with optional σ) and response y (with optional σ). */
export interface CalibrationPoint {
  /** Name of the standard. */
  sample?: string;
  /** Concentration. */
  x: number;
  /** Response. */
  y: number;
  /** Standard uncertainty of the concentration. */
  sigmaX?: number;
  /** Standard uncertainty of the response (weights a weighted fit). */
  sigmaY?: number;
}

/** Fit modes. */
export type CalibrationMode = "ols" | "origin" | "weighted";

/** A fitted calibration line y = intercept + slope·x. */
export interface Calibration {
  /** How the line was fitted. */
  mode: CalibrationMode;
  /** Slope b. */
  slope: number;
  /** Intercept a (0 through the origin). */
  intercept: number;
  /** Standard error of the slope. */
  slopeSigma: number;
  /** Standard error of the intercept. */
  interceptSigma: number;
  /** cov(slope, intercept). */
  covariance: number;
  /** Coefficient of determination. */
  r2: number;
  /** Residual standard deviation s_y/x (for weighted fits, of unit weight). */
  syx: number;
  /** Number of standards. */
  n: number;
  /** Degrees of freedom of the residual. */
  dof: number;
  /** Two-sided 95 % Student t for dof. */
  t95: number;
  /** Limit of detection (see `lodConvention`). */
  lod: number;
  /** Limit of quantification. */
  loq: number;
  /** How LOD and LOQ were defined (Miller & Miller). */
  lodConvention: string;
  /** Residual of each standard. */
  residuals: number[];
  /** The standards. */
  points: CalibrationPoint[];
  /** Lowest and highest concentration of the standards. */
  xRange: [number, number];
  /** Mean concentration. */
  meanX: number;
  /** Mean response. */
  meanY: number;
  /** Σ(x − x̄)². */
  sxx: number;
  /** Concentration unit. */
  unit: string;
  /** Response metric (band-area, band-height, alpha-at). */
  metric: string;
  /** Options of the metric (band centre, wavelength, window). */
  metricOptions: Record<string, unknown>;
}

/**
 * Fits a straight line through standards.
 *
 * @throws {RangeError} With fewer than 3 points (2 through the origin), or all x equal.
 */
export function fitCalibration(
  points: CalibrationPoint[],
  mode: CalibrationMode = "ols",
  unit = "",
  metric = "response",
  metricOptions: Record<string, unknown> = {},
): Calibration {
  const n = points.length;
  const params = mode === "origin" ? 1 : 2;
  if (n < params + 1) {
    throw new RangeError(`Cannot fit a calibration: ${n} standards, need at least ${params + 1}`);
  }
  const xs = points.map((p) => p.x), ys = points.map((p) => p.y);
  if (Math.max(...xs) === Math.min(...xs)) {
    throw new RangeError("Cannot fit a calibration: all concentrations are equal");
  }
  let slope = 0, intercept = 0, slopeSigma = 0, interceptSigma = 0, covariance = 0;
  let weights = points.map(() => 1);
  const weighted = mode === "weighted";
  if (weighted && !points.every((p) => (p.sigmaY ?? 0) > 0 || (p.sigmaX ?? 0) > 0)) {
    throw new RangeError(
      "Cannot weight the fit: every standard needs a concentration or response uncertainty",
    );
  }
  const solve = () => {
    const sw = weights.reduce((a, b) => a + b, 0);
    const mx = weights.reduce((s, w, i) => s + w * xs[i]!, 0) / sw;
    const my = weights.reduce((s, w, i) => s + w * ys[i]!, 0) / sw;
    if (mode === "origin") {
      const sxx0 = weights.reduce((s, w, i) => s + w * xs[i]! ** 2, 0);
      slope = weights.reduce((s, w, i) => s + w * xs[i]! * ys[i]!, 0) / sxx0;
      intercept = 0;
      return { mx, my, sxx: sxx0, sw };
    }
    const sxx = weights.reduce((s, w, i) => s + w * (xs[i]! - mx) ** 2, 0);
    slope = weights.reduce((s, w, i) => s + w * (xs[i]! - mx) * (ys[i]! - my), 0) / sxx;
    intercept = my - slope * mx;
    return { mx, my, sxx, sw };
  };
  let stats = solve();
  if (weighted) {
    for (let iter = 0; iter < 20; iter++) {
      weights = points.map((p) => 1 / ((p.sigmaY ?? 0) ** 2 + slope ** 2 * (p.sigmaX ?? 0) ** 2));
      const before = slope;
      stats = solve();
      if (Math.abs(slope - before) <= 1e-14 * Math.abs(slope)) break;
    }
  }
  const residuals = ys.map((y, i) => y - intercept - slope * xs[i]!);
  const dof = n - params;
  const ssr = residuals.reduce((s, r, i) => s + weights[i]! * r * r, 0);
  const syx = Math.sqrt(ssr / dof);
  if (mode === "origin") {
    slopeSigma = syx / Math.sqrt(stats.sxx);
  } else {
    // weighted: σ from the weights themselves when they are absolute (Miller & Miller §5.10)
    const scale = weighted ? 1 : syx;
    slopeSigma = scale / Math.sqrt(stats.sxx);
    interceptSigma = scale * Math.sqrt(1 / stats.sw + stats.mx ** 2 / stats.sxx);
    covariance = -stats.mx * (scale * scale) / stats.sxx;
  }
  const meanY = ys.reduce((a, b) => a + b, 0) / n, meanX = xs.reduce((a, b) => a + b, 0) / n;
  const sst = ys.reduce((s, y) => s + (y - meanY) ** 2, 0);
  const ssrPlain = residuals.reduce((s, r) => s + r * r, 0);
  const r2 = 1 - ssrPlain / sst;
  const sPlain = Math.sqrt(ssrPlain / dof);
  return {
    mode,
    slope,
    intercept,
    slopeSigma,
    interceptSigma,
    covariance,
    r2,
    syx: weighted ? syx : sPlain,
    n,
    dof,
    t95: studentTQuantile(0.975, dof),
    lod: (3 * sPlain) / slope,
    loq: (10 * sPlain) / slope,
    lodConvention:
      "LOD = 3·s_y/x / slope, LOQ = 10·s_y/x / slope (s_y/x: residual SD of the unweighted residuals)",
    residuals,
    points,
    xRange: [Math.min(...xs), Math.max(...xs)],
    meanX,
    meanY,
    sxx: xs.reduce((s, x) => s + (x - meanX) ** 2, 0),
    unit,
    metric,
    metricOptions,
  };
}

/** An inverse prediction: concentration from a measured response. */
export interface Prediction {
  /** Estimated concentration. */
  x: number;
  /** Standard error of x (Miller & Miller eq. 5.9, plus the response's own σ when given). */
  sigma: number;
  /** Half-width of the 95 % interval, t95·σ. */
  halfWidth95: number;
  /** Whether the estimate lies outside the standards' range. */
  outsideRange: boolean;
}

/**
 * Concentration from a response y0 (mean of m replicate measurements), with uncertainty.
 *
 * @param sigmaY0 The response's own standard error (e.g. from the band fit), added in quadrature;
 *   a non-finite value (a fit whose covariance was singular) counts as 0.
 */
export function predictConcentration(cal: Calibration, y0: number, sigmaY0 = 0, m = 1): Prediction {
  const b = cal.slope;
  const x = (y0 - cal.intercept) / b;
  const s = cal.syx;
  const lever = cal.mode === "origin"
    ? (x * x) / cal.points.reduce((a, p) => a + p.x * p.x, 0)
    : 1 / cal.n + (y0 - cal.meanY) ** 2 / (b * b * cal.sxx);
  const own = Number.isFinite(sigmaY0) ? sigmaY0 : 0;
  let variance: number;
  if (cal.mode === "weighted") {
    // the weighted fit's s_y/x is of unit weight, so Miller & Miller's eq. 5.9 does not apply:
    // first-order propagation through the line's covariance (GUM), plus the new response's own
    // variance (given, else the standards' mean response variance)
    const given = cal.points.map((p) => p.sigmaY).filter((v): v is number => v !== undefined);
    const typical = given.length ? given.reduce((a, v) => a + v * v, 0) / given.length : 0;
    const responseVar = own > 0 ? own * own : typical / m;
    variance = (responseVar + cal.interceptSigma ** 2 + x * x * cal.slopeSigma ** 2 +
      2 * x * cal.covariance) / (b * b);
  } else {
    variance = (s * s / (b * b)) * (1 / m + lever) + (own / b) ** 2;
  }
  const sigma = Math.sqrt(variance);
  return {
    x,
    sigma,
    halfWidth95: cal.t95 * sigma,
    outsideRange: x < cal.xRange[0] || x > cal.xRange[1],
  };
}

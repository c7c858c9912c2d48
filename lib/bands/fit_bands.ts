/**
 * Fits absorption bands: sum of Gaussians (or Lorentzians for sharp lines) in wavenumber plus
 * a baseline, by bounded Levenberg–Marquardt with an analytic Jacobian; standard errors from
 * the covariance at the optimum scaled by the residual variance.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { spectrumAbsorbance } from "../spectrum/ordinate.ts";
import {
  bandArea,
  type BandShape,
  evaluateModel,
  type ModelLayout,
  parameterCount,
} from "./band_model.ts";
import {
  type BandCandidate,
  detectBands,
  estimateNoise,
  localNoise,
  uniformResample,
} from "./detect_bands.ts";
import { levenbergMarquardt } from "../numeric/levenberg_marquardt.ts";

/** One fitted band with 1σ standard errors. */
export interface FittedBand {
  shape: BandShape;
  centerCm1: number;
  centerCm1Sigma: number;
  centerNm: number;
  centerNmSigma: number;
  fwhmCm1: number;
  fwhmCm1Sigma: number;
  height: number;
  heightSigma: number;
  /** Integral over cm⁻¹, in ordinate units × cm⁻¹. */
  area: number;
  areaSigma: number;
}

/** The fitted baseline: b0 + b1·t + b2·t² + scatter·(ν̃/20000)⁴, t = (ν̃ − mid)/half. */
export interface FittedBaseline {
  b0: number;
  b1: number;
  b2: number;
  scatter: number;
  midCm1: number;
  halfCm1: number;
}

/** Result of a band fit. */
export interface BandFit {
  bands: FittedBand[];
  baseline: FittedBaseline;
  residualRms: number;
  /** Noise σ estimated from the data before fitting. */
  noiseSigma: number;
  converged: boolean;
  iterations: number;
  /** What the ordinate was: absorbance (decadic) or alpha (cm⁻¹). */
  ordinate: "absorbance" | "alpha";
  /** The data, model and residual on the fitted wavenumber grid, for plots. */
  curve: {
    cm1: Float64Array<ArrayBuffer>;
    data: Float64Array<ArrayBuffer>;
    model: Float64Array<ArrayBuffer>;
  };
}

/** Options of {@linkcode fitBands}. */
export interface FitOptions {
  /** Starting bands; detected automatically when omitted. */
  candidates?: BandCandidate[];
  /** Baseline terms (default b0, b1 and the λ⁻⁴ scatter term). */
  baselineTerms?: ModelLayout["baselineTerms"];
  /** Bands narrower than this FWHM (cm⁻¹) are fitted as Lorentzians (default 150). */
  lorentzianBelowCm1?: number;
  /** Fit range in cm⁻¹. */
  rangeCm1?: [number, number];
  /** Band-free windows (cm⁻¹) for the starting baseline; found automatically when omitted. */
  baselineWindowsCm1?: [number, number][];
  maxBands?: number;
}

function linearBaselineStart(
  x: Float64Array,
  y: Float64Array,
  free: boolean[],
  layout: ModelLayout,
): Float64Array {
  const terms = layout.baselineTerms;
  const m = terms.length;
  const ata = new Float64Array(m * m), atb = new Float64Array(m);
  const basis = (nu: number) => {
    const t = (nu - layout.mid) / layout.half;
    return terms.map((
      term,
    ) => (term === "b0" ? 1 : term === "b1" ? t : term === "b2" ? t * t : (nu / 20000) ** 4));
  };
  let used = 0;
  for (let i = 0; i < x.length; i++) {
    if (!free[i]) continue;
    used++;
    const b = basis(x[i]!);
    for (let j = 0; j < m; j++) {
      atb[j] = atb[j]! + b[j]! * y[i]!;
      for (let k = 0; k < m; k++) ata[j * m + k] = ata[j * m + k]! + b[j]! * b[k]!;
    }
  }
  const out = new Float64Array(m);
  if (used <= m) {
    const min = y.reduce((a, v) => Math.min(a, v), Infinity);
    out[terms.indexOf("b0")] = Number.isFinite(min) ? min : 0;
    return out;
  }
  // Gaussian elimination on the small normal equations
  const a = Array.from({ length: m }, (_, j) => [...ata.slice(j * m, j * m + m), atb[j]!]);
  for (let c = 0; c < m; c++) {
    let p = c;
    for (let r = c + 1; r < m; r++) if (Math.abs(a[r]![c]!) > Math.abs(a[p]![c]!)) p = r;
    [a[c], a[p]] = [a[p]!, a[c]!];
    if (Math.abs(a[c]![c]!) < 1e-300) continue;
    for (let r = 0; r < m; r++) {
      if (r === c) continue;
      const f = a[r]![c]! / a[c]![c]!;
      for (let k = c; k <= m; k++) a[r]![k]! -= f * a[c]![k]!;
    }
  }
  for (let j = 0; j < m; j++) out[j] = Math.abs(a[j]![j]!) > 1e-300 ? a[j]![m]! / a[j]![j]! : 0;
  return out;
}

/**
 * Fits bands to data y at wavenumbers x (cm⁻¹; any order, any spacing).
 *
 * @throws {RangeError} For fewer points than parameters.
 */
function fitOnce(
  xIn: ArrayLike<number>,
  yIn: ArrayLike<number>,
  options: FitOptions = {},
  ordinate: BandFit["ordinate"] = "absorbance",
): BandFit {
  const order = Array.from({ length: xIn.length }, (_, i) => i).sort((a, b) => xIn[a]! - xIn[b]!);
  let x = Float64Array.from(order, (i) => xIn[i]!);
  let y = Float64Array.from(order, (i) => yIn[i]!);
  if (options.rangeCm1) {
    const [lo, hi] = options.rangeCm1;
    const keep = [...x].map((v, i) => (v >= lo && v <= hi ? i : -1)).filter((i) => i >= 0);
    x = Float64Array.from(keep, (i) => x[i]!);
    y = Float64Array.from(keep, (i) => y[i]!);
  }
  const n = x.length;
  const noiseSigma = estimateNoise(uniformResample(x, y).y);
  const candidates = (options.candidates ?? detectBands(x, y))
    .slice()
    .sort((a, b) => b.height * b.fwhmCm1 - a.height * a.fwhmCm1)
    .slice(0, options.maxBands ?? 8)
    .sort((a, b) => a.centerCm1 - b.centerCm1);
  const narrow = options.lorentzianBelowCm1 ?? 150;
  const layout: ModelLayout = {
    shapes: candidates.map((c) => (c.fwhmCm1 < narrow ? "lorentzian" : "gaussian")),
    mid: (x[0]! + x[n - 1]!) / 2,
    half: Math.max((x[n - 1]! - x[0]!) / 2, 1),
    baselineTerms: options.baselineTerms ?? ["b0", "b1", "scatter"],
  };
  const p = parameterCount(layout);
  if (n <= p) {
    throw new RangeError(
      `Cannot fit ${candidates.length} bands: only ${n} points for ${p} parameters`,
    );
  }
  const free = [...x].map((nu) => {
    if (options.baselineWindowsCm1) {
      return options.baselineWindowsCm1.some(([a, b]) => nu >= a && nu <= b);
    }
    return candidates.every((c) => Math.abs(nu - c.centerCm1) > 1.5 * c.fwhmCm1);
  });
  const baseStart = linearBaselineStart(x, y, free, layout);
  const start = new Float64Array(p), lower = new Float64Array(p), upper = new Float64Array(p);
  const span = x[n - 1]! - x[0]!;
  const minStep = span / (n - 1);
  candidates.forEach((c, b) => {
    start.set([Math.max(c.height, 1e-9), c.centerCm1, c.fwhmCm1], 3 * b);
    lower.set([0, x[0]!, 2 * minStep], 3 * b);
    upper.set([Infinity, x[n - 1]!, Math.max(span, 4 * c.fwhmCm1)], 3 * b);
  });
  baseStart.forEach((v, k) => {
    start[3 * candidates.length + k] = v;
    lower[3 * candidates.length + k] = -Infinity;
    upper[3 * candidates.length + k] = Infinity;
  });
  // weights 1/σᵢ² from the local noise (relative weights: the covariance is still scaled by
  // the residual variance), so dark, noisy stretches of absorbance do not steer the fit
  const weights = localNoise(y).map((v) => 1 / (v * v));
  const fit = levenbergMarquardt(
    y,
    (params, out, jac) => evaluateModel(x, params, layout, out, jac),
    start,
    { lower, upper, weights },
  );
  const cov = fit.covariance;
  const bands: FittedBand[] = candidates.map((_, b) => {
    const [h, c, f] = [fit.params[3 * b]!, fit.params[3 * b + 1]!, fit.params[3 * b + 2]!];
    const [sh, sc, sf] = [fit.sigmas[3 * b]!, fit.sigmas[3 * b + 1]!, fit.sigmas[3 * b + 2]!];
    const shape = layout.shapes[b]!;
    const k = bandArea(1, 1, shape);
    const covHf = cov[(3 * b) * p + 3 * b + 2]!;
    const areaVar = k * k * (f * f * sh * sh + h * h * sf * sf + 2 * h * f * covHf);
    return {
      shape,
      centerCm1: c,
      centerCm1Sigma: sc,
      centerNm: 1e7 / c,
      centerNmSigma: (1e7 / (c * c)) * sc,
      fwhmCm1: f,
      fwhmCm1Sigma: sf,
      height: h,
      heightSigma: sh,
      area: bandArea(h, f, shape),
      areaSigma: Math.sqrt(Math.max(areaVar, 0)),
    };
  });
  const bp = (term: ModelLayout["baselineTerms"][number]) => {
    const i = layout.baselineTerms.indexOf(term);
    return i < 0 ? 0 : fit.params[3 * candidates.length + i]!;
  };
  const model = new Float64Array(n);
  evaluateModel(x, fit.params, layout, model);
  return {
    bands,
    baseline: {
      b0: bp("b0"),
      b1: bp("b1"),
      b2: bp("b2"),
      scatter: bp("scatter"),
      midCm1: layout.mid,
      halfCm1: layout.half,
    },
    residualRms: Math.sqrt(model.reduce((sum, m, i) => sum + (y[i]! - m) ** 2, 0) / n),
    noiseSigma,
    converged: fit.converged,
    iterations: fit.iterations,
    ordinate,
    curve: { cm1: x, data: y, model },
  };
}

/** Detected bands whose fitted height is below this many standard errors are dropped and the fit redone (common practice). */
export const MIN_BAND_SIGNIFICANCE = 3;

/**
 * Fits bands to data y at wavenumbers x (cm⁻¹; any order, any spacing). Automatically detected
 * bands that the fit cannot tell from zero (height < 3σ) are dropped and the fit redone.
 *
 * @throws {RangeError} For fewer points than parameters.
 */
export function fitBandsCm1(
  xIn: ArrayLike<number>,
  yIn: ArrayLike<number>,
  options: FitOptions = {},
  ordinate: BandFit["ordinate"] = "absorbance",
): BandFit {
  let fit = fitOnce(xIn, yIn, options, ordinate);
  if (options.candidates) return fit;
  for (let round = 0; round < 3; round++) {
    const keep = fit.bands.filter((b) => b.height >= MIN_BAND_SIGNIFICANCE * b.heightSigma);
    if (keep.length === fit.bands.length || keep.length === 0) break;
    const candidates = keep.map((b) => ({
      centerCm1: b.centerCm1,
      fwhmCm1: b.fwhmCm1,
      height: b.height,
      significance: b.height / b.heightSigma,
    }));
    fit = fitOnce(xIn, yIn, { ...options, candidates }, ordinate);
  }
  return fit;
}

/**
 * Fits the bands of a spectrum: α when the spectrum holds α, else decadic absorbance as measured.
 *
 * @param rangeNm Wavelength range to fit (default the whole spectrum).
 */
export function fitSpectrumBands(
  spectrum: Spectrum,
  options: FitOptions & { rangeNm?: [number, number] } = {},
): BandFit {
  const y = spectrum.quantity === "alpha" ? spectrum.values : spectrumAbsorbance(spectrum);
  const x = spectrum.wavelengthNm.map((nm) => 1e7 / nm);
  const opts: FitOptions = { ...options };
  if (options.rangeNm) opts.rangeCm1 = [1e7 / options.rangeNm[1], 1e7 / options.rangeNm[0]];
  return fitBandsCm1(x, y, opts, spectrum.quantity === "alpha" ? "alpha" : "absorbance");
}

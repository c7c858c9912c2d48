/**
 * Fits absorption bands: sum of Gaussians (Lorentzians for sharp lines) in wavenumber plus a
 * baseline and, where the absorption edge reaches into the range, an Urbach-type edge term,
 * by variable projection (Golub & Pereyra, SIAM J. Numer. Anal. 10, 413 (1973)). Weights are
 * 1/σᵢ² from the per-point noise; standard errors from the covariance at the optimum.
 *
 * Without given candidates the model is chosen: bands from the second-derivative detection,
 * insignificant ones dropped, then, while the residual shows structure above the noise, a
 * band is added there or the nearest band split, and the larger model kept only when the
 * Bayesian information criterion BIC = n·ln(χ²/n) + k·ln n (Schwarz, Ann. Stat. 6, 461
 * (1978); χ² the weighted residual sum of squares) is lower. AIC = n·ln(χ²/n) + 2k (Akaike,
 * IEEE Trans. Autom. Control 19, 716 (1974)) is reported beside it.
 *
 * @module
 */
import { nmToWavenumber, wavenumberToNm } from "../spectrum/axis.ts";
import type { Spectrum } from "../spectrum/spectrum.ts";
import { spectrumAbsorbance } from "../spectrum/ordinate.ts";
import { type BandCandidate, detectBands } from "./detect_bands.ts";
import {
  type BandStart,
  type BaselineTerm,
  type FitData,
  fitModel,
  type FittedBand,
  type FittedBaseline,
  type ModelFit,
  type ModelSpec,
} from "./_fit_model.ts";
import { residualStructure } from "./residual_structure.ts";
import { ordinateNoise, smoothResidual } from "./ordinate_noise.ts";
import { type ExcludedRange, usableRange, type UsableRangeOptions } from "./usable_range.ts";

export type { BaselineTerm, FittedBand, FittedBaseline } from "./_fit_model.ts";

/** One model tried during model selection. */
export interface ModelTried {
  /** Number of bands. */
  bands: number;
  /** Whether the model has the edge term. */
  edge: boolean;
  /** Number of parameters. */
  parameters: number;
  /** Weighted χ². */
  chi2: number;
  /** Akaike information criterion. */
  aic: number;
  /** Bayesian information criterion, n·ln(χ²/n) + k·ln n. */
  bic: number;
  /** True for the model kept. */
  chosen: boolean;
}

/** Result of a band fit. */
export interface BandFit {
  /** Fitted bands. */
  bands: FittedBand[];
  /** Fitted baseline. */
  baseline: FittedBaseline;
  /** RMS of data − model over the fitted points, ordinate units. */
  residualRms: number;
  /** RMS of the per-point noise σ over the fitted points: what residualRms should be. */
  noiseSigma: number;
  /** χ²/(n − p) with the per-point noise σ: near 1 when the model and the noise are right. */
  reducedChi2: number;
  /** Whether the fit converged. */
  converged: boolean;
  /** Iterations used. */
  iterations: number;
  /** What the ordinate was: absorbance (decadic) or alpha (cm⁻¹). */
  ordinate: "absorbance" | "alpha";
  /** The criterion that chose the model. */
  criterion: "BIC";
  /** Models tried, with their criterion values (one entry when candidates were given). */
  models: ModelTried[];
  /** Runs-test z of the final residual (Wald & Wolfowitz 1940). */
  runsZ: number;
  /** Plain-language notes: unconverged fit, held widths, residual structure left. */
  warnings: string[];
  /** Stretches left out as carrying no information (set by {@linkcode fitSpectrumBands}). */
  excluded?: ExcludedRange[];
  /** The data, model and noise on the fitted wavenumber grid, for plots. */
  curve: {
    cm1: Float64Array<ArrayBuffer>;
    data: Float64Array<ArrayBuffer>;
    model: Float64Array<ArrayBuffer>;
    sigma: Float64Array<ArrayBuffer>;
  };
}

/** Options of {@linkcode fitBandsCm1}. */
export interface FitOptions {
  /**
   * Starting bands (heights are solved exactly, only centre and FWHM are used); detected when
   * omitted. The fitted bands come back in the order of these starts; detected ones by centre.
   */
  candidates?: BandCandidate[];
  /** Baseline terms (default b0, b1 and the λ⁻⁴ scatter term). */
  baselineTerms?: BaselineTerm[];
  /** Bands narrower than this FWHM (cm⁻¹) are fitted as Lorentzians (default 150). */
  lorentzianBelowCm1?: number;
  /** Fit range in cm⁻¹. */
  rangeCm1?: [number, number];
  /** At most this many bands (default 8). */
  maxBands?: number;
  /** Noise σ per input point; estimated from the data (uniform) when omitted. */
  sigma?: ArrayLike<number>;
  /** 1 for points to fit, 0 for points to leave out (per input point; default all). */
  usable?: ArrayLike<number>;
  /**
   * Urbach-type edge term at the high-wavenumber end: true, false, or "auto" (tried and kept
   * when BIC prefers it). Default "auto" without candidates, false with them.
   */
  edge?: boolean | "auto";
  /** Smallest FWHM allowed (resolution cap), cm⁻¹, constant or per centre; default 2 grid steps. */
  minFwhmCm1?: number | ((centerCm1: number) => number);
}

/** Detected bands whose fitted height is below this many standard errors are dropped (common practice). */
export const MIN_BAND_SIGNIFICANCE = 3;

/** Rounds of residual-driven model growth at most (our choice). */
const MAX_ROUNDS = 5;

interface Prepared {
  data: FitData;
  /** Contiguous runs of fitted points, as [from, to] indices into data. */
  segments: [number, number][];
  minFwhm: (c: number) => number;
}

function prepare(xIn: ArrayLike<number>, yIn: ArrayLike<number>, options: FitOptions): Prepared {
  const order = Array.from({ length: xIn.length }, (_, i) => i).sort((a, b) => xIn[a]! - xIn[b]!);
  const xs = Float64Array.from(order, (i) => xIn[i]!);
  const ys = Float64Array.from(order, (i) => yIn[i]!);
  const use = Uint8Array.from(order, (i) => {
    const v = xIn[i]!;
    const inRange = !options.rangeCm1 || (v >= options.rangeCm1[0] && v <= options.rangeCm1[1]);
    return inRange && (!options.usable || options.usable[i]) ? 1 : 0;
  });
  const sigmaAll = options.sigma
    ? Float64Array.from(order, (i) => options.sigma![i]!)
    : ordinateNoise(ys, undefined, use).sigma;
  const keep: number[] = [];
  for (let i = 0; i < xs.length; i++) if (use[i]) keep.push(i);
  const segments: [number, number][] = [];
  keep.forEach((orig, k) => {
    if (k > 0 && keep[k - 1] === orig - 1) segments[segments.length - 1]![1] = k;
    else segments.push([k, k]);
  });
  const x = Float64Array.from(keep, (i) => xs[i]!);
  const y = Float64Array.from(keep, (i) => ys[i]!);
  const sigma = Float64Array.from(keep, (i) => sigmaAll[i]!);
  const cap = options.minFwhmCm1;
  const minFwhm = typeof cap === "function"
    ? cap
    : typeof cap === "number"
    ? () => cap
    : (c: number) => {
      // two local grid steps: a narrower "band" is one point of noise
      let j = 0;
      while (j < xs.length - 2 && xs[j + 1]! < c) j++;
      return 2 * Math.abs(xs[Math.min(j + 1, xs.length - 1)]! - xs[j]!);
    };
  return { data: { x, y, sigma }, segments, minFwhm };
}

function criterion(fit: ModelFit, n: number): { aic: number; bic: number } {
  const base = n * Math.log(Math.max(fit.chi2, 1e-300) / n);
  return { aic: base + 2 * fit.parameters, bic: base + fit.parameters * Math.log(n) };
}

function startsFrom(candidates: BandCandidate[], narrow: number): BandStart[] {
  return candidates.map((c) => ({
    centerCm1: c.centerCm1,
    fwhmCm1: c.fwhmCm1,
    shape: c.fwhmCm1 < narrow ? "lorentzian" : "gaussian",
  }));
}

function startsOf(fit: ModelFit): BandStart[] {
  return fit.bands.map((b) => ({ centerCm1: b.centerCm1, fwhmCm1: b.fwhmCm1, shape: b.shape }));
}

function detectOn(prep: Prepared, maxBands: number): BandCandidate[] {
  const { x, y, sigma } = prep.data;
  const found: BandCandidate[] = [];
  for (const [a, b] of prep.segments) {
    if (b - a + 1 < 15) continue;
    found.push(
      ...detectBands(x.subarray(a, b + 1), y.subarray(a, b + 1), {
        noiseSigma: sigma.subarray(a, b + 1),
      }),
    );
  }
  return found
    .sort((p, q) => q.significance - p.significance)
    .slice(0, maxBands)
    .sort((p, q) => p.centerCm1 - q.centerCm1);
}

/** A band is dropped when the data cannot tell it from zero, or it sits on the range end. */
function insignificant(b: FittedBand): boolean {
  return !(b.height > 0) ||
    b.height < MIN_BAND_SIGNIFICANCE * b.heightSigma ||
    (b.held?.includes("centerCm1") ?? false);
}

/** True when the data climb toward the high-wavenumber end (an edge may reach in): the mean of the top 5 % of points stands 3σ above the median and above the mean of the 5 % before. */
function climbsAtTop(data: FitData): boolean {
  const n = data.y.length, k = Math.max(5, Math.round(0.05 * n));
  if (n < 3 * k) return false;
  const mean = (a: Float64Array) => a.reduce((p, q) => p + q, 0) / a.length;
  const top = mean(data.y.subarray(n - k)), before = mean(data.y.subarray(n - 2 * k, n - k));
  const median = Float64Array.from(data.y).sort()[Math.floor(n / 2)]!;
  const s = mean(data.sigma.subarray(n - k));
  return top > before && top > median + 3 * s;
}

function edgeStart(x: Float64Array): number {
  return (x[x.length - 1]! - x[0]!) / 12;
}

/**
 * Fits bands to data y at wavenumbers x (cm⁻¹; any order, any spacing).
 *
 * @param ordinate What y holds (reported back; decadic absorbance or α in cm⁻¹).
 * @throws {RangeError} For fewer fitted points than parameters.
 * @example Two Gaussian bands given as starts
 * ```ts
 * import { fitBandsCm1 } from "./fit_bands.ts";
 * const x = Array.from({ length: 400 }, (_, i) => 12000 + 40 * i);
 * const g = (v: number, c: number, f: number) => Math.exp(-4 * Math.LN2 * ((v - c) / f) ** 2);
 * const y = x.map((v) => 0.02 + 0.8 * g(v, 18000, 2800) + 1.1 * g(v, 24600, 3200));
 * const fit = fitBandsCm1(x, y, {
 *   candidates: [18200, 24300].map((c) => ({ centerCm1: c, fwhmCm1: 3000, height: 1, significance: 10 })),
 *   sigma: x.map(() => 1e-3),
 * });
 * if (Math.abs(fit.bands[0]!.centerCm1 - 18000) > 1) throw new Error("centre");
 * ```
 */
export function fitBandsCm1(
  xIn: ArrayLike<number>,
  yIn: ArrayLike<number>,
  options: FitOptions = {},
  ordinate: BandFit["ordinate"] = "absorbance",
): BandFit {
  const prep = prepare(xIn, yIn, options);
  const { data } = prep;
  const n = data.x.length;
  const narrow = options.lorentzianBelowCm1 ?? 150;
  const maxBands = options.maxBands ?? 8;
  const baselineTerms = options.baselineTerms ?? ["b0", "b1", "scatter"];
  const spec = (bands: BandStart[], edge: boolean): ModelSpec => {
    const s: ModelSpec = { bands, baselineTerms, minFwhmCm1: prep.minFwhm };
    if (edge) s.edgeWidthCm1 = edgeStart(data.x);
    return s;
  };
  const tried: { fit: ModelFit; aic: number; bic: number }[] = [];
  const attempt = (s: ModelSpec) => {
    if (n <= 2 * s.bands.length + s.bands.length + baselineTerms.length + 2) return undefined;
    const fit = fitModel(data, s);
    const entry = { fit, ...criterion(fit, n) };
    tried.push(entry);
    return entry;
  };
  const edgeOption = options.edge ?? (options.candidates ? false : "auto");
  let best: { fit: ModelFit; aic: number; bic: number } | undefined;
  if (options.candidates) {
    const bands = startsFrom(options.candidates.slice(0, maxBands), narrow);
    const p = 3 * bands.length + baselineTerms.length + (edgeOption === true ? 2 : 0);
    if (n <= p) {
      throw new RangeError(
        `Cannot fit ${bands.length} bands: only ${n} points for ${p} parameters`,
      );
    }
    best = attempt(spec(bands, edgeOption === true));
  } else {
    type Entry = NonNullable<ReturnType<typeof attempt>>;
    // drop bands the data cannot tell from zero, one refit at a time
    const prune = (e: Entry | undefined): Entry | undefined => {
      for (let round = 0; e && round < 8; round++) {
        if (!e.fit.bands.some(insignificant)) break;
        const bands = startsOf(e.fit).filter((_, k) => !insignificant(e!.fit.bands[k]!));
        e = attempt({ ...e.fit.spec, bands });
      }
      return e;
    };
    // an edge term must absorb (positive amplitude) to be an edge
    const valid = (e: Entry | undefined): e is Entry =>
      e !== undefined && !(e.fit.baseline.edge && !(e.fit.baseline.edge.amplitude > 0));
    /** Pruned, and refitted without the edge term when that term came out negative. */
    const settle = (s: ModelSpec): Entry | undefined => {
      const e = prune(attempt(s));
      if (!e || edgeOption !== "auto" || valid(e)) return e;
      const plain: ModelSpec = { ...(e as Entry).fit.spec };
      delete plain.edgeWidthCm1;
      return prune(attempt(plain));
    };
    const bands = startsFrom(detectOn(prep, maxBands), narrow);
    const edges = edgeOption === "auto" ? (climbsAtTop(data) ? [false, true] : [false]) : [
      edgeOption,
    ];
    for (const edge of edges) {
      const e = settle(spec(bands, edge));
      if (valid(e) && (!best || e.bic < best.bic)) best = e;
    }
    if (!best) {
      throw new RangeError(`Cannot fit bands: only ${n} usable points`);
    }
    for (let round = 0; round < MAX_ROUNDS; round++) {
      const residual = data.y.map((v, i) => v - best!.fit.model[i]!);
      const feature = residualStructure(data.x, residual, data.sigma).features[0];
      if (!feature) break;
      const current = startsOf(best.fit);
      const larger: BandStart[][] = [];
      if (current.length < maxBands) {
        const width = Math.max(
          prep.minFwhm(feature.centerCm1),
          0.6 * (feature.toCm1 - feature.fromCm1),
        );
        // a new band on top of an existing one is a split, not an addition
        const crowded = current.some((b) =>
          Math.abs(b.centerCm1 - feature.centerCm1) < 0.25 * Math.max(b.fwhmCm1, width)
        );
        if (!crowded) {
          larger.push(
            [...current, {
              centerCm1: feature.centerCm1,
              fwhmCm1: width,
              shape: width < narrow ? "lorentzian" as const : "gaussian" as const,
            }].sort((a, b) => a.centerCm1 - b.centerCm1),
          );
        }
        // a band at the resolution cap cannot be split
        const near = current
          .map((b, k) => ({ k, d: Math.abs(b.centerCm1 - feature.centerCm1) / b.fwhmCm1 }))
          .filter((e) => e.d < 1 && !best!.fit.bands[e.k]!.held?.includes("fwhmCm1"))
          .sort((a, b) => a.d - b.d)[0];
        if (near) {
          const b = current[near.k]!;
          const split: BandStart[] = [-0.3, 0.3].map((s) => ({
            centerCm1: b.centerCm1 + s * b.fwhmCm1,
            fwhmCm1: 0.7 * b.fwhmCm1,
            shape: b.shape,
          }));
          larger.push(
            [...current.filter((_, k) => k !== near.k), ...split].sort((a, c) =>
              a.centerCm1 - c.centerCm1
            ),
          );
        }
      }
      let bestTry: Entry | undefined;
      for (const bands2 of larger) {
        const e = settle({ ...best.fit.spec, bands: bands2 });
        if (!valid(e) || !e.fit.converged) continue;
        if (!bestTry || e.bic < bestTry.bic) bestTry = e;
      }
      if (!bestTry || !(bestTry.bic < best.bic)) break;
      best = bestTry;
    }
  }
  if (!best) throw new RangeError(`Cannot fit bands: only ${n} usable points`);
  return toBandFit(best.fit, data, ordinate, tried, best.fit, !options.candidates);
}

function toBandFit(
  fit: ModelFit,
  data: FitData,
  ordinate: BandFit["ordinate"],
  tried: { fit: ModelFit; aic: number; bic: number }[],
  chosen: ModelFit,
  byCentre: boolean,
): BandFit {
  const n = data.x.length;
  let rss = 0, noise = 0;
  const residual = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    residual[i] = data.y[i]! - fit.model[i]!;
    rss += residual[i]! ** 2;
    noise += data.sigma[i]! ** 2;
  }
  const structure = residualStructure(data.x, residual, data.sigma);
  // detected bands are listed by centre (a fit can carry a band past its neighbour from where
  // it started); given candidates keep the caller's order, so results match them by index
  const bands = byCentre ? [...fit.bands].sort((a, b) => a.centerCm1 - b.centerCm1) : fit.bands;
  const warnings: string[] = [];
  if (!fit.converged) {
    warnings.push(
      `fit did not converge after ${fit.iterations} iterations: centres and widths are not reliable`,
    );
  }
  for (const b of bands) {
    if (b.held?.includes("fwhmCm1")) {
      warnings.push(
        `band near ${b.centerNm.toFixed(1)} nm: width held at a bound (${
          b.fwhmCm1.toFixed(0)
        } cm⁻¹), given without σ`,
      );
    }
  }
  for (const f of structure.features.slice(0, 3)) {
    const nm = wavenumberToNm(f.centerCm1).toFixed(0);
    warnings.push(
      f.sign > 0
        ? `residual above noise near ${nm} nm: an unresolved band?`
        : `residual below the model near ${nm} nm: a band shape or baseline the model lacks?`,
    );
  }
  return {
    bands,
    baseline: fit.baseline,
    residualRms: Math.sqrt(rss / n),
    noiseSigma: Math.sqrt(noise / n),
    reducedChi2: fit.chi2 / Math.max(1, n - fit.parameters),
    converged: fit.converged,
    iterations: fit.iterations,
    ordinate,
    criterion: "BIC",
    models: tried.map((t) => ({
      bands: t.fit.bands.length,
      edge: t.fit.spec.edgeWidthCm1 !== undefined,
      parameters: t.fit.parameters,
      chi2: t.fit.chi2,
      aic: t.aic,
      bic: t.bic,
      chosen: t.fit === chosen,
    })),
    runsZ: structure.runsZ,
    warnings,
    curve: { cm1: data.x, data: data.y, model: fit.model, sigma: data.sigma },
  };
}

/** Options of {@linkcode fitSpectrumBands}. */
export interface SpectrumFitOptions extends FitOptions, UsableRangeOptions {
  /** Wavelength range to fit, nm (default the whole spectrum). */
  rangeNm?: [number, number];
  /** Instrument resolution (FWHM), nm; no band is fitted narrower. Default 2 grid steps. */
  resolutionNm?: number;
}

/** Noise σ and usable points of a spectrum's fitted ordinate (absorbance or α). */
export function spectrumNoise(
  spectrum: Spectrum,
  options: UsableRangeOptions = {},
): {
  values: Float64Array<ArrayBuffer>;
  sigma: Float64Array<ArrayBuffer>;
  usable: ReturnType<typeof usableRange>;
  ordinate: BandFit["ordinate"];
} {
  const alpha = spectrum.quantity === "alpha";
  const d = spectrum.thicknessMm;
  const absorbance = !alpha || (d !== undefined && d > 0)
    ? spectrumAbsorbance(spectrum)
    : undefined;
  const values = alpha ? spectrum.values.slice() : absorbance!;
  const usable = usableRange(spectrum.wavelengthNm, spectrum.values, absorbance, options);
  // propagated photometric gain |∂y/∂T|: 1/(T ln 10) for absorbance, 1/(T d) for α
  const gain = absorbance
    ? Float64Array.from(absorbance, (a) => {
      const t = 10 ** -Math.min(a, 8);
      return alpha ? 1 / (t * (d! / 10)) : 1 / (t * Math.LN10);
    })
    : undefined;
  // the gain at the smoothed ordinate: the measured one is itself noisy where T is small
  let smoothGain = gain;
  if (gain && absorbance) {
    const smoothA = Float64Array.from(absorbance);
    for (let i = 3; i < smoothA.length - 3; i++) {
      let s = 0;
      for (let k = -3; k <= 3; k++) s += absorbance[i + k]!;
      smoothA[i] = s / 7;
    }
    smoothGain = Float64Array.from(smoothA, (a) => {
      const t = 10 ** -Math.min(a, 8);
      return alpha ? 1 / (t * (d! / 10)) : 1 / (t * Math.LN10);
    });
  }
  // α without a thickness: T is unknown, so the noise is modelled as σ² = a + b·α², growing
  // with α as it does where α comes from a falling T (our choice)
  if (!smoothGain) {
    const { smooth } = smoothResidual(values);
    smoothGain = Float64Array.from(smooth, (v) => Math.abs(v));
  }
  const noise = ordinateNoise(values, smoothGain, usable.usable);
  return { values, sigma: noise.sigma, usable, ordinate: alpha ? "alpha" : "absorbance" };
}

/**
 * Fits the bands of a spectrum on its usable range: α when the spectrum holds α, else decadic
 * absorbance as measured; weights from the propagated photometric noise.
 *
 * @param noise The spectrum's noise and usable range when already known (from {@linkcode spectrumNoise}).
 */
export function fitSpectrumBands(
  spectrum: Spectrum,
  options: SpectrumFitOptions = {},
  noise: ReturnType<typeof spectrumNoise> = spectrumNoise(spectrum, options),
): BandFit {
  const x = spectrum.wavelengthNm.map(nmToWavenumber);
  const opts: FitOptions = { ...options, sigma: noise.sigma, usable: noise.usable.usable };
  if (options.rangeNm) {
    opts.rangeCm1 = [nmToWavenumber(options.rangeNm[1]), nmToWavenumber(options.rangeNm[0])];
  }
  if (options.resolutionNm !== undefined && options.minFwhmCm1 === undefined) {
    const r = options.resolutionNm;
    opts.minFwhmCm1 = (c) => (c * c * r) / 1e7;
  }
  const fit = fitBandsCm1(x, noise.values, opts, noise.ordinate);
  fit.excluded = noise.usable.excluded;
  return fit;
}

/**
 * One fit of a fixed band model by variable projection (Golub & Pereyra, SIAM J. Numer.
 * Anal. 10, 413 (1973)): band heights, baseline coefficients and the edge amplitude are
 * linear and solved exactly at every step; only centres, widths and the edge's Urbach-type
 * width are iterated. Private to lib/bands.
 *
 * @module
 */
import { wavenumberToNm } from "../spectrum/axis.ts";
import { bandArea, type BandShape, FWHM_PER_SIGMA } from "./band_model.ts";
import { type SeparableModel, variableProjection } from "../numeric/variable_projection.ts";

/** Baseline term names: constant, linear, quadratic in t = (ν̃ − mid)/half, λ⁻⁴ scatter. */
export type BaselineTerm = "b0" | "b1" | "b2" | "scatter";

/** Start of one band (heights are linear and need no start). */
export interface BandStart {
  centerCm1: number;
  fwhmCm1: number;
  shape: BandShape;
}

/** A fitted band with 1σ standard errors (null when held at a bound or not determined). */
export interface FittedBand {
  /** Band shape (Gaussian in wavenumber, or Lorentzian for sharp lines). */
  shape: BandShape;
  /** Centre, cm⁻¹. */
  centerCm1: number;
  /** σ of the centre, cm⁻¹; null when held at a bound. */
  centerCm1Sigma: number | null;
  /** Centre, nm. */
  centerNm: number;
  /** σ of the centre, nm; null when held. */
  centerNmSigma: number | null;
  /** Full width at half maximum, cm⁻¹. */
  fwhmCm1: number;
  /** σ of the width; null when held. */
  fwhmCm1Sigma: number | null;
  /** Peak height in the fitted ordinate. */
  height: number;
  /** σ of the height (linear, never held); Infinity when the data do not determine it. */
  heightSigma: number;
  /** Integral over cm⁻¹, in ordinate units × cm⁻¹. */
  area: number;
  /** σ of the area; Infinity when the data do not determine the height. */
  areaSigma: number;
  /** Parameters that ended at a bound: fixed there, kept out of the covariance. */
  held?: ("centerCm1" | "fwhmCm1")[];
}

/**
 * The fitted baseline: b0 + b1·t + b2·t² + scatter·(ν̃/20000)⁴, t = (ν̃ − mid)/half, plus,
 * when the absorption edge reaches into the range, an Urbach-type term
 * edge.amplitude · exp((ν̃ − edge.refCm1)/edge.widthCm1) (Urbach, Phys. Rev. 92, 1324 (1953)).
 */
export interface FittedBaseline {
  /** Constant term. */
  b0: number;
  /** Linear term (in t). */
  b1: number;
  /** Quadratic term (in t). */
  b2: number;
  /** Coefficient of the (ν̃/20000)⁴ scattering term. */
  scatter: number;
  /** Centre of the fitted range, cm⁻¹. */
  midCm1: number;
  /** Half-width of the fitted range, cm⁻¹. */
  halfCm1: number;
  /** Urbach-type edge term, when the model keeps it. */
  edge?: { amplitude: number; widthCm1: number; widthCm1Sigma: number | null; refCm1: number };
}

/** The data of a fit: ascending wavenumbers, values and noise σ per point. */
export interface FitData {
  x: Float64Array<ArrayBuffer>;
  y: Float64Array<ArrayBuffer>;
  sigma: Float64Array<ArrayBuffer>;
}

/** The model of a fit. */
export interface ModelSpec {
  bands: BandStart[];
  baselineTerms: BaselineTerm[];
  /** Start width (cm⁻¹) of the edge term, or undefined for no edge term. */
  edgeWidthCm1?: number;
  /** Smallest FWHM allowed at a centre (the resolution cap), cm⁻¹. */
  minFwhmCm1: (centerCm1: number) => number;
}

/** One fitted model. */
export interface ModelFit {
  spec: ModelSpec;
  bands: FittedBand[];
  baseline: FittedBaseline;
  model: Float64Array<ArrayBuffer>;
  /** Weighted residual sum of squares Σ((y − model)/σ)². */
  chi2: number;
  parameters: number;
  converged: boolean;
  iterations: number;
}

/** The separable model of a band spec on ascending wavenumbers x, with its starts and bounds. */
export interface BandSeparableModel {
  model: SeparableModel;
  start: Float64Array;
  lower: Float64Array;
  upper: Float64Array;
  /** Centre and half-width of the range (the baseline's t), and its top (the edge's reference). */
  mid: number;
  half: number;
  top: number;
}

/**
 * Builds the separable model of a spec: nonlinear θ = [centre, FWHM] per band (then the edge
 * width), basis columns = bands, baseline terms, edge; with first and second derivatives.
 */
export function bandSeparableModel(x: Float64Array, spec: ModelSpec): BandSeparableModel {
  const n = x.length;
  const nb = spec.bands.length, nt = spec.baselineTerms.length;
  const hasEdge = spec.edgeWidthCm1 !== undefined;
  const m = nb + nt + (hasEdge ? 1 : 0);
  const q = 2 * nb + (hasEdge ? 1 : 0);
  const mid = (x[0]! + x[n - 1]!) / 2, half = Math.max((x[n - 1]! - x[0]!) / 2, 1);
  const top = x[n - 1]!, span = x[n - 1]! - x[0]!;
  const columnOf = new Int32Array(q);
  const start = new Float64Array(q), lower = new Float64Array(q), upper = new Float64Array(q);
  spec.bands.forEach((b, k) => {
    columnOf[2 * k] = k;
    columnOf[2 * k + 1] = k;
    const minF = spec.minFwhmCm1(b.centerCm1);
    start[2 * k] = Math.min(Math.max(b.centerCm1, x[0]!), top);
    start[2 * k + 1] = Math.max(b.fwhmCm1, minF);
    lower[2 * k] = x[0]!;
    upper[2 * k] = top;
    lower[2 * k + 1] = minF;
    upper[2 * k + 1] = Math.max(span, 4 * b.fwhmCm1);
  });
  if (hasEdge) {
    columnOf[q - 1] = m - 1;
    const minW = spec.minFwhmCm1(top);
    start[q - 1] = Math.min(Math.max(spec.edgeWidthCm1!, minW), span);
    lower[q - 1] = minW;
    upper[q - 1] = span;
  }
  const shapes = spec.bands.map((b) => b.shape);
  const basisValues = new Float64Array(n * nt);
  for (let i = 0; i < n; i++) {
    const t = (x[i]! - mid) / half;
    spec.baselineTerms.forEach((term, k) => {
      basisValues[k * n + i] = term === "b0"
        ? 1
        : term === "b1"
        ? t
        : term === "b2"
        ? t * t
        : (x[i]! / 20000) ** 4;
    });
  }
  const model: SeparableModel = {
    linearCount: m,
    columnOf,
    basis: (theta, phi, dphi) => {
      for (let b = 0; b < nb; b++) {
        const c = theta[2 * b]!, f = theta[2 * b + 1]!;
        const off = b * n, dc = 2 * b * n, df = (2 * b + 1) * n;
        if (shapes[b] === "gaussian") {
          const s = f / FWHM_PER_SIGMA, inv = 1 / (s * s);
          for (let i = 0; i < n; i++) {
            const d = x[i]! - c;
            const g = Math.exp(-0.5 * d * d * inv);
            phi[off + i] = g;
            if (dphi) {
              dphi[dc + i] = g * d * inv;
              dphi[df + i] = (g * d * d * inv) / f;
            }
          }
        } else {
          const hw = f / 2, inv = 1 / (hw * hw);
          for (let i = 0; i < n; i++) {
            const d = x[i]! - c;
            const l = 1 / (1 + d * d * inv);
            phi[off + i] = l;
            if (dphi) {
              dphi[dc + i] = 2 * l * l * d * inv;
              dphi[df + i] = (2 * l * l * d * d * inv) / f;
            }
          }
        }
      }
      phi.set(basisValues, nb * n);
      if (hasEdge) {
        const w = theta[q - 1]!, off = (m - 1) * n, dw = (q - 1) * n;
        for (let i = 0; i < n; i++) {
          const u = (x[i]! - top) / w;
          const e = Math.exp(u);
          phi[off + i] = e;
          if (dphi) dphi[dw + i] = (-e * u) / w;
        }
      }
    },
    // pairs (centre, centre), (centre, width), (width, width) per band, then (edge, edge)
    curvature: (theta, phi, d2phi) => {
      for (let b = 0; b < nb; b++) {
        const c = theta[2 * b]!, f = theta[2 * b + 1]!;
        const off = b * n, cc = 3 * b * n, cf = (3 * b + 1) * n, ff = (3 * b + 2) * n;
        if (shapes[b] === "gaussian") {
          const s = f / FWHM_PER_SIGMA, inv = 1 / (s * s);
          for (let i = 0; i < n; i++) {
            const d = x[i]! - c, g = phi[off + i]!, v = d * d * inv;
            d2phi[cc + i] = g * inv * (v - 1);
            d2phi[cf + i] = ((g * d * inv) / f) * (v - 2);
            d2phi[ff + i] = ((g * v) / (f * f)) * (v - 3);
          }
        } else {
          const hw = f / 2, inv = 1 / (hw * hw);
          for (let i = 0; i < n; i++) {
            const d = x[i]! - c, l = phi[off + i]!, v = d * d * inv;
            d2phi[cc + i] = 2 * l * l * inv * (4 * l * v - 1);
            d2phi[cf + i] = ((4 * l * l * d * inv) / f) * (2 * l * v - 1);
            d2phi[ff + i] = ((2 * l * l * v) / (f * f)) * (4 * l * v - 3);
          }
        }
      }
      if (hasEdge) {
        const w = theta[q - 1]!, off = (m - 1) * n, ww = 3 * nb * n;
        for (let i = 0; i < n; i++) {
          const u = (x[i]! - top) / w;
          d2phi[ww + i] = (phi[off + i]! * u * (u + 2)) / (w * w);
        }
      }
    },
  };
  return { model, start, lower, upper, mid, half, top };
}

/** Fits a fixed model once from its starts. */
export function fitModelOnce(data: FitData, spec: ModelSpec): ModelFit {
  const { x, y, sigma } = data;
  const nb = spec.bands.length, nt = spec.baselineTerms.length;
  const hasEdge = spec.edgeWidthCm1 !== undefined;
  const m = nb + nt + (hasEdge ? 1 : 0);
  const q = 2 * nb + (hasEdge ? 1 : 0);
  const { model, start, lower, upper, mid, half, top } = bandSeparableModel(x, spec);
  const weights = Float64Array.from(sigma, (s) => 1 / (s * s));
  const fit = variableProjection(y, model, start, { lower, upper, weights });
  const p = q + m;
  const sig = (k: number) => fit.sigmas[k] ?? null;
  const bands: FittedBand[] = spec.bands.map((b, k) => {
    const c = fit.nonlinear[2 * k]!, f = fit.nonlinear[2 * k + 1]!, h = fit.linear[k]!;
    const sc = sig(2 * k), sf = sig(2 * k + 1), sh = sig(q + k) ?? Infinity;
    const unit = bandArea(1, 1, b.shape);
    let areaSigma = Infinity;
    if (Number.isFinite(sh)) {
      const cov = sf === null ? 0 : fit.covariance[(2 * k + 1) * p + q + k]!;
      const v = unit * unit * (f * f * sh * sh + h * h * (sf ?? 0) ** 2 + 2 * h * f * cov);
      areaSigma = Math.sqrt(Math.max(v, 0));
    }
    const held: ("centerCm1" | "fwhmCm1")[] = [];
    if (fit.held[2 * k]) held.push("centerCm1");
    if (fit.held[2 * k + 1]) held.push("fwhmCm1");
    const band: FittedBand = {
      shape: b.shape,
      centerCm1: c,
      centerCm1Sigma: sc,
      centerNm: wavenumberToNm(c),
      centerNmSigma: sc === null ? null : (wavenumberToNm(c) / c) * sc, // |dλ/dν̃| = 10⁷/ν̃²
      fwhmCm1: f,
      fwhmCm1Sigma: sf,
      height: h,
      heightSigma: sh,
      area: bandArea(h, f, b.shape),
      areaSigma,
    };
    if (held.length) band.held = held;
    return band;
  });
  const coef = (term: BaselineTerm) => {
    const k = spec.baselineTerms.indexOf(term);
    return k < 0 ? 0 : fit.linear[nb + k]!;
  };
  const baseline: FittedBaseline = {
    b0: coef("b0"),
    b1: coef("b1"),
    b2: coef("b2"),
    scatter: coef("scatter"),
    midCm1: mid,
    halfCm1: half,
  };
  if (hasEdge) {
    baseline.edge = {
      amplitude: fit.linear[m - 1]!,
      widthCm1: fit.nonlinear[q - 1]!,
      widthCm1Sigma: sig(q - 1),
      refCm1: top,
    };
  }
  return {
    spec,
    bands,
    baseline,
    model: Float64Array.from(fit.model),
    chi2: fit.rss,
    parameters: p,
    converged: fit.converged,
    iterations: fit.iterations,
  };
}

/**
 * Fits a fixed model; when the first start does not converge, tries widths scaled by 0.7
 * and 1.4 and keeps the converged fit of least χ².
 */
export function fitModel(data: FitData, spec: ModelSpec): ModelFit {
  const first = fitModelOnce(data, spec);
  if (first.converged) return first;
  let best = first;
  for (const scale of [0.7, 1.4]) {
    const again = fitModelOnce(data, {
      ...spec,
      bands: spec.bands.map((b) => ({ ...b, fwhmCm1: b.fwhmCm1 * scale })),
    });
    if (
      (again.converged && !best.converged) ||
      (again.converged === best.converged && again.chi2 < best.chi2)
    ) {
      best = again;
    }
  }
  return best;
}

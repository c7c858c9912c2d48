/**
 * Per-point noise of a measured ordinate, from the residual of a local smooth fit on the
 * original grid (7-point cubic Savitzky–Golay, Savitzky & Golay 1964; the residual of a
 * least-squares smoother has variance σ²(1 − w₀), w₀ its centre weight), modelled as
 * σᵢ² = a + b·gᵢ², gᵢ the propagated photometric gain: a noise σ_T in transmittance gives
 * σ_A = σ_T/(T ln 10) in absorbance (first-order propagation, JCGM 100:2008 §5.1.2).
 *
 * @module
 */
import { savitzkyGolayWeights } from "../numeric/savitzky_golay.ts";

/** A fitted noise model. */
export interface OrdinateNoise {
  /** Noise σ at each point, ordinate units. */
  sigma: Float64Array<ArrayBuffer>;
  /** The constant part √a, ordinate units. */
  floorSigma: number;
  /** The photometric part √b: σ of the transmittance reading (fraction) when gains are given. */
  transmittanceSigma: number;
}

const HALF = 3;

/** Residual of the 7-point cubic smoother and its variance factor 1 − w₀. */
export function smoothResidual(values: ArrayLike<number>): {
  residual: Float64Array<ArrayBuffer>;
  smooth: Float64Array<ArrayBuffer>;
  factor: number;
} {
  const w = savitzkyGolayWeights(HALF, 3, 0);
  const n = values.length;
  const residual = new Float64Array(n), smooth = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    if (i < HALF || i >= n - HALF) {
      smooth[i] = values[i]!;
      residual[i] = NaN;
      continue;
    }
    let s = 0;
    for (let k = -HALF; k <= HALF; k++) s += w[k + HALF]! * values[i + k]!;
    smooth[i] = s;
    residual[i] = values[i]! - s;
  }
  return { residual, smooth, factor: 1 - w[HALF]! };
}

/**
 * Noise σ per point of `values` (any ordinate on its own measured grid).
 *
 * @param gain |∂ordinate/∂T| per point (1/(T ln 10) for absorbance); omit for uniform noise.
 * @param use Points to learn from (default all); others still get a σ from the model.
 */
export function ordinateNoise(
  values: ArrayLike<number>,
  gain?: ArrayLike<number>,
  use?: ArrayLike<number>,
): OrdinateNoise {
  const n = values.length;
  const { residual, factor } = smoothResidual(values);
  const idx: number[] = [];
  for (let i = 0; i < n; i++) {
    if (Number.isFinite(residual[i]!) && (!use || use[i])) idx.push(i);
  }
  const r2 = idx.map((i) => residual[i]! ** 2 / factor);
  const g2 = idx.map((i) => (gain ? gain[i]! ** 2 : 0));
  let a = 0, b = 0;
  let keep = idx.map(() => true);
  // r² has variance 2σ⁴, so the regression of r² on [1, g²] is weighted by 1/σ⁴ of the
  // previous pass (iteratively reweighted least squares), both coefficients kept ≥ 0, and
  // points beyond 3σ of the previous model left out (a sharp line leaks into the residual)
  for (let pass = 0; pass < 6; pass++) {
    let s11 = 0, s12 = 0, s22 = 0, t1 = 0, t2 = 0, count = 0;
    for (let k = 0; k < idx.length; k++) {
      if (!keep[k]) continue;
      const model = pass === 0 ? 1 : a + b * g2[k]!;
      const w = 1 / Math.max(model * model, 1e-300);
      count++;
      s11 += w;
      s12 += w * g2[k]!;
      s22 += w * g2[k]! ** 2;
      t1 += w * r2[k]!;
      t2 += w * g2[k]! * r2[k]!;
    }
    if (count < 3) break;
    const det = s11 * s22 - s12 * s12;
    if (gain && det > 1e-12 * s11 * s22) {
      a = (t1 * s22 - t2 * s12) / det;
      b = (s11 * t2 - s12 * t1) / det;
    } else {
      a = t1 / s11;
      b = 0;
    }
    if (a < 0) {
      a = 0;
      b = s22 > 0 ? t2 / s22 : 0;
    }
    if (b < 0) {
      b = 0;
      a = t1 / s11;
    }
    if (pass >= 1) keep = r2.map((v, k) => v <= 9 * (a + b * g2[k]!));
  }
  // mean of a χ²₁ variable given it is below 9: F₃(9)/F₁(9) = 0.97071/0.99730 = 0.97334
  // (closed form, x·f₁(x) = f₃(x) for χ² densities)
  a /= 0.97334;
  b /= 0.97334;
  const sigma = new Float64Array(n);
  const smallest = Math.max(Math.sqrt(a + b * Math.min(...g2, Infinity)), 1e-15);
  for (let i = 0; i < n; i++) {
    const s = Math.sqrt(a + b * (gain ? gain[i]! ** 2 : 0));
    sigma[i] = Number.isFinite(s) && s > 0 ? s : smallest;
  }
  return { sigma, floorSigma: Math.sqrt(a), transmittanceSigma: Math.sqrt(b) };
}

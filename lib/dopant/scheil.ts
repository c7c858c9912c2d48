/**
 * Segregation along a boule: the Scheil (normal-freezing) relation
 * C_s(g) = k·C₀·(1 − g)^(k − 1) (Scheil, Z. Metallkd. 34, 70 (1942); Pfann 1952) fitted for
 * the effective distribution coefficient k_eff and the melt concentration C₀, and the
 * Burton–Prim–Slichter relation for k_eff from the growth rate (J. Chem. Phys. 21, 1987 (1953)).
 *
 * @module
 */
import { levenbergMarquardt } from "../numeric/levenberg_marquardt.ts";

/** One measurement along the boule. */
export interface SegregationPoint {
  /** Solidified fraction g, 0 ≤ g < 1. */
  fraction: number;
  /** Dopant concentration there. */
  concentration: number;
  /** Its standard uncertainty. */
  sigma?: number;
}

/** A Scheil fit with 1σ standard errors. */
export interface ScheilFit {
  /** Effective distribution coefficient. */
  k: number;
  /** Standard error of k. */
  kSigma: number;
  c0: number;
  c0Sigma: number;
  /** RMS residual of the fit. */
  residualRms: number;
  /** Number of points. */
  n: number;
}

/** Scheil's C_s/C₀ at solidified fraction g for distribution coefficient k. */
export function scheilRatio(g: number, k: number): number {
  return k * (1 - g) ** (k - 1);
}

/** Solidified fraction of a cylindrical boule from a position measured from the seed end. */
export function fractionFromPosition(positionMm: number, lengthMm: number): number {
  if (!(lengthMm > 0) || positionMm < 0 || positionMm >= lengthMm) {
    throw new RangeError(`Cannot convert position ${positionMm} mm on a ${lengthMm} mm boule`);
  }
  return positionMm / lengthMm;
}

/**
 * Fits k_eff and C₀: a straight line in ln C_s vs ln(1 − g) for the start, then least squares
 * on C_s itself (weighted by 1/σ² when every point has σ).
 *
 * @throws {RangeError} For fewer than 3 points or fractions outside 0 ≤ g < 1.
 */
export function fitScheil(points: SegregationPoint[]): ScheilFit {
  const n = points.length;
  if (n < 3) throw new RangeError(`Cannot fit Scheil: ${n} points, need at least 3`);
  for (const p of points) {
    if (!(p.fraction >= 0 && p.fraction < 1) || !(p.concentration > 0)) {
      throw new RangeError(
        `Cannot fit Scheil: fraction ${p.fraction} or concentration ${p.concentration} out of range`,
      );
    }
  }
  const lx = points.map((p) => Math.log(1 - p.fraction)),
    ly = points.map((p) => Math.log(p.concentration));
  const mx = lx.reduce((a, b) => a + b, 0) / n, my = ly.reduce((a, b) => a + b, 0) / n;
  const sxx = lx.reduce((s, x) => s + (x - mx) ** 2, 0);
  const slope = sxx > 0 ? lx.reduce((s, x, i) => s + (x - mx) * (ly[i]! - my), 0) / sxx : 0;
  const k0 = slope + 1, kc0 = Math.exp(my - slope * mx);
  const y = Float64Array.from(points, (p) => p.concentration);
  const weights = points.every((p) => (p.sigma ?? 0) > 0)
    ? Float64Array.from(points, (p) => 1 / p.sigma! ** 2)
    : undefined;
  const model = (par: Float64Array, out: Float64Array, jac?: Float64Array) => {
    const [k, c0] = [par[0]!, par[1]!];
    points.forEach((p, i) => {
      const q = 1 - p.fraction;
      const pow = q ** (k - 1);
      out[i] = k * c0 * pow;
      if (jac) {
        jac[2 * i] = c0 * pow + k * c0 * pow * Math.log(q);
        jac[2 * i + 1] = k * pow;
      }
    });
  };
  const start = Float64Array.of(Math.max(k0, 1e-3), kc0 / Math.max(k0, 1e-3));
  const fit = levenbergMarquardt(y, model, start, {
    lower: Float64Array.of(1e-4, 0),
    upper: Float64Array.of(50, Infinity),
    ...(weights ? { weights } : {}),
  });
  return {
    k: fit.params[0]!,
    kSigma: fit.sigmas[0]!,
    c0: fit.params[1]!,
    c0Sigma: fit.sigmas[1]!,
    residualRms: Math.sqrt(fit.rss / (weights ? weights.reduce((a, b) => a + b, 0) : n)),
    n,
  };
}

/**
 * Burton–Prim–Slichter effective distribution coefficient:
 * k_eff = k₀ / (k₀ + (1 − k₀) exp(−v δ / D)).
 *
 * @param growthRateCmPerS Growth velocity v; `boundaryLayerCm` δ; `diffusionCm2PerS` D.
 */
export function bpsEffectiveK(
  k0: number,
  growthRateCmPerS: number,
  boundaryLayerCm: number,
  diffusionCm2PerS: number,
): number {
  return k0 / (k0 + (1 - k0) * Math.exp((-growthRateCmPerS * boundaryLayerCm) / diffusionCm2PerS));
}

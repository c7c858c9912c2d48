/**
 * Finds candidate absorption bands: minima of the Savitzky–Golay second derivative in
 * wavenumber at several window sizes, kept when they stand out from the noise (estimated
 * from the data by the median absolute deviation of point-to-point differences).
 *
 * @module
 */
import { savitzkyGolay, savitzkyGolayWeights } from "../numeric/savitzky_golay.ts";
import { FWHM_PER_SIGMA } from "./band_model.ts";
import { resampleLinear } from "../spectrum/linear_resample.ts";

/** A band candidate with rough starting values for the fit. */
export interface BandCandidate {
  /** Centre, cm⁻¹. */
  centerCm1: number;
  /** Width, cm⁻¹. */
  fwhmCm1: number;
  /** Height in the ordinate. */
  height: number;
  /** Second-derivative depth in units of its noise. */
  significance: number;
}

/** Robust noise σ of uniformly sampled data: MAD of differences / (0.6745 √2). */
export function estimateNoise(values: ArrayLike<number>): number {
  const d: number[] = [];
  for (let i = 1; i < values.length; i++) d.push(values[i]! - values[i - 1]!);
  d.sort((a, b) => a - b);
  const med = d[Math.floor(d.length / 2)] ?? 0;
  const dev = d.map((v) => Math.abs(v - med)).sort((a, b) => a - b);
  return (dev[Math.floor(dev.length / 2)] ?? 0) / 0.6745 / Math.SQRT2;
}

/**
 * Local noise σ at each point: the robust estimate of {@linkcode estimateNoise} over a moving
 * window of ±`half` points, never below the global estimate. Absorbance computed from transmittance is far noisier where T is
 * small, so one global figure would either drown weak bands or invent bands in dark regions.
 */
export function localNoise(values: ArrayLike<number>, half = 40): Float64Array {
  const n = values.length;
  const out = new Float64Array(n);
  const global = estimateNoise(values);
  const step = Math.max(1, Math.floor(half / 2));
  for (let c = 0; c < n; c += step) {
    const lo = Math.max(0, c - half), hi = Math.min(n, c + half + 1);
    const slice: number[] = [];
    for (let i = lo; i < hi; i++) slice.push(values[i]!);
    const sigma = slice.length > 5 ? estimateNoise(slice) : global;
    // never below the global figure: a window's own estimate scatters, and lowering the
    // threshold on that scatter would invent bands
    for (let i = c; i < Math.min(n, c + step); i++) out[i] = Math.max(sigma, global, 1e-12);
  }
  return out;
}

/** Resamples (x ascending) onto a uniform grid of the same length, linearly. */
export function uniformResample(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
): { x: Float64Array; y: Float64Array; step: number } {
  const n = x.length;
  const step = (x[n - 1]! - x[0]!) / (n - 1);
  const ux = Float64Array.from({ length: n }, (_, i) => x[0]! + i * step);
  return { x: ux, y: resampleLinear(x, y, ux), step };
}

/** Options of {@linkcode detectBands}. */
export interface DetectOptions {
  /** Second-derivative depth, in noise units, that makes a candidate (default 5; common practice). */
  threshold?: number;
  /** Smallest band height, in noise units of the data (default 5; common practice). */
  minHeightSigma?: number;
  /** Window half-widths to try, cm⁻¹ (default 40, 150, 500, 1200). */
  scalesCm1?: number[];
  /** Noise σ per input point (e.g. propagated photometric noise); estimated from the data when omitted. */
  noiseSigma?: ArrayLike<number>;
}

/**
 * Band candidates in data y(x), x in cm⁻¹ ascending (absorbance or α).
 */
export function detectBands(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  options: DetectOptions = {},
): BandCandidate[] {
  const { threshold = 5, minHeightSigma = 5, scalesCm1 = [40, 150, 500, 1200] } = options;
  const u = uniformResample(x, y);
  const n = u.x.length;
  const local = options.noiseSigma ? resampleLinear(x, options.noiseSigma, u.x) : localNoise(u.y);
  const noise = Math.max(
    options.noiseSigma ? [...local].sort((a, b) => a - b)[0]! : estimateNoise(u.y),
    1e-12,
  );
  // Fine scales first: a coarser window only adds a band where no finer one found any, so
  // overlapping bands resolved at a fine scale are not swallowed by their blurred sum.
  const kept: (BandCandidate & { lo: number; hi: number })[] = [];
  for (const scale of [...scalesCm1].sort((a, b) => a - b)) {
    const half = Math.round(scale / u.step);
    if (half < 2 || 2 * half + 1 > n / 2) continue;
    const d2 = savitzkyGolay(u.y, half, 3, 2, u.step);
    const smooth = savitzkyGolay(u.y, half, 3, 0, u.step);
    const w = savitzkyGolayWeights(half, 3, 2);
    const d2Noise = noise * Math.sqrt(w.reduce((s, v) => s + v * v, 0)) / (u.step * u.step);
    const lobes = new Map<number, BandCandidate & { lo: number; hi: number }>();
    for (let i = half; i < n - half; i++) {
      const v = d2[i]!;
      const here = local[i]! / noise;
      if (!(v < d2[i - 1]! && v <= d2[i + 1]!) || -v < threshold * d2Noise * here) continue;
      let lo = i, hi = i;
      while (lo > 0 && d2[lo]! < 0) lo--;
      while (hi < n - 1 && d2[hi]! < 0) hi++;
      const sigma = (u.x[hi]! - u.x[lo]!) / 2;
      const fwhm = Math.max(sigma * FWHM_PER_SIGMA, 2 * u.step);
      // height from the curvature of a Gaussian at its centre: y'' = −h/σ²
      const height = Math.min(-v * sigma * sigma, Math.max(smooth[i]!, 0));
      if (!(height > minHeightSigma * local[i]!)) continue;
      const c = {
        centerCm1: u.x[i]!,
        fwhmCm1: fwhm,
        height,
        significance: -v / d2Noise,
        lo: u.x[lo]!,
        hi: u.x[hi]!,
      };
      const same = lobes.get(lo);
      if (!same || c.significance > same.significance) lobes.set(lo, c);
    }
    for (const c of lobes.values()) {
      if (
        kept.some((k) =>
          (k.centerCm1 >= c.lo && k.centerCm1 <= c.hi) ||
          Math.abs(k.centerCm1 - c.centerCm1) < 0.5 * k.fwhmCm1
        )
      ) continue;
      kept.push(c);
    }
  }
  return kept
    .map(({ centerCm1, fwhmCm1, height, significance }) => ({
      centerCm1,
      fwhmCm1,
      height,
      significance,
    }))
    .sort((a, b) => a.centerCm1 - b.centerCm1);
}

/**
 * The usable range of a measured spectrum: points where the reading carries information.
 * Left out are transmittance below the photometric floor (by default 10σ_T, σ_T the noise of
 * the transmittance reading estimated from the data: below it the relative error of T passes
 * 10 %, the absorbance −log T gets a bias of σ_T²/(2T² ln 10) and first-order propagation of
 * the noise no longer holds — our choice), absorbance above a stated
 * instrument limit, and clipped stretches (the same extreme value repeated).
 *
 * @module
 */
import { smoothResidual } from "./ordinate_noise.ts";

/** Why a stretch of a spectrum was left out. */
export type ExclusionReason =
  | "photometric floor"
  | "above absorbance limit"
  | "clipped"
  | "absorption edge";

/** A stretch left out of detection and fitting. */
export interface ExcludedRange {
  /** Start, nm. */
  fromNm: number;
  /** End, nm. */
  toNm: number;
  /** Why (saturation, photometric floor, clipping, edge). */
  reason: ExclusionReason;
}

/** Options of {@linkcode usableRange}. */
export interface UsableRangeOptions {
  /** Transmittance (fraction) below which readings are left out; default 10σ_T from the data. */
  floorTransmittance?: number;
  /** Decadic absorbance above which readings are left out (the instrument's limit). */
  maxAbsorbance?: number;
}

/** Result of {@linkcode usableRange}. */
export interface UsableRange {
  /** 1 for a usable point, 0 for a left-out one (same grid as the input). */
  usable: Uint8Array;
  excluded: ExcludedRange[];
  /** The floor used (fraction), or null when the ordinate has no transmittance. */
  floorTransmittance: number | null;
  /** Noise σ of the transmittance reading estimated from the data (fraction), or null. */
  transmittanceSigma: number | null;
}

/** Points counted as a clipped run: this many equal extreme values in a row (our choice). */
const CLIP_RUN = 3;
/** The default floor in units of σ_T (see the module note). */
export const FLOOR_SIGMAS = 10;
/** Points added on each side of a left-out stretch (the smoother's half-width). */
const PAD = 3;

/**
 * Finds the usable points of a spectrum.
 *
 * @param wavelengthNm Ascending wavelengths, nm.
 * @param values The measured ordinate (clipping is looked for here).
 * @param absorbance Decadic absorbance as measured, or undefined when it is not known (α
 *   without thickness): then only clipping is looked for.
 */
export function usableRange(
  wavelengthNm: ArrayLike<number>,
  values: ArrayLike<number>,
  absorbance: ArrayLike<number> | undefined,
  options: UsableRangeOptions = {},
): UsableRange {
  const n = wavelengthNm.length;
  const reason: (ExclusionReason | undefined)[] = new Array(n).fill(undefined);
  // clipped: runs of identical values at the data's maximum or minimum
  let max = -Infinity, min = Infinity;
  for (let i = 0; i < n; i++) {
    max = Math.max(max, values[i]!);
    min = Math.min(min, values[i]!);
  }
  for (let i = 0; i < n;) {
    let j = i;
    while (j + 1 < n && values[j + 1] === values[i]) j++;
    const extreme = values[i] === max || values[i] === min;
    if (extreme && j - i + 1 >= CLIP_RUN && max > min) {
      for (let k = i; k <= j; k++) reason[k] = "clipped";
    }
    i = j + 1;
  }
  let floor: number | null = null, sigmaT: number | null = null;
  if (absorbance) {
    const t = Float64Array.from({ length: n }, (_, i) => 10 ** -absorbance[i]!);
    const { residual, smooth, factor } = smoothResidual(t);
    // σ_T from the bright part, where the reading is far above any dark level
    const bright: number[] = [];
    for (let i = 0; i < n; i++) {
      if (smooth[i]! > 0.05 && Number.isFinite(residual[i]!)) bright.push(Math.abs(residual[i]!));
    }
    bright.sort((a, b) => a - b);
    const mad = bright.length >= 10 ? bright[Math.floor(bright.length / 2)]! : NaN;
    sigmaT = Number.isFinite(mad) ? mad / 0.6745 / Math.sqrt(factor) : null;
    floor = options.floorTransmittance ?? (sigmaT !== null ? FLOOR_SIGMAS * sigmaT : null);
    for (let i = 0; i < n; i++) {
      if (reason[i]) continue;
      if (floor !== null && smooth[i]! < floor) reason[i] = "photometric floor";
      else if (options.maxAbsorbance !== undefined && absorbance[i]! > options.maxAbsorbance) {
        reason[i] = "above absorbance limit";
      }
    }
  }
  // widen each left-out stretch by the smoother's reach, and drop usable islands too short
  // to carry a band
  const padded = reason.slice();
  for (let i = 0; i < n; i++) {
    if (!reason[i]) continue;
    for (let k = Math.max(0, i - PAD); k <= Math.min(n - 1, i + PAD); k++) {
      padded[k] ??= reason[i];
    }
  }
  for (let i = 0; i < n;) {
    if (padded[i]) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < n && !padded[j + 1]) j++;
    if (j - i + 1 < 2 * PAD + 1 && (i > 0 || j < n - 1)) {
      const neighbour = padded[i - 1] ?? padded[j + 1]!;
      for (let k = i; k <= j; k++) padded[k] = neighbour;
    }
    i = j + 1;
  }
  const usable = Uint8Array.from(padded, (r) => (r ? 0 : 1));
  const excluded: ExcludedRange[] = [];
  for (let i = 0; i < n;) {
    if (!padded[i]) {
      i++;
      continue;
    }
    let j = i;
    while (j + 1 < n && padded[j + 1] === padded[i]) j++;
    excluded.push({ fromNm: wavelengthNm[i]!, toNm: wavelengthNm[j]!, reason: padded[i]! });
    i = j + 1;
  }
  return { usable, excluded, floorTransmittance: floor, transmittanceSigma: sigmaT };
}

/**
 * Tristimulus values of a transmitting or reflecting object (CIE 15:2018 §7, eq. 7.1–7.2):
 * X = k Σ S(λ) x̄(λ) T(λ) Δλ with k = 100 / Σ S(λ) ȳ(λ) Δλ, so a perfect transmitter has Y = 100.
 * The data are carried to the 1 nm grid linearly (see interpolate.ts), so the whole chain is a
 * set of weighting factors per input grid, built in linear time from the interpolation's own
 * linear form ({@linkcode resampleAdjoint}), computed once and cached — for 10/20 nm grids these
 * are the ASTM E308 weighting factors built by the ASTM E2022 procedure.
 *
 * @module
 */
import { getIlluminant, type Illuminant } from "./illuminants.ts";
import { getObserver, type Observer } from "./observers.ts";
import { GRID_END_NM, GRID_LENGTH, GRID_START_NM } from "./grid.ts";
import {
  chooseMethod,
  type InterpolationMethod,
  resampleAdjoint,
  resampleTo1nm,
} from "./interpolate.ts";

/** CIE XYZ tristimulus values on the Y = 100 scale. */
export interface Xyz {
  X: number;
  Y: number;
  Z: number;
}

/** Weighting factors that turn values on one wavelength grid into XYZ. */
export interface TristimulusWeights {
  /** Wavelengths of the data grid the weights belong to, nm. */
  readonly wavelengthNm: Float64Array<ArrayBuffer>;
  /**
   * Per-point factors on the data grid, for the linear interpolation methods (Sprague,
   * Lagrange, linear). Undefined for PCHIP, which is not linear in the data: then the data are
   * carried to 1 nm per spectrum and weighted with `gridX/Y/Z`.
   */
  readonly wx: Float64Array<ArrayBuffer> | undefined;
  readonly wy: Float64Array<ArrayBuffer> | undefined;
  readonly wz: Float64Array<ArrayBuffer> | undefined;
  /** The 1 nm factors k·S(λ)·x̄(λ), k·S(λ)·ȳ(λ), k·S(λ)·z̄(λ) on 360–830 nm. */
  readonly gridX: Float64Array<ArrayBuffer>;
  readonly gridY: Float64Array<ArrayBuffer>;
  readonly gridZ: Float64Array<ArrayBuffer>;
  /** XYZ of the perfect transmitter (the illuminant's white) for these weights. */
  readonly white: Xyz;
  readonly method: InterpolationMethod;
  readonly illuminant: string;
  readonly observer: string;
  /** True when the data do not cover 360–830 nm and end values were extended (CIE 15 §7.2.2). */
  readonly extrapolated: boolean;
}

/** The 1 nm weights k·S(λ)·x̄(λ) etc. for an illuminant and observer. */
function gridWeights(illuminant: Illuminant, observer: Observer) {
  const s = illuminant.spd;
  let norm = 0;
  for (let i = 0; i < GRID_LENGTH; i++) norm += s[i]! * observer.y[i]!;
  if (!(norm > 0)) {
    throw new RangeError(`Cannot normalise: illuminant ${illuminant.name} has no power`);
  }
  const k = 100 / norm;
  return {
    x: observer.x.map((v, i) => k * s[i]! * v),
    y: observer.y.map((v, i) => k * s[i]! * v),
    z: observer.z.map((v, i) => k * s[i]! * v),
  };
}

const cache = new Map<string, TristimulusWeights>();
const CACHE_LIMIT = 256;

function gridKey(wavelengthNm: ArrayLike<number>): string {
  let h = 2166136261;
  for (let i = 0; i < wavelengthNm.length; i++) {
    h = Math.imul(h ^ Math.round(wavelengthNm[i]! * 1e6), 16777619);
  }
  return `${wavelengthNm.length}:${wavelengthNm[0]}:${wavelengthNm[wavelengthNm.length - 1]}:${
    h >>> 0
  }`;
}

/**
 * Weighting factors for data on a given wavelength grid, cached per (grid, illuminant, observer).
 *
 * @param wavelengthNm Ascending wavelengths of the data, nm.
 * @param illuminant An {@linkcode Illuminant} or its name (e.g. `"D65"`).
 * @param observer `"2"` or `"10"`.
 * @throws {RangeError} When the grid does not reach into 360–830 nm.
 */
export function tristimulusWeights(
  wavelengthNm: ArrayLike<number>,
  illuminant: Illuminant | string,
  observer: string,
): TristimulusWeights {
  const illum = typeof illuminant === "string" ? getIlluminant(illuminant) : illuminant;
  const obs = getObserver(observer);
  const key = `${illum.key}|${obs.name}|${gridKey(wavelengthNm)}`;
  const hit = cache.get(key);
  if (hit) return hit;
  const n = wavelengthNm.length;
  if (n < 2 || wavelengthNm[n - 1]! < GRID_START_NM || wavelengthNm[0]! > GRID_END_NM) {
    throw new RangeError(
      `Cannot compute colour: data ${wavelengthNm[0]}–${
        wavelengthNm[n - 1]
      } nm do not overlap 360–830 nm`,
    );
  }
  const method = chooseMethod(wavelengthNm);
  const base = gridWeights(illum, obs);
  const grid = Float64Array.from(wavelengthNm);
  const extrapolated = grid[0]! > GRID_START_NM || grid[n - 1]! < GRID_END_NM;
  const sum = (w: Float64Array) => w.reduce((a, b) => a + b, 0);
  let wx: Float64Array<ArrayBuffer> | undefined, wy = wx, wz = wx;
  if (method !== "pchip") {
    wx = resampleAdjoint(grid, base.x, method);
    wy = resampleAdjoint(grid, base.y, method);
    wz = resampleAdjoint(grid, base.z, method);
  }
  const weights: TristimulusWeights = {
    wavelengthNm: grid,
    wx,
    wy,
    wz,
    gridX: base.x,
    gridY: base.y,
    gridZ: base.z,
    white: wx
      ? { X: sum(wx), Y: sum(wy!), Z: sum(wz!) }
      : { X: sum(base.x), Y: sum(base.y), Z: sum(base.z) },
    method,
    illuminant: illum.name,
    observer: obs.name,
    extrapolated,
  };
  if (cache.size >= CACHE_LIMIT) cache.delete(cache.keys().next().value!);
  cache.set(key, weights);
  return weights;
}

/** XYZ of values (T or R as fractions 0..1) on the grid the weights were built for. */
export function weightedXyz(values: ArrayLike<number>, weights: TristimulusWeights): Xyz {
  const n = weights.wavelengthNm.length;
  if (values.length !== n) {
    throw new RangeError(`Cannot weight ${values.length} values with factors for ${n} points`);
  }
  const { wx, wy, wz } = weights;
  const [fx, fy, fz, v] = wx && wy && wz ? [wx, wy, wz, values] : [
    weights.gridX,
    weights.gridY,
    weights.gridZ,
    resampleTo1nm(weights.wavelengthNm, values, weights.method).values,
  ];
  let X = 0, Y = 0, Z = 0;
  for (let i = 0; i < fx.length; i++) {
    const t = v[i]!;
    X += fx[i]! * t;
    Y += fy[i]! * t;
    Z += fz[i]! * t;
  }
  return { X, Y, Z };
}

/**
 * XYZ (Y = 100 for a perfect transmitter) of a transmittance or reflectance spectrum.
 *
 * @example Perfect transmitter gives the illuminant's white
 * ```ts
 * import { transmittanceToXyz } from "./tristimulus.ts";
 * const nm = Float64Array.from({ length: 81 }, (_, i) => 380 + 5 * i);
 * const { Y } = transmittanceToXyz(nm, new Float64Array(81).fill(1), "D65", "2");
 * if (Math.abs(Y - 100) > 1e-9) throw new Error("white must have Y = 100");
 * ```
 */
export function transmittanceToXyz(
  wavelengthNm: ArrayLike<number>,
  transmittance: ArrayLike<number>,
  illuminant: Illuminant | string,
  observer: string,
): Xyz {
  return weightedXyz(transmittance, tristimulusWeights(wavelengthNm, illuminant, observer));
}

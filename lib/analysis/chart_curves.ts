/**
 * The one place curves are thinned for the results: every k-th point so a curve keeps at most
 * `max` points, at a fixed storage precision. A wavelength axis of equal steps is stored as its
 * first value, step and count (most exports are on such a grid); {@linkcode axisValues} gives
 * back exactly the values the list would have held, and the values are stored as integer steps
 * ({@linkcode curveValues} gives them back exactly). Display rounding is the report builder's job.
 *
 * @module
 */
import { roundTo } from "../numeric/round.ts";
import { wavenumberToNm } from "../spectrum/axis.ts";

/** Most points a stored curve keeps (our choice: enough for any chart, small results). */
export const CURVE_POINTS = 300;

/** Decimals kept in stored curves: wavelength (nm) and ordinate values. */
const NM_DECIMALS = 2, VALUE_DECIMALS = 5;

/** A wavelength axis of equal steps: `from + i·step` (nm, at storage precision), i < count. */
export interface UniformAxis {
  /** The first wavelength, nm. */
  from: number;
  /** The step, nm (negative for a descending axis). */
  step: number;
  /** The number of points. */
  count: number;
}

/** A stored wavelength axis: its values, or its first value, step and count. */
export type StoredAxis = number[] | UniformAxis;

/** The value at i of a uniform axis, at the storage precision. */
function uniformAt(axis: UniformAxis, i: number): number {
  return roundTo(axis.from + i * axis.step, NM_DECIMALS);
}

/** The axis as from/step/count when that gives back every value exactly, else the values. */
function compactAxis(nm: number[]): StoredAxis {
  if (nm.length < 3) return nm;
  const axis = { from: nm[0]!, step: roundTo(nm[1]! - nm[0]!, NM_DECIMALS), count: nm.length };
  for (let i = 0; i < nm.length; i++) if (uniformAt(axis, i) !== nm[i]) return nm;
  return axis;
}

/**
 * The wavelengths of a stored axis (a list, kept by older results, is given as it is).
 *
 * @example Equal steps stored as from/step/count
 * ```ts
 * import { axisValues } from "./chart_curves.ts";
 * const nm = axisValues({ from: 830, step: -2, count: 3 });
 * if (nm.join() !== "830,828,826") throw new Error(nm.join());
 * ```
 */
export function axisValues(axis: StoredAxis): number[] {
  if (Array.isArray(axis)) return axis;
  return Array.from({ length: axis.count }, (_, i) => uniformAt(axis, i));
}

/** Indices of every k-th point so that at most `max` remain. */
function stride(length: number, max: number): number {
  return Math.max(1, Math.ceil(length / max));
}

/** A curve as integer steps: value i is (d[0] + … + d[i]) / q, q a power of ten. */
export interface PackedCurve {
  /** Scale: a power of ten (10^decimals). */
  q: number;
  /** Integer steps from one value to the next (the first from 0). */
  d: number[];
}

/** A stored curve: its values, or the same values as integer steps. */
export type StoredCurve = number[] | PackedCurve;

/**
 * Values already rounded to `decimals` as integer steps, which give back exactly the same
 * numbers (k/10^d is the double nearest to the decimal, as `Number(v.toFixed(d))` is); a curve
 * with a value that is not finite stays a list.
 */
export function packSteps(values: number[], decimals: number): StoredCurve {
  const q = 10 ** decimals;
  const d: number[] = [];
  let previous = 0;
  for (const v of values) {
    if (!Number.isFinite(v)) return values;
    const k = Math.round(v * q);
    d.push(k - previous);
    previous = k;
  }
  return { q, d };
}

/**
 * The values of a stored curve (a list, kept by older results, is given as it is).
 *
 * @example
 * ```ts
 * import { curveValues, packSteps } from "./chart_curves.ts";
 * const v = curveValues(packSteps([0.5, 0.51234, 0.4], 5));
 * if (v.join() !== "0.5,0.51234,0.4") throw new Error(v.join());
 * ```
 */
export function curveValues(curve: StoredCurve): number[] {
  if (Array.isArray(curve)) return curve;
  const out: number[] = [];
  let k = 0;
  for (const step of curve.d) {
    k += step;
    out.push(k / curve.q);
  }
  return out;
}

/** Transmittance against wavelength, thinned for the charts. */
export function thinTransmittance(
  nm: ArrayLike<number>,
  t: ArrayLike<number>,
  max = CURVE_POINTS,
): { nm: StoredAxis; t: StoredCurve } {
  const step = stride(nm.length, max);
  const outNm: number[] = [], outT: number[] = [];
  for (let i = 0; i < nm.length; i += step) {
    outNm.push(roundTo(nm[i]!, NM_DECIMALS));
    outT.push(roundTo(t[i]!, VALUE_DECIMALS));
  }
  return { nm: compactAxis(outNm), t: packSteps(outT, VALUE_DECIMALS) };
}

/** A band fit's data and model (on a wavenumber grid) as curves against wavelength. */
export function thinBandCurve(
  cm1: ArrayLike<number>,
  data: ArrayLike<number>,
  model: ArrayLike<number>,
  max = CURVE_POINTS,
): { nm: StoredAxis; data: StoredCurve; model: StoredCurve } {
  const step = stride(cm1.length, max);
  const nm: number[] = [], d: number[] = [], m: number[] = [];
  for (let i = 0; i < cm1.length; i += step) {
    nm.push(roundTo(wavenumberToNm(cm1[i]!), NM_DECIMALS));
    d.push(roundTo(data[i]!, VALUE_DECIMALS));
    m.push(roundTo(model[i]!, VALUE_DECIMALS));
  }
  return {
    nm: compactAxis(nm),
    data: packSteps(d, VALUE_DECIMALS),
    model: packSteps(m, VALUE_DECIMALS),
  };
}

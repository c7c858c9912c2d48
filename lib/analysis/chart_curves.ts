/**
 * The one place curves are thinned for the results: every k-th point so a curve keeps at most
 * `max` points, at a fixed storage precision. A wavelength axis of equal steps is stored as its
 * first value, step and count (most exports are on such a grid); {@linkcode axisValues} gives
 * back exactly the values the list would have held. Display rounding is the report builder's job.
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

/** Transmittance against wavelength, thinned for the charts. */
export function thinTransmittance(
  nm: ArrayLike<number>,
  t: ArrayLike<number>,
  max = CURVE_POINTS,
): { nm: StoredAxis; t: number[] } {
  const step = stride(nm.length, max);
  const outNm: number[] = [], outT: number[] = [];
  for (let i = 0; i < nm.length; i += step) {
    outNm.push(roundTo(nm[i]!, NM_DECIMALS));
    outT.push(roundTo(t[i]!, VALUE_DECIMALS));
  }
  return { nm: compactAxis(outNm), t: outT };
}

/** A band fit's data and model (on a wavenumber grid) as curves against wavelength. */
export function thinBandCurve(
  cm1: ArrayLike<number>,
  data: ArrayLike<number>,
  model: ArrayLike<number>,
  max = CURVE_POINTS,
): { nm: StoredAxis; data: number[]; model: number[] } {
  const step = stride(cm1.length, max);
  const nm: number[] = [], d: number[] = [], m: number[] = [];
  for (let i = 0; i < cm1.length; i += step) {
    nm.push(roundTo(wavenumberToNm(cm1[i]!), NM_DECIMALS));
    d.push(roundTo(data[i]!, VALUE_DECIMALS));
    m.push(roundTo(model[i]!, VALUE_DECIMALS));
  }
  return { nm: compactAxis(nm), data: d, model: m };
}

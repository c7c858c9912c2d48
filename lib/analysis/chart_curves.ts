/**
 * The one place curves are thinned for the results: every k-th point so a curve keeps at most
 * `max` points, at a fixed storage precision. A wavelength axis of equal steps is stored as its
 * first value, step and count (most exports are on such a grid); {@linkcode axisValues} gives
 * back exactly the values the list would have held, and the values are stored as integer steps
 * written as text ({@linkcode curveValues} gives them back exactly). Display rounding is the
 * report builder's job.
 *
 * @module
 */
import { roundTo } from "../numeric/round.ts";
import { wavenumberToNm } from "../spectrum/axis.ts";
import { integersToText, textLengthOf, textToIntegers } from "../numeric/step_text.ts";

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

/** A curve as integer steps (older results): value i is (d[0] + … + d[i]) / q, q a power of ten. */
export interface PackedCurve {
  /** Scale: a power of ten (10^decimals). */
  q: number;
  /** Integer steps from one value to the next (the first from 0). */
  d: number[];
}

/**
 * A curve as integer steps written as text (`lib/numeric/step_text.ts`): the values are k / q
 * with k whole; `text` holds the steps of k (`order` 1: k[i] − k[i−1], the first from 0), the
 * steps of those steps (`order` 2) or the steps once more (`order` 3), whichever text is
 * shortest: a noisy curve takes order 1, a smooth fitted model order 2 or 3.
 */
export interface TextCurve {
  /** Scale: a power of ten (10^decimals). */
  q: number;
  /** How many times steps were taken (1, 2 or 3); the running sums taken as often give k. */
  order: number;
  /** The integers as text. */
  text: string;
}

/** A stored curve: its values, integer steps (older results), or integer steps as text. */
export type StoredCurve = number[] | PackedCurve | TextCurve;

/** Most times steps are taken for a text curve (our choice: a fitted model's optimum). */
const MAX_ORDER = 3;

/** Running sums: the inverse of taking steps. */
function runningSums(steps: number[]): number[] {
  let k = 0;
  return steps.map((s) => k += s);
}

/** Steps: each value minus the one before it (the first minus 0). */
function stepsOf(values: number[]): number[] {
  return values.map((v, i) => v - (i > 0 ? values[i - 1]! : 0));
}

/**
 * Values already rounded to `decimals` as integer steps written as text, which give back
 * exactly the same numbers (k/10^d is the double nearest to the decimal, as
 * `Number(v.toFixed(d))` is); a curve with a value that is not finite stays a list.
 */
export function packSteps(values: number[], decimals: number): StoredCurve {
  if (!values.every(Number.isFinite)) return values;
  const q = 10 ** decimals;
  let steps = values.map((v) => Math.round(v * q) || 0);
  let best: { order: number; steps: number[]; length: number } | undefined;
  for (let order = 1; order <= MAX_ORDER; order++) {
    steps = stepsOf(steps);
    // steps past the safe integers (values beyond about 10⁹ at 5 decimals) are not written
    if (!steps.every((k) => Number.isSafeInteger(k) && Math.abs(k) < 2 ** 52)) break;
    const length = textLengthOf(steps);
    if (!best || length < best.length) best = { order, steps, length };
  }
  return best ? { q, order: best.order, text: integersToText(best.steps) } : values;
}

/**
 * The values of a stored curve (a list, or integer steps as older results keep them, are read
 * too).
 *
 * @throws {SyntaxError} When a curve's text is not step text.
 * @example
 * ```ts
 * import { curveValues, packSteps } from "./chart_curves.ts";
 * const v = curveValues(packSteps([0.5, 0.51234, 0.4], 5));
 * if (v.join() !== "0.5,0.51234,0.4") throw new Error(v.join());
 * if (curveValues({ q: 100, d: [50, 1] }).join() !== "0.5,0.51") throw new Error("older form");
 * ```
 */
export function curveValues(curve: StoredCurve): number[] {
  if (Array.isArray(curve)) return curve;
  let k: number[];
  if ("d" in curve) k = runningSums(curve.d);
  else {
    if (!Number.isInteger(curve.order) || curve.order < 1 || curve.order > MAX_ORDER) {
      throw new SyntaxError(`Cannot read a curve of order ${curve.order}: expected 1 to 3`);
    }
    k = textToIntegers(curve.text);
    for (let i = 0; i < curve.order; i++) k = runningSums(k);
  }
  return k.map((x) => x / curve.q);
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

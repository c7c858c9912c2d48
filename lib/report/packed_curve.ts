/**
 * Curves as the report page carries them: values at four significant digits of the curve's
 * largest magnitude (the screen charts resolve far less), stored as integer steps from one
 * point to the next, which is about half the text of the decimals. Display rounding is the
 * report builder's choice; results.json keeps its own precision.
 *
 * @module
 */

/** A curve of the page: value i is (d[0] + … + d[i]) / q. */
export interface PackedCurve {
  /** Scale: a power of ten. */
  q: number;
  /** Integer steps. */
  d: number[];
}

/** Significant digits of the largest magnitude kept on the page. */
const DIGITS = 4;

/** The curve packed, or the values as they are when one is not finite (so nothing is lost). */
export function packCurve(values: number[]): PackedCurve | number[] {
  let max = 0;
  for (const v of values) {
    if (!Number.isFinite(v)) return values;
    if (Math.abs(v) > max) max = Math.abs(v);
  }
  const decimals = max > 0 ? Math.min(9, Math.max(0, DIGITS - 1 - Math.floor(Math.log10(max)))) : 0;
  const q = 10 ** decimals;
  const d: number[] = [];
  let previous = 0;
  for (const v of values) {
    const k = Math.round(v * q);
    d.push(k - previous);
    previous = k;
  }
  return { q, d };
}

/**
 * The values of a page curve (a plain list is given as it is).
 *
 * @example
 * ```ts
 * import { curveValues, packCurve } from "./packed_curve.ts";
 * const v = curveValues(packCurve([0.5, 0.51234, 0.4]));
 * if (v.join() !== "0.5,0.5123,0.4") throw new Error(v.join());
 * ```
 */
export function curveValues(curve: PackedCurve | number[]): number[] {
  if (Array.isArray(curve)) return curve;
  const out: number[] = [];
  let k = 0;
  for (const step of curve.d) {
    k += step;
    out.push(k / curve.q);
  }
  return out;
}

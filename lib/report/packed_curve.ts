/**
 * Curves as the report page carries them: values at four significant digits of the curve's
 * largest magnitude (the screen charts resolve far less), as integer steps from one point to
 * the next (`packSteps`, the form results.json stores them in at its own precision).
 *
 * @module
 */
import {
  curveValues,
  type PackedCurve,
  packSteps,
  type StoredCurve,
} from "../analysis/chart_curves.ts";

export { curveValues };
export type { PackedCurve };

/** Significant digits of the largest magnitude kept on the page. */
const DIGITS = 4;

/**
 * The curve at page precision, or the values as they are when one is not finite.
 *
 * @example
 * ```ts
 * import { curveValues, packCurve } from "./packed_curve.ts";
 * const v = curveValues(packCurve([0.5, 0.51234, 0.4]));
 * if (v.join() !== "0.5,0.5123,0.4") throw new Error(v.join());
 * ```
 */
export function packCurve(values: StoredCurve): StoredCurve {
  const v = curveValues(values);
  let max = 0;
  for (const x of v) {
    if (!Number.isFinite(x)) return v;
    if (Math.abs(x) > max) max = Math.abs(x);
  }
  const decimals = max > 0 ? Math.min(9, Math.max(0, DIGITS - 1 - Math.floor(Math.log10(max)))) : 0;
  return packSteps(v, decimals);
}

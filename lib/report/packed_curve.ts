/**
 * Curves as the report page carries them: values at four significant digits of the curve's
 * largest magnitude (the screen charts resolve far less), as integer steps from one point to
 * the next (`packSteps`, the form results.json stores them in at its own precision).
 *
 * @module
 */
import { curveValues, packSteps, type StoredCurve } from "../analysis/chart_curves.ts";
import { roundTo } from "../numeric/round.ts";

/** Significant digits of the largest magnitude kept on the page (our choice: 1 part in 10⁴). */
const DIGITS = 4;
/** Significant digits of a fit's largest residual kept on the page (our choice). */
const RESIDUAL_DIGITS = 3;
/** Decimals results.json stores curves at: the page never needs more. */
const STORED_DECIMALS = 5;

/** Decimals that keep `digits` significant digits of the largest finite magnitude (0 … 9). */
function decimalsFor(values: number[], digits = DIGITS): number {
  let max = 0;
  for (const x of values) if (Number.isFinite(x) && Math.abs(x) > max) max = Math.abs(x);
  return max > 0 ? Math.min(9, Math.max(0, digits - 1 - Math.floor(Math.log10(max)))) : 0;
}

/**
 * The curve at page precision (4 significant digits of its largest value, or `decimals`),
 * rounded as `Number(v.toFixed(d))` rounds; the values as they are when one is not finite.
 *
 * @example
 * ```ts
 * import { curveValues } from "../analysis/chart_curves.ts";
 * import { packCurve } from "./packed_curve.ts";
 * const v = curveValues(packCurve([0.5, 0.51234, 0.4]));
 * if (v.join() !== "0.5,0.5123,0.4") throw new Error(v.join());
 * ```
 */
export function packCurve(values: StoredCurve, decimals?: number): StoredCurve {
  const v = curveValues(values);
  if (!v.every(Number.isFinite)) return v;
  const d = decimals ?? decimalsFor(v);
  return packSteps(v.map((x) => roundTo(x, d)), d);
}

/**
 * A band fit's data and model packed with one number of decimals, enough for 4 significant
 * digits of the larger curve and 3 of their difference (the residual drawn on its own axis),
 * at most the stored decimals.
 */
export function packFitCurves(
  data: StoredCurve,
  model: StoredCurve,
): { data: StoredCurve; model: StoredCurve } {
  const d = curveValues(data), m = curveValues(model);
  const residual = d.map((v, i) => v - m[i]!);
  const decimals = Math.min(
    STORED_DECIMALS,
    Math.max(decimalsFor([...d, ...m]), decimalsFor(residual, RESIDUAL_DIGITS)),
  );
  return { data: packCurve(d, decimals), model: packCurve(m, decimals) };
}

/**
 * Combined standard uncertainty of a dopant level from a calibration (GUM, JCGM 100:2008
 * eq. 10, independent inputs): the calibration line's own inverse-prediction σ (Miller &
 * Miller eq. 5.9), the band fit's σ of the response, and the thickness — the responses are on
 * an α scale, α ∝ 1/d, so u(y)/y = u(d)/d from the thickness alone.
 *
 * @module
 */
import { type Calibration, predictConcentration } from "./linear_calibration.ts";

/** A dopant level with its uncertainty budget; plain JSON. */
export interface DopantLevelUncertainty {
  x: number;
  /** Combined standard uncertainty (k = 1). */
  sigma: number;
  /** t95·σ with the calibration's degrees of freedom. */
  halfWidth95: number;
  /** What each input alone contributes to σ, in the concentration unit. */
  budget: { calibration: number; bandFit: number; thickness: number };
  outsideRange: boolean;
}

/**
 * Dopant level from a response and its combined σ.
 *
 * @param response The response (α scale) and its σ from the band fit.
 * @param thickness Measured thickness and its σ, mm; omitted: no thickness term.
 * @param m Number of replicate measurements averaged into the response.
 * @throws {RangeError} For a thickness ≤ 0 or a negative σ.
 *
 * @example The three parts add in quadrature
 * ```ts
 * import { dopantLevelUncertainty } from "./dopant_level_uncertainty.ts";
 * import { fitCalibration } from "./linear_calibration.ts";
 * const cal = fitCalibration([{ x: 0, y: 0.1 }, { x: 1, y: 2.0 }, { x: 2, y: 4.1 }, { x: 3, y: 5.9 }]);
 * const u = dopantLevelUncertainty(cal, { value: 3, sigma: 0.05 }, { thicknessMm: 2, sdMm: 0.02 });
 * const b = u.budget;
 * if (Math.abs(u.sigma - Math.hypot(b.calibration, b.bandFit, b.thickness)) > 1e-12) throw new Error();
 * ```
 */
export function dopantLevelUncertainty(
  cal: Calibration,
  response: { value: number; sigma: number },
  thickness?: { thicknessMm: number; sdMm: number },
  m = 1,
): DopantLevelUncertainty {
  if (thickness && !(thickness.thicknessMm > 0 && thickness.sdMm >= 0)) {
    throw new RangeError(
      `Cannot use thickness ${thickness.thicknessMm} ± ${thickness.sdMm} mm: need d > 0, σ ≥ 0`,
    );
  }
  const fitSigma = Number.isFinite(response.sigma) ? response.sigma : 0;
  if (fitSigma < 0) throw new RangeError(`Cannot use response σ ${response.sigma}: must be ≥ 0`);
  const thicknessSigma = thickness
    ? Math.abs(response.value) * thickness.sdMm / thickness.thicknessMm
    : 0;
  const own = Math.hypot(fitSigma, thicknessSigma);
  const p = predictConcentration(cal, response.value, own, m);
  const calibration = predictConcentration(cal, response.value, 0, m).sigma;
  const b = Math.abs(cal.slope);
  return {
    x: p.x,
    sigma: p.sigma,
    halfWidth95: p.halfWidth95,
    budget: { calibration, bandFit: fitSigma / b, thickness: thicknessSigma / b },
    outsideRange: p.outsideRange,
  };
}

/**
 * Analysis step: the band analysis of the measured absorbance (or α), done once per spectrum:
 * usable range, detection, separable least-squares fit with model selection, assignment hints
 * (lib/bands/analyse_bands.ts).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { analyseBands, type BandAnalysis } from "../bands/analyse_bands.ts";
import type { BandsResult } from "./sample_result.ts";
import { thinBandCurve } from "./chart_curves.ts";

const finiteOrNull = (v: number) => (Number.isFinite(v) ? v : null);

/** The analysis (for the dopant step) and its results record, or nulls with a warning. */
export function bandsStep(
  spectrum: Spectrum,
  host: string | undefined,
  warnings: string[],
): { fit: BandAnalysis | null; result: BandsResult | null } {
  let fit: BandAnalysis;
  try {
    fit = analyseBands(spectrum, host === undefined ? {} : { host });
  } catch (e) {
    warnings.push(`band fit skipped: ${(e as Error).message}`);
    return { fit: null, result: null };
  }
  const result: BandsResult = {
    ordinate: fit.ordinate,
    bands: fit.bands,
    baseline: fit.baseline,
    residualRms: fit.residualRms,
    noiseSigma: finiteOrNull(fit.noiseSigma),
    reducedChi2: finiteOrNull(fit.reducedChi2),
    converged: fit.converged,
    assignments: fit.assignments,
    excluded: fit.excluded,
    warnings: fit.warnings,
    held: fit.held,
    curve: thinBandCurve(fit.curve.cm1, fit.curve.data, fit.curve.model),
  };
  if (result.noiseSigma === null) {
    result.warnings = [
      ...result.warnings,
      "the noise could not be estimated from the data (too few or too coarsely rounded points): " +
      "σ and χ² are not given",
    ];
  }
  if (fit.bandsAlpha) {
    result.bandsAlpha = fit.bandsAlpha;
    result.alphaBase = "natural";
  }
  return { fit, result };
}

/**
 * Analysis step: the band fit of the measured absorbance (or α), done once per spectrum, with
 * assignment hints from the catalogue.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { type BandFit, fitSpectrumBands } from "../bands/fit_bands.ts";
import { assignBands } from "../bands/assign_bands.ts";
import type { BandsResult } from "./sample_result.ts";
import { thinBandCurve } from "./chart_curves.ts";

/** The fit (for the dopant step) and its results record, or nulls with a warning. */
export function bandsStep(
  spectrum: Spectrum,
  host: string | undefined,
  warnings: string[],
): { fit: BandFit | null; result: BandsResult | null } {
  let fit: BandFit;
  try {
    fit = fitSpectrumBands(spectrum);
  } catch (e) {
    warnings.push(`band fit skipped: ${(e as Error).message}`);
    return { fit: null, result: null };
  }
  return {
    fit,
    result: {
      ordinate: fit.ordinate,
      bands: fit.bands,
      baseline: fit.baseline,
      residualRms: fit.residualRms,
      assignments: assignBands(fit.bands, host),
      curve: thinBandCurve(fit.curve.cm1, fit.curve.data, fit.curve.model),
    },
  };
}

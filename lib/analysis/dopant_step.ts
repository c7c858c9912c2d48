/**
 * Analysis step: the dopant level from the sample's calibration (inverse prediction with its
 * uncertainty, Miller & Miller). Band metrics reuse the band fit of the bands step.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import type { BandAnalysis } from "../bands/analyse_bands.ts";
import { predictConcentration } from "../dopant/linear_calibration.ts";
import {
  type MetricOptions,
  type Response,
  responseFromBands,
  type ResponseMetric,
  spectrumMetric,
  spectrumResponse,
} from "../dopant/response_metric.ts";
import type { SampleSettings } from "./sample_settings.ts";
import type { DopantResult } from "./sample_result.ts";

/** The fitted bands as α in cm⁻¹ (Beer–Lambert, natural log), or undefined. */
function bandsAsAlpha(fit: BandAnalysis): BandAnalysis["bands"] | undefined {
  if (fit.ordinate === "alpha") return fit.bands;
  return fit.bandsAlpha;
}

function response(
  spectrum: Spectrum,
  fit: BandAnalysis | null,
  metric: ResponseMetric,
  options: MetricOptions,
): Response {
  const alphaBands = metric !== "alpha-at" && fit ? bandsAsAlpha(fit) : undefined;
  if (metric !== "alpha-at" && alphaBands) {
    return responseFromBands(alphaBands, 1, metric, options, spectrum.meta.sample);
  }
  return spectrumResponse(spectrum, metric, options);
}

/** The dopant estimate, or null (with a warning when a calibration applies but fails). */
export function dopantStep(
  spectrum: Spectrum,
  fit: BandAnalysis | null,
  s: SampleSettings,
  warnings: string[],
): DopantResult | null {
  const cal = s.calibration;
  if (!cal) return null;
  try {
    const r = response(
      spectrum,
      fit,
      spectrumMetric(cal.metric),
      (cal.metricOptions ?? {}) as MetricOptions,
    );
    const p = predictConcentration(cal, r.value, r.sigma);
    return {
      calibration: cal.name,
      metric: cal.metric,
      response: r.value,
      concentration: p.x,
      sigma: p.sigma,
      halfWidth95: p.halfWidth95,
      unit: cal.unit,
      outsideRange: p.outsideRange,
    };
  } catch (e) {
    warnings.push(`dopant estimate skipped: ${(e as Error).message}`);
    return null;
  }
}

/**
 * Analysis step: colour against path length (Beer–Lambert, or with the Fresnel surfaces).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { type ThicknessSeries, thicknessSeries } from "../cie/thickness_series.ts";
import type { SampleSettings } from "./sample_settings.ts";

/** The thickness series under the change's first illuminant, or null with a warning. */
export function seriesStep(
  spectrum: Spectrum,
  s: SampleSettings,
  warnings: string[],
): ThicknessSeries | null {
  if (spectrum.thicknessMm === undefined && spectrum.quantity !== "alpha") {
    warnings.push("no thickness known: thickness series skipped");
    return null;
  }
  return thicknessSeries(spectrum, {
    ...s.series,
    illuminant: s.change.from,
    observer: s.change.observer,
    reflection: s.reflection,
  });
}

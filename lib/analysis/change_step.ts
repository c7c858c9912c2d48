/**
 * Analysis step: the colour change between two illuminants (ΔE00 per Sharma, Wu & Dalal 2005,
 * each colour under its own white or after CAT16/Bradford adaptation).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import type { ColorRow } from "../cie/spectrum_color.ts";
import { colorChange } from "../cie/color_change.ts";
import type { SampleSettings } from "./sample_settings.ts";
import type { ChangeResult } from "./sample_result.ts";
import { colorRowUnder } from "./color_step.ts";

/** The change D65 → A (or as set), with its swatches and whether it is marked. */
export function changeStep(
  spectrum: Spectrum,
  t: Float64Array,
  rows: ColorRow[],
  s: SampleSettings,
): ChangeResult {
  const c = s.change;
  const change = colorChange(spectrum.wavelengthNm, t, c.from, c.to, c.observer, c.adapt);
  return {
    ...change,
    swatchFrom: colorRowUnder(rows, spectrum, t, c.from, c.observer).srgb,
    swatchTo: colorRowUnder(rows, spectrum, t, c.to, c.observer).srgb,
    // a hue angle means little for a nearly grey colour, so both chromas must reach the floor
    marked: Math.abs(change.dh) >= s.changeHueThresholdDeg &&
      Math.min(change.chromaFrom, change.chromaTo) >= s.changeMinChroma,
  };
}

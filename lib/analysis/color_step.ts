/**
 * Analysis step: the optics (transmittance at the reporting path) and the colour rows under
 * every illuminant and observer of the settings (CIE 15:2018).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { transmittanceForPath } from "../optics/path_transmittance.ts";
import { type ColorRow, spectrumColor } from "../cie/spectrum_color.ts";
import type { SampleSettings } from "./sample_settings.ts";

/** Transmittance at the sample's reporting path, with what the optics had to say. */
export function pathTransmittance(
  spectrum: Spectrum,
  s: SampleSettings,
): { t: Float64Array; warnings: string[] } {
  const { values, warnings } = transmittanceForPath(spectrum, s.pathMm, s.reflection);
  const d = spectrum.thicknessMm, p = s.pathMm;
  if (
    s.reflection.reflection === "none" && p !== undefined && d !== undefined &&
    Math.abs(p - d) > 1e-9 && spectrum.quantity !== "alpha"
  ) {
    warnings.push(
      `rescaled ${d} mm → ${p} mm by Beer–Lambert on the measured absorbance: the two surfaces' ` +
        `losses are rescaled with the bulk (name a host for Fresnel surfaces)`,
    );
  }
  return { t: values, warnings };
}

/** Colour rows of a transmittance under the given conditions (at most one row per pair). */
export function colorRowsFor(
  spectrum: Spectrum,
  t: Float64Array,
  illuminants: string[],
  observers: string[],
  pathMm?: number,
): ColorRow[] {
  return spectrumColor(spectrum, {
    illuminants,
    observers,
    transmittance: t,
    ...(pathMm === undefined ? {} : { pathMm }),
  });
}

/** Finds the row for a condition among rows already computed, or computes it. */
export function colorRowUnder(
  rows: ColorRow[],
  spectrum: Spectrum,
  t: Float64Array,
  illuminant: string,
  observer: string,
): ColorRow {
  return rows.find((r) => r.illuminant === illuminant && r.observer === observer) ??
    colorRowsFor(spectrum, t, [illuminant], [observer])[0]!;
}

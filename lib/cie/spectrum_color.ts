/**
 * Colour of one measured spectrum at a path length, under each requested illuminant and
 * observer: XYZ, x y, u′ v′ and CIELAB / LCh relative to that illuminant's own white
 * (CIE 15:2018 object-colour practice).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { getIlluminant, type Illuminant } from "./illuminants.ts";
import { tristimulusWeights, weightedXyz } from "./tristimulus.ts";
import { type ReflectionSettings, transmittanceForPath } from "../optics/path_transmittance.ts";
import { colorRow } from "./_color_row.ts";
import type { ColorRow } from "./color_coordinates.ts";

export {
  BELOW_FLOOR_NOTE,
  type ColorCoordinates,
  colorFromXyz,
  type ColorRow,
  LUMINANCE_FLOOR_Y,
} from "./color_coordinates.ts";

/** Choices for {@linkcode spectrumColor}. */
export interface ColorOptions {
  /** Illuminants by name or as objects; default D65 and A. */
  illuminants?: (string | Illuminant)[];
  /** Observers `"2"` / `"10"`; default `"2"`. */
  observers?: string[];
  /** Path length in mm to compute the colour for (Beer–Lambert rescaling of absorbance). */
  pathMm?: number;
  /** Transmittance already computed for the path (skips rescaling); same grid as the spectrum. */
  transmittance?: Float64Array;
  /** Surface-reflection treatment for the path rescaling; default none (Beer–Lambert). */
  reflection?: ReflectionSettings;
}

/**
 * Colour rows of a spectrum for each illuminant × observer.
 *
 * @throws {RangeError} When the path rescaling needs a thickness that is unknown, or the data
 *   do not reach the visible range.
 */
export function spectrumColor(spectrum: Spectrum, options: ColorOptions = {}): ColorRow[] {
  const illuminants = options.illuminants ?? ["D65", "A"];
  const observers = options.observers ?? ["2"];
  const t = options.transmittance ??
    transmittanceForPath(spectrum, options.pathMm, options.reflection).values;
  const pathMm = options.pathMm ?? spectrum.thicknessMm ?? null;
  const rows: ColorRow[] = [];
  for (const ill of illuminants) {
    const illuminant = typeof ill === "string" ? getIlluminant(ill) : ill;
    for (const observer of observers) {
      const w = tristimulusWeights(spectrum.wavelengthNm, illuminant, observer);
      const xyz = weightedXyz(t, w);
      rows.push(colorRow(spectrum, illuminant.name, pathMm, xyz, w));
    }
  }
  return rows;
}

/**
 * Colour of one measured spectrum at a path length, under each requested illuminant and
 * observer: XYZ, x y, u′ v′ and CIELAB / LCh relative to that illuminant's own white
 * (CIE 15:2018 object-colour practice).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { getIlluminant, type Illuminant } from "./illuminants.ts";
import { tristimulusWeights, weightedXyz, type Xyz } from "./tristimulus.ts";
import { labToLch, xyzToLab, xyzToUvPrime, xyzToXy } from "./spaces.ts";
import type { InterpolationMethod } from "./interpolate.ts";
import { type ReflectionSettings, transmittanceForPath } from "../optics/path_transmittance.ts";
import { dominantWavelength } from "./dominant_wavelength.ts";
import { swatchFromXyz } from "./swatch.ts";

/** One colour result: a sample under one illuminant and one observer. */
export interface ColourRow {
  sample: string;
  file: string;
  illuminant: string;
  observer: string;
  /** Path length the colour is computed for, mm; null when the measured path is unknown. */
  pathMm: number | null;
  X: number;
  Y: number;
  Z: number;
  x: number;
  y: number;
  uPrime: number;
  vPrime: number;
  L: number;
  a: number;
  b: number;
  C: number;
  h: number;
  /** Reference white used for CIELAB (the illuminant's own white, Y = 100). */
  whiteX: number;
  whiteY: number;
  whiteZ: number;
  method: InterpolationMethod;
  /** True when the data did not span 360–830 nm and end values were extended. */
  extrapolated: boolean;
  /** Dominant (or, when `complementary`, complementary) wavelength in nm; null at the white. */
  dominantNm: number | null;
  complementary: boolean;
  /** Excitation purity 0..1. */
  purity: number | null;
  /** Display swatch (sRGB hex after Bradford adaptation to D65, gamut-mapped when flagged). */
  srgb: string;
  srgbOutOfGamut: boolean;
  p3: string;
  p3OutOfGamut: boolean;
}

/** Choices for {@linkcode spectrumColour}. */
export interface ColourOptions {
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

/** The colour coordinates of one stimulus. */
export type ColourCoordinates = Pick<
  ColourRow,
  "X" | "Y" | "Z" | "x" | "y" | "uPrime" | "vPrime" | "L" | "a" | "b" | "C" | "h"
>;

/** All coordinates of a stimulus from its XYZ and the reference white. */
export function colourFromXyz(xyz: Xyz, white: Xyz): ColourCoordinates {
  const { x, y } = xyzToXy(xyz);
  const { u, v } = xyzToUvPrime(xyz);
  const lab = xyzToLab(xyz, white);
  const { C, h } = labToLch(lab);
  return { ...xyz, x, y, uPrime: u, vPrime: v, L: lab.L, a: lab.a, b: lab.b, C, h };
}

/**
 * Colour rows of a spectrum for each illuminant × observer.
 *
 * @throws {RangeError} When the path rescaling needs a thickness that is unknown, or the data
 *   do not reach the visible range.
 */
export function spectrumColour(spectrum: Spectrum, options: ColourOptions = {}): ColourRow[] {
  const illuminants = options.illuminants ?? ["D65", "A"];
  const observers = options.observers ?? ["2"];
  const t = options.transmittance ??
    transmittanceForPath(spectrum, options.pathMm, options.reflection).values;
  const pathMm = options.pathMm ?? spectrum.thicknessMm ?? null;
  const rows: ColourRow[] = [];
  for (const ill of illuminants) {
    const illuminant = typeof ill === "string" ? getIlluminant(ill) : ill;
    for (const observer of observers) {
      const w = tristimulusWeights(spectrum.wavelengthNm, illuminant, observer);
      const xyz = weightedXyz(t, w);
      const colour = colourFromXyz(xyz, w.white);
      const white = xyzToXy(w.white);
      const dominant = dominantWavelength(colour.x, colour.y, white.x, white.y, w.observer);
      const swatch = swatchFromXyz(xyz, w.white);
      rows.push({
        sample: spectrum.meta.sample,
        file: spectrum.meta.sourceFile ?? "",
        illuminant: illuminant.name,
        observer: w.observer,
        pathMm,
        ...colour,
        whiteX: w.white.X,
        whiteY: w.white.Y,
        whiteZ: w.white.Z,
        method: w.method,
        extrapolated: w.extrapolated,
        dominantNm: dominant?.wavelengthNm ?? null,
        complementary: dominant?.complementary ?? false,
        purity: dominant?.purity ?? null,
        srgb: swatch.srgb.css,
        srgbOutOfGamut: swatch.srgb.outOfGamut,
        p3: swatch.p3.css,
        p3OutOfGamut: swatch.p3.outOfGamut,
      });
    }
  }
  return rows;
}

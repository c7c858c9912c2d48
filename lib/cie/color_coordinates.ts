/**
 * The colour row type and the coordinates of one stimulus (CIE 15:2018 §7–8: xy, u′v′,
 * CIELAB, LCh), with the luminance floor below which chromaticity is not defined.
 *
 * @module
 */
import type { Xyz } from "./tristimulus.ts";
import { labToLch, xyzToLab, xyzToUvPrime, xyzToXy } from "./spaces.ts";
import type { InterpolationMethod } from "./interpolate.ts";

/** One colour result: a sample under one illuminant and one observer. */
export interface ColorRow {
  /** Sample name. */
  sample: string;
  /** File the spectrum came from. */
  file: string;
  /** Illuminant name. */
  illuminant: string;
  /** Observer, `"2"` (CIE 1931) or `"10"` (CIE 1964). */
  observer: string;
  /** Path length the colour is computed for, mm; null when the measured path is unknown. */
  pathMm: number | null;
  /** Tristimulus X (Y = 100 for a perfect transmitter). */
  X: number;
  /** Tristimulus Y. */
  Y: number;
  /** Tristimulus Z. */
  Z: number;
  /** Chromaticity x, y, u′, v′; null below the luminance floor (Y < 0.01), see `notes`. */
  x: number | null;
  /** Chromaticity y. */
  y: number | null;
  /** CIE 1976 u′. */
  uPrime: number | null;
  /** CIE 1976 v′. */
  vPrime: number | null;
  /** CIELAB L*. */
  L: number;
  /** CIELAB a*. */
  a: number;
  /** CIELAB b*. */
  b: number;
  /** Chroma C*ab. */
  C: number;
  /** Hue angle h_ab in degrees 0–360; null below the luminance floor. */
  h: number | null;
  /** Reference white used for CIELAB (the illuminant's own white, Y = 100). */
  whiteX: number;
  /** Y of the reference white (100). */
  whiteY: number;
  /** Z of the reference white. */
  whiteZ: number;
  /** How the data were carried to the 1 nm grid (CIE 167). */
  method: InterpolationMethod;
  /** True when the data did not span 360–830 nm and end values were extended. */
  extrapolated: boolean;
  /**
   * Dominant (or, when `complementary`, complementary) wavelength in nm; null at the white and
   * below the luminance floor.
   */
  dominantNm: number | null;
  /** Whether `dominantNm` is a complementary wavelength (purple colours). */
  complementary: boolean;
  /** Excitation purity 0..1 (never above 1); null where `dominantNm` is. */
  purity: number | null;
  /** Display swatch (sRGB hex after Bradford adaptation to D65, gamut-mapped when flagged). */
  srgb: string;
  /** Whether the colour lies outside sRGB (the swatch is chroma-reduced). */
  srgbOutOfGamut: boolean;
  /** Display P3 swatch as a CSS color() string. */
  p3: string;
  /** Whether the colour lies outside Display P3. */
  p3OutOfGamut: boolean;
  /** Why values are null (the luminance floor); absent when every value is defined. */
  notes?: string[];
}

/**
 * Luminance floor on the Y = 100 scale: below it chromaticity, hue, dominant wavelength and
 * purity are not defined to any useful precision (a black stone has no hue), so they are null.
 * The floor (Y 0.01, L* ≈ 0.09) is common practice, not a CIE figure.
 */
export const LUMINANCE_FLOOR_Y = 0.01;

/** The note a row carries below {@linkcode LUMINANCE_FLOOR_Y}. */
export const BELOW_FLOOR_NOTE =
  `Y below ${LUMINANCE_FLOOR_Y}: too dark for chromaticity, hue and dominant wavelength`;

/** The colour coordinates of one stimulus, without the luminance floor. */
export interface ColorCoordinates {
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
}

/** All coordinates of a stimulus from its XYZ and the reference white. */
export function colorFromXyz(xyz: Xyz, white: Xyz): ColorCoordinates {
  const { x, y } = xyzToXy(xyz);
  const { u, v } = xyzToUvPrime(xyz);
  const lab = xyzToLab(xyz, white);
  const { C, h } = labToLch(lab);
  return { ...xyz, x, y, uPrime: u, vPrime: v, L: lab.L, a: lab.a, b: lab.b, C, h };
}

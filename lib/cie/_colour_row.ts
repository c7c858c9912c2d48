/**
 * One colour row from XYZ under one condition (shared by `spectrumColour` and
 * `spectraColourRows`), with the luminance floor of CIE 15 practice applied.
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import type { TristimulusWeights, Xyz } from "./tristimulus.ts";
import { xyzToXy } from "./spaces.ts";
import { dominantWavelength } from "./dominant_wavelength.ts";
import { swatchFromXyz } from "./swatch.ts";
import {
  BELOW_FLOOR_NOTE,
  colourFromXyz,
  type ColourRow,
  LUMINANCE_FLOOR_Y,
} from "./colour_coordinates.ts";

/**
 * The colour row of one stimulus under one condition, with the luminance floor applied.
 *
 * @param xyz Tristimulus values from the weights `w`.
 */
export function colourRow(
  spectrum: Pick<Spectrum, "meta">,
  illuminantName: string,
  pathMm: number | null,
  xyz: Xyz,
  w: TristimulusWeights,
): ColourRow {
  const colour = colourFromXyz(xyz, w.white);
  const dark = !(xyz.Y >= LUMINANCE_FLOOR_Y);
  const white = xyzToXy(w.white);
  const dominant = dark
    ? undefined
    : dominantWavelength(colour.x, colour.y, white.x, white.y, w.observer);
  const swatch = swatchFromXyz(xyz, w.white);
  const row: ColourRow = {
    sample: spectrum.meta.sample,
    file: spectrum.meta.sourceFile ?? "",
    illuminant: illuminantName,
    observer: w.observer,
    pathMm,
    X: colour.X,
    Y: colour.Y,
    Z: colour.Z,
    x: dark ? null : colour.x,
    y: dark ? null : colour.y,
    uPrime: dark ? null : colour.uPrime,
    vPrime: dark ? null : colour.vPrime,
    L: colour.L,
    a: colour.a,
    b: colour.b,
    C: colour.C,
    h: dark ? null : colour.h,
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
  };
  if (dark) row.notes = [BELOW_FLOOR_NOTE];
  return row;
}

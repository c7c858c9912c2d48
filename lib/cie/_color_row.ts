/**
 * One colour row from XYZ under one condition (shared by `spectrumColor` and
 * `spectraColorRows`), with the luminance floor of CIE 15 practice applied.
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import type { TristimulusWeights, Xyz } from "./tristimulus.ts";
import { xyzToXy } from "./spaces.ts";
import { dominantWavelength } from "./dominant_wavelength.ts";
import { swatchFromXyz } from "./swatch.ts";
import {
  BELOW_FLOOR_NOTE,
  colorFromXyz,
  type ColorRow,
  LUMINANCE_FLOOR_Y,
} from "./color_coordinates.ts";

/**
 * The colour row of one stimulus under one condition, with the luminance floor applied.
 *
 * @param xyz Tristimulus values from the weights `w`.
 */
export function colorRow(
  spectrum: Pick<Spectrum, "meta">,
  illuminantName: string,
  pathMm: number | null,
  xyz: Xyz,
  w: TristimulusWeights,
): ColorRow {
  const color = colorFromXyz(xyz, w.white);
  const dark = !(xyz.Y >= LUMINANCE_FLOOR_Y);
  const white = xyzToXy(w.white);
  const dominant = dark
    ? undefined
    : dominantWavelength(color.x, color.y, white.x, white.y, w.observer);
  const swatch = swatchFromXyz(xyz, w.white);
  const row: ColorRow = {
    sample: spectrum.meta.sample,
    file: spectrum.meta.sourceFile ?? "",
    illuminant: illuminantName,
    observer: w.observer,
    pathMm,
    X: color.X,
    Y: color.Y,
    Z: color.Z,
    x: dark ? null : color.x,
    y: dark ? null : color.y,
    uPrime: dark ? null : color.uPrime,
    vPrime: dark ? null : color.vPrime,
    L: color.L,
    a: color.a,
    b: color.b,
    C: color.C,
    h: dark ? null : color.h,
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

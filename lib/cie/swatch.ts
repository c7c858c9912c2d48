/**
 * Display values for a colour: sRGB (IEC 61966-2-1:1999) and Display P3 (SMPTE EG 432-1
 * primaries, D65 white, sRGB transfer curve), after adapting the colour from its illuminant's
 * white to D65 (Bradford). Both RGB spaces are built from their published primaries on the
 * white of the D65 tables the colours themselves use (CIE 15:2018, 2°, 360–830 nm at 1 nm), so
 * a perfect transmitter lands on RGB (1, 1, 1) to rounding; the gamut test allows 5e-5 in
 * linear RGB, half the last digit of the published 4-decimal matrices, so white and near-white
 * are inside. Colours outside a gamut are flagged, never silently clipped: the
 * shown value is gamut-mapped by reducing CIELAB chroma at constant L* and hue (bisection on
 * C*ab) until it fits — a stated, hue-preserving mapping.
 *
 * @module
 */
import type { Matrix3 } from "../numeric/matrix3.ts";
import { adaptXyz, invert, multiply } from "./adaptation.ts";
import type { Xyz } from "./tristimulus.ts";
import { labToXyz, xyzToLab, xyzToXy } from "./spaces.ts";
import { GRID_NM } from "./grid.ts";
import { tristimulusWeights } from "./tristimulus.ts";

/**
 * sRGB / Display P3 reference white, Y = 100: the white of the D65 tables the colours use
 * (CIE 15:2018 D65 and 2° observer at 1 nm), whose chromaticity (0.31272, 0.32903) is the IEC
 * 61966-2-1 white (0.3127, 0.3290) to its published precision.
 */
export const DISPLAY_WHITE: Xyz = { ...tristimulusWeights(GRID_NM, "D65", "2").white };

const DISPLAY_WHITE_XY = xyzToXy(DISPLAY_WHITE);

/** RGB → XYZ matrix from primaries and white chromaticities (SMPTE RP 177 construction). */
export function rgbToXyzMatrix(primaries: [number, number][], white: [number, number]): Matrix3 {
  const cols = primaries.map(([x, y]) => [x / y, 1, (1 - x - y) / y]);
  const p: Matrix3 = [
    [cols[0]![0]!, cols[1]![0]!, cols[2]![0]!],
    [cols[0]![1]!, cols[1]![1]!, cols[2]![1]!],
    [cols[0]![2]!, cols[1]![2]!, cols[2]![2]!],
  ];
  const [wx, wy] = white;
  const s = multiply(invert(p), [wx / wy, 1, (1 - wx - wy) / wy]);
  return [0, 1, 2].map((r) => [0, 1, 2].map((c) => p[r]![c]! * s[c]!)) as unknown as Matrix3;
}

/**
 * XYZ (Y = 1) → linear sRGB: IEC 61966-2-1:1999 primaries (0.64, 0.33), (0.30, 0.60), (0.15,
 * 0.06) on {@linkcode DISPLAY_WHITE}; equals the standard's 4-decimal matrix to its precision.
 */
export const XYZ_TO_SRGB: Matrix3 = invert(
  rgbToXyzMatrix([[0.64, 0.33], [0.3, 0.6], [0.15, 0.06]], [
    DISPLAY_WHITE_XY.x,
    DISPLAY_WHITE_XY.y,
  ]),
);

/** XYZ (Y = 1) → linear Display P3: SMPTE EG 432-1 primaries on {@linkcode DISPLAY_WHITE}. */
export const XYZ_TO_P3: Matrix3 = invert(
  rgbToXyzMatrix(
    [[0.68, 0.32], [0.265, 0.69], [0.15, 0.06]],
    [DISPLAY_WHITE_XY.x, DISPLAY_WHITE_XY.y],
  ),
);

/** Allowance of the gamut test in linear RGB: half the last digit of a 4-decimal matrix. */
export const GAMUT_TOLERANCE = 5e-5;

/** sRGB transfer curve (IEC 61966-2-1): linear → encoded. */
export function srgbEncode(v: number): number {
  return v <= 0.0031308 ? 12.92 * v : 1.055 * v ** (1 / 2.4) - 0.055;
}

/** One display rendering of a colour. */
export interface DisplayColor {
  /** Encoded values 0..1 after gamut mapping. */
  rgb: [number, number, number];
  /** Encoded values before mapping (may lie outside 0..1). */
  unmapped: [number, number, number];
  outOfGamut: boolean;
  /** CSS string, e.g. `#a0324b` or `color(display-p3 0.6 0.2 0.3)`. */
  css: string;
}

/** A swatch: the colour as shown in sRGB and Display P3. */
export interface Swatch {
  srgb: DisplayColor;
  p3: DisplayColor;
  /** The D65-adapted CIELAB the display values came from. */
  labD65: { L: number; a: number; b: number };
}

function linearRgb(m: Matrix3, xyz: Xyz): [number, number, number] {
  return multiply(m, [xyz.X / 100, xyz.Y / 100, xyz.Z / 100]);
}

function inGamut(rgb: readonly number[]): boolean {
  for (let i = 0; i < 3; i++) {
    const v = rgb[i]!;
    if (!(v >= -GAMUT_TOLERANCE && v <= 1 + GAMUT_TOLERANCE)) return false;
  }
  return true;
}

/** Two lower-case hex digits of each byte value 0–255. */
const HEX_DIGITS = Array.from({ length: 256 }, (_, v) => v.toString(16).padStart(2, "0"));

/**
 * `#rrggbb` of encoded values 0..1 at 8 bits (IEC 61966-2-1 §5), lower case. Written directly:
 * the `color` package it was formatted with before (the same text, checked in
 * test/cie/swatch_hex_test.ts) cost 5 MB of memory to load.
 */
export function hexOf(rgb: readonly [number, number, number]): string {
  const byte = (v: number) => HEX_DIGITS[Math.round(Math.min(1, Math.max(0, v)) * 255)]!;
  return `#${byte(rgb[0])}${byte(rgb[1])}${byte(rgb[2])}`;
}

/** The inverse of the CIELAB f (CIE 15:2018 eq. 8.9), as in {@linkcode labToXyz}. */
function labInverse(t: number): number {
  return t > 6 / 29 ? t ** 3 : (108 / 841) * (t - 4 / 29);
}

/** Rounding allowance of the quick gamut test: t·t·t is within a few ulp of t ** 3. */
const QUICK_MARGIN = 1e-9;

/**
 * Whether L*, a*, b* (D65 white) is inside the RGB space of `m`; no allocation. A quick pass
 * cubes by multiplication; only when a channel lies within 1e-9 of a gamut edge, where that
 * rounding could matter, is the decision taken with `t ** 3` exactly as {@linkcode labToXyz}.
 */
function insideAt(m: Matrix3, L: number, a: number, b: number, yLinear: number): boolean {
  const fy = (L + 16) / 116;
  const tx = fy + a / 500, tz = fy - b / 200;
  const x = DISPLAY_WHITE.X * (tx > 6 / 29 ? tx * tx * tx : (108 / 841) * (tx - 4 / 29)) / 100;
  const z = DISPLAY_WHITE.Z * (tz > 6 / 29 ? tz * tz * tz : (108 / 841) * (tz - 4 / 29)) / 100;
  let close = false;
  for (let r = 0; r < 3; r++) {
    const row = m[r]!;
    const v = row[0]! * x + row[1]! * yLinear + row[2]! * z;
    if (v < -GAMUT_TOLERANCE - QUICK_MARGIN || v > 1 + GAMUT_TOLERANCE + QUICK_MARGIN) return false;
    if (!(v > -GAMUT_TOLERANCE + QUICK_MARGIN && v < 1 + GAMUT_TOLERANCE - QUICK_MARGIN)) {
      close = true;
    }
  }
  return close ? insideExactly(m, tx, tz, yLinear) : true;
}

/** The gamut decision with the arithmetic of {@linkcode labToXyz} and {@linkcode inGamut}. */
function insideExactly(m: Matrix3, tx: number, tz: number, yLinear: number): boolean {
  const x = DISPLAY_WHITE.X * labInverse(tx) / 100;
  const z = DISPLAY_WHITE.Z * labInverse(tz) / 100;
  for (let r = 0; r < 3; r++) {
    const row = m[r]!;
    const v = row[0]! * x + row[1]! * yLinear + row[2]! * z;
    if (!(v >= -GAMUT_TOLERANCE && v <= 1 + GAMUT_TOLERANCE)) return false;
  }
  return true;
}

function render(
  m: Matrix3,
  lab: { L: number; a: number; b: number },
  space: "srgb" | "p3",
): DisplayColor {
  const L = Math.min(100, Math.max(0, lab.L));
  const exact = linearRgb(m, labToXyz(lab, DISPLAY_WHITE));
  const unmapped = exact.map((v) => Math.sign(v) * srgbEncode(Math.abs(v))) as [
    number,
    number,
    number,
  ];
  let rgbLinear = exact;
  const outOfGamut = !inGamut(exact);
  if (outOfGamut) {
    const c = Math.hypot(lab.a, lab.b);
    const h = Math.atan2(lab.b, lab.a);
    const cosH = Math.cos(h), sinH = Math.sin(h);
    // Y depends on L* only, so it is the same at every trial chroma
    const yLinear = DISPLAY_WHITE.Y * labInverse((L + 16) / 116) / 100;
    let lo = 0, hi = 1;
    for (let k = 0; k < 40; k++) {
      const mid = (lo + hi) / 2;
      if (insideAt(m, L, mid * c * cosH, mid * c * sinH, yLinear)) lo = mid;
      else hi = mid;
    }
    rgbLinear = linearRgb(m, labToXyz({ L, a: lo * c * cosH, b: lo * c * sinH }, DISPLAY_WHITE));
  }
  const rgb = rgbLinear.map((v) => srgbEncode(Math.min(1, Math.max(0, v)))) as [
    number,
    number,
    number,
  ];
  const css = space === "srgb"
    ? hexOf(rgb)
    : `color(display-p3 ${rgb.map((v) => v.toFixed(4)).join(" ")})`;
  return { rgb, unmapped, outOfGamut, css };
}

/**
 * Display swatch of a colour given as XYZ under an illuminant with white `white`.
 *
 * @param xyz Tristimulus values, Y = 100 for the perfect white.
 * @param white The illuminant's white, same scale.
 */
export function swatchFromXyz(xyz: Xyz, white: Xyz): Swatch {
  const adapted = adaptXyz(xyz, white, DISPLAY_WHITE, "bradford");
  const labD65 = xyzToLab(adapted, DISPLAY_WHITE);
  return { srgb: render(XYZ_TO_SRGB, labD65, "srgb"), p3: render(XYZ_TO_P3, labD65, "p3"), labD65 };
}

/**
 * Colour spaces derived from XYZ (CIE 15:2018 §8): chromaticity x, y; CIE 1976 UCS u′, v′;
 * CIELAB with its linear branch near black; CIELCh(ab).
 *
 * @module
 */
import type { Xyz } from "./tristimulus.ts";

/** CIELAB coordinates. */
export interface Lab {
  /** Lightness L*. */
  L: number;
  /** a* (green–red). */
  a: number;
  /** b* (blue–yellow). */
  b: number;
}

/** CIELAB in cylindrical form; h in degrees 0–360. */
export interface Lch {
  L: number;
  C: number;
  h: number;
}

/** Chromaticity coordinates x, y (CIE 15:2018 eq. 7.3); (0, 0) for black. */
export function xyzToXy({ X, Y, Z }: Xyz): { x: number; y: number } {
  const s = X + Y + Z;
  return s > 0 ? { x: X / s, y: Y / s } : { x: 0, y: 0 };
}

/** CIE 1976 UCS u′, v′ (CIE 15:2018 eq. 8.1). */
export function xyzToUvPrime({ X, Y, Z }: Xyz): { u: number; v: number } {
  const d = X + 15 * Y + 3 * Z;
  return d > 0 ? { u: (4 * X) / d, v: (9 * Y) / d } : { u: 0, v: 0 };
}

const EPSILON = (6 / 29) ** 3;

function f(t: number): number {
  return t > EPSILON ? Math.cbrt(t) : (841 / 108) * t + 4 / 29;
}

/** CIELAB relative to a reference white (CIE 15:2018 eq. 8.3–8.5). */
export function xyzToLab(xyz: Xyz, white: Xyz): Lab {
  const fx = f(xyz.X / white.X), fy = f(xyz.Y / white.Y), fz = f(xyz.Z / white.Z);
  return { L: 116 * fy - 16, a: 500 * (fx - fy), b: 200 * (fy - fz) };
}

/** XYZ from CIELAB and the reference white (inverse of {@linkcode xyzToLab}). */
export function labToXyz({ L, a, b }: Lab, white: Xyz): Xyz {
  const fy = (L + 16) / 116;
  const inv = (t: number) => (t > 6 / 29 ? t ** 3 : (108 / 841) * (t - 4 / 29));
  return { X: white.X * inv(fy + a / 500), Y: white.Y * inv(fy), Z: white.Z * inv(fy - b / 200) };
}

/** Hue angle in degrees 0 ≤ h < 360 from a, b (CIE 15:2018 eq. 8.8). */
export function hueAngleDeg(a: number, b: number): number {
  if (a === 0 && b === 0) return 0;
  const h = (Math.atan2(b, a) * 180) / Math.PI;
  return h < 0 ? h + 360 : h;
}

/** CIELCh(ab) from CIELAB. */
export function labToLch({ L, a, b }: Lab): Lch {
  return { L, C: Math.hypot(a, b), h: hueAngleDeg(a, b) };
}

/**
 * Display values for a colour: sRGB (IEC 61966-2-1:1999) and Display P3 (SMPTE EG 432-1
 * primaries, D65 white, sRGB transfer curve), after adapting the colour from its illuminant's
 * white to D65 (Bradford). Colours outside a gamut are flagged, never silently clipped: the
 * shown value is gamut-mapped by reducing CIELAB chroma at constant L* and hue (bisection on
 * C*ab) until it fits — a stated, hue-preserving mapping.
 *
 * @module
 */
// A full specifier: a program outside this repository that imports lib/mod.ts by path resolves it
// without our deno.json (the import map applies only inside the project).
// deno-lint-ignore no-import-prefix
import Color from "npm:color@^5.0.0";
import { adaptXyz, invert, multiply } from "./adaptation.ts";
import type { Xyz } from "./tristimulus.ts";
import { labToXyz, xyzToLab } from "./spaces.ts";

type Matrix = readonly [readonly number[], readonly number[], readonly number[]];

/** XYZ (Y = 1) → linear sRGB, IEC 61966-2-1:1999 Amendment 1 (4-decimal matrix). */
export const XYZ_TO_SRGB: Matrix = [
  [3.2406, -1.5372, -0.4986],
  [-0.9689, 1.8758, 0.0415],
  [0.0557, -0.204, 1.057],
];

/** sRGB / Display P3 reference white (D65, Y = 100), IEC 61966-2-1. */
export const DISPLAY_WHITE: Xyz = { X: 95.047, Y: 100, Z: 108.883 };

/** RGB → XYZ matrix from primaries and white chromaticities (SMPTE RP 177 construction). */
export function rgbToXyzMatrix(primaries: [number, number][], white: [number, number]): Matrix {
  const cols = primaries.map(([x, y]) => [x / y, 1, (1 - x - y) / y]);
  const p: Matrix = [
    [cols[0]![0]!, cols[1]![0]!, cols[2]![0]!],
    [cols[0]![1]!, cols[1]![1]!, cols[2]![1]!],
    [cols[0]![2]!, cols[1]![2]!, cols[2]![2]!],
  ];
  const [wx, wy] = white;
  const s = multiply(invert(p), [wx / wy, 1, (1 - wx - wy) / wy]);
  return [0, 1, 2].map((r) => [0, 1, 2].map((c) => p[r]![c]! * s[c]!)) as unknown as Matrix;
}

/** XYZ (Y = 1) → linear Display P3 (D65 white 0.3127, 0.3290). */
export const XYZ_TO_P3: Matrix = invert(
  rgbToXyzMatrix([[0.68, 0.32], [0.265, 0.69], [0.15, 0.06]], [0.3127, 0.329]),
);

/** sRGB transfer curve (IEC 61966-2-1): linear → encoded. */
export function srgbEncode(v: number): number {
  return v <= 0.0031308 ? 12.92 * v : 1.055 * v ** (1 / 2.4) - 0.055;
}

/** One display rendering of a colour. */
export interface DisplayColour {
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
  srgb: DisplayColour;
  p3: DisplayColour;
  /** The D65-adapted CIELAB the display values came from. */
  labD65: { L: number; a: number; b: number };
}

function linearRgb(m: Matrix, xyz: Xyz): [number, number, number] {
  return multiply(m, [xyz.X / 100, xyz.Y / 100, xyz.Z / 100]);
}

const inGamut = (rgb: number[]) => rgb.every((v) => v >= -1e-9 && v <= 1 + 1e-9);

function render(
  m: Matrix,
  lab: { L: number; a: number; b: number },
  space: "srgb" | "p3",
): DisplayColour {
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
    let lo = 0, hi = 1;
    for (let k = 0; k < 40; k++) {
      const mid = (lo + hi) / 2;
      const trial = linearRgb(
        m,
        labToXyz({ L, a: mid * c * Math.cos(h), b: mid * c * Math.sin(h) }, DISPLAY_WHITE),
      );
      if (inGamut(trial)) lo = mid;
      else hi = mid;
    }
    rgbLinear = linearRgb(
      m,
      labToXyz({ L, a: lo * c * Math.cos(h), b: lo * c * Math.sin(h) }, DISPLAY_WHITE),
    );
  }
  const rgb = rgbLinear.map((v) => srgbEncode(Math.min(1, Math.max(0, v)))) as [
    number,
    number,
    number,
  ];
  const css = space === "srgb"
    ? Color.rgb(rgb.map((v) => Math.round(v * 255))).hex().toLowerCase()
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

/**
 * Colour-difference formulas: CIE 1976 ΔE*ab, CIE94, CIEDE2000 (CIE 142-2001; Sharma, Wu &
 * Dalal, Color Res. Appl. 30, 21 (2005)) and CMC(l:c) (BS 6923 / ISO 105-J03).
 * NOTE: CIEDE2000 is discontinuous where the mean hue jumps by 180°; Sharma et al. discuss it.
 *
 * @module
 */
import type { Lab } from "./spaces.ts";
import { ciede2000 } from "./_ciede2000.ts";

const DEG = Math.PI / 180;

/** CIE 1976 ΔE*ab: Euclidean distance in CIELAB. */
export function deltaE76(lab1: Lab, lab2: Lab): number {
  return Math.hypot(lab1.L - lab2.L, lab1.a - lab2.a, lab1.b - lab2.b);
}

/** Parametric factors of CIE94; defaults are the graphic-arts set (kL 1, K1 0.045, K2 0.015). */
export interface DeltaE94Options {
  /** Lightness weight (1 for graphic arts, 2 for textiles). */
  kL?: number;
  /** Chroma constant (0.045 graphic arts). */
  k1?: number;
  /** Hue constant (0.015 graphic arts). */
  k2?: number;
}

/** CIE94 colour difference (CIE 116-1995), lab1 the reference. */
export function deltaE94(lab1: Lab, lab2: Lab, options: DeltaE94Options = {}): number {
  const { kL = 1, k1 = 0.045, k2 = 0.015 } = options;
  const c1 = Math.hypot(lab1.a, lab1.b), c2 = Math.hypot(lab2.a, lab2.b);
  const dL = lab1.L - lab2.L, dC = c1 - c2;
  const dH2 = Math.max(0, (lab1.a - lab2.a) ** 2 + (lab1.b - lab2.b) ** 2 - dC * dC);
  const sC = 1 + k1 * c1, sH = 1 + k2 * c1;
  return Math.sqrt((dL / kL) ** 2 + (dC / sC) ** 2 + dH2 / (sH * sH));
}

/** Parametric factors kL, kC, kH of CIEDE2000 (all 1 by default, the reference conditions). */
export interface DeltaE2000Options {
  /** Parametric lightness factor (1). */
  kL?: number;
  /** Parametric chroma factor (1). */
  kC?: number;
  /** Parametric hue factor (1). */
  kH?: number;
}

/**
 * CIEDE2000 colour difference ΔE00 (Sharma, Wu & Dalal 2005, eq. 1–25). Allocation-free but for
 * the result; the hue terms use exact identities and a table for the rotation term (see
 * `_ciede2000.ts`).
 *
 * @example Sharma et al. (2005) Table 1, pair 1
 * ```ts
 * import { deltaE2000 } from "./delta_e.ts";
 * const d = deltaE2000({ L: 50, a: 2.6772, b: -79.7751 }, { L: 50, a: 0, b: -82.7485 });
 * if (Math.abs(d - 2.0425) > 1e-4) throw new Error(String(d));
 * ```
 */
export function deltaE2000(lab1: Lab, lab2: Lab, options?: DeltaE2000Options): number {
  if (options === undefined) return ciede2000(lab1, lab2, 1, 1, 1);
  return ciede2000(lab1, lab2, options.kL ?? 1, options.kC ?? 1, options.kH ?? 1);
}

/** CMC(l:c) colour difference, lab1 the reference; l = 2, c = 1 (acceptability) by default. */
export function deltaECmc(lab1: Lab, lab2: Lab, l = 2, c = 1): number {
  const c1 = Math.hypot(lab1.a, lab1.b), c2 = Math.hypot(lab2.a, lab2.b);
  const dL = lab1.L - lab2.L, dC = c1 - c2;
  const dH2 = Math.max(0, (lab1.a - lab2.a) ** 2 + (lab1.b - lab2.b) ** 2 - dC * dC);
  let h1 = Math.atan2(lab1.b, lab1.a) / DEG;
  if (h1 < 0) h1 += 360;
  const tt = h1 >= 164 && h1 <= 345
    ? 0.56 + Math.abs(0.2 * Math.cos((h1 + 168) * DEG))
    : 0.36 + Math.abs(0.4 * Math.cos((h1 + 35) * DEG));
  const f = Math.sqrt(c1 ** 4 / (c1 ** 4 + 1900));
  const sL = lab1.L < 16 ? 0.511 : (0.040975 * lab1.L) / (1 + 0.01765 * lab1.L);
  const sC = (0.0638 * c1) / (1 + 0.0131 * c1) + 0.638;
  const sH = sC * (f * tt + 1 - f);
  return Math.sqrt((dL / (l * sL)) ** 2 + (dC / (c * sC)) ** 2 + dH2 / (sH * sH));
}

/**
 * Colour-difference formulas: CIE 1976 ΔE*ab, CIE94, CIEDE2000 (CIE 142-2001; Sharma, Wu &
 * Dalal, Color Res. Appl. 30, 21 (2005)) and CMC(l:c) (BS 6923 / ISO 105-J03).
 * NOTE: CIEDE2000 is discontinuous where the mean hue jumps by 180°; Sharma et al. discuss it.
 *
 * @module
 */
import type { Lab } from "./spaces.ts";

const DEG = Math.PI / 180;

/** CIE 1976 ΔE*ab: Euclidean distance in CIELAB. */
export function deltaE76(lab1: Lab, lab2: Lab): number {
  return Math.hypot(lab1.L - lab2.L, lab1.a - lab2.a, lab1.b - lab2.b);
}

/** Parametric factors of CIE94; defaults are the graphic-arts set (kL 1, K1 0.045, K2 0.015). */
export interface DeltaE94Options {
  kL?: number;
  k1?: number;
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
  kL?: number;
  kC?: number;
  kH?: number;
}

/**
 * CIEDE2000 colour difference ΔE00 (Sharma, Wu & Dalal 2005, eq. 1–25).
 *
 * @example Sharma et al. (2005) Table 1, pair 1
 * ```ts
 * import { deltaE2000 } from "./delta_e.ts";
 * const d = deltaE2000({ L: 50, a: 2.6772, b: -79.7751 }, { L: 50, a: 0, b: -82.7485 });
 * if (Math.abs(d - 2.0425) > 1e-4) throw new Error(String(d));
 * ```
 */
export function deltaE2000(lab1: Lab, lab2: Lab, options: DeltaE2000Options = {}): number {
  const { kL = 1, kC = 1, kH = 1 } = options;
  const c1 = Math.hypot(lab1.a, lab1.b), c2 = Math.hypot(lab2.a, lab2.b);
  const cBar7 = ((c1 + c2) / 2) ** 7;
  const g = 0.5 * (1 - Math.sqrt(cBar7 / (cBar7 + 25 ** 7)));
  const a1 = (1 + g) * lab1.a, a2 = (1 + g) * lab2.a;
  const cp1 = Math.hypot(a1, lab1.b), cp2 = Math.hypot(a2, lab2.b);
  const hue = (a: number, b: number) => {
    if (a === 0 && b === 0) return 0;
    const h = Math.atan2(b, a) / DEG;
    return h < 0 ? h + 360 : h;
  };
  const hp1 = hue(a1, lab1.b), hp2 = hue(a2, lab2.b);
  const dLp = lab2.L - lab1.L, dCp = cp2 - cp1;
  let dhp = 0;
  if (cp1 * cp2 !== 0) {
    dhp = hp2 - hp1;
    if (dhp > 180) dhp -= 360;
    else if (dhp < -180) dhp += 360;
  }
  const dHp = 2 * Math.sqrt(cp1 * cp2) * Math.sin((dhp / 2) * DEG);
  const lBar = (lab1.L + lab2.L) / 2, cBarP = (cp1 + cp2) / 2;
  let hBarP = hp1 + hp2;
  if (cp1 * cp2 !== 0) {
    if (Math.abs(hp1 - hp2) <= 180) hBarP = (hp1 + hp2) / 2;
    else hBarP = hp1 + hp2 < 360 ? (hp1 + hp2 + 360) / 2 : (hp1 + hp2 - 360) / 2;
  }
  const t = 1 - 0.17 * Math.cos((hBarP - 30) * DEG) + 0.24 * Math.cos(2 * hBarP * DEG) +
    0.32 * Math.cos((3 * hBarP + 6) * DEG) - 0.2 * Math.cos((4 * hBarP - 63) * DEG);
  const dTheta = 30 * Math.exp(-(((hBarP - 275) / 25) ** 2));
  const cBarP7 = cBarP ** 7;
  const rC = 2 * Math.sqrt(cBarP7 / (cBarP7 + 25 ** 7));
  const l50 = (lBar - 50) ** 2;
  const sL = 1 + (0.015 * l50) / Math.sqrt(20 + l50);
  const sC = 1 + 0.045 * cBarP;
  const sH = 1 + 0.015 * cBarP * t;
  const rT = -Math.sin(2 * dTheta * DEG) * rC;
  const tl = dLp / (kL * sL), tc = dCp / (kC * sC), th = dHp / (kH * sH);
  return Math.sqrt(tl * tl + tc * tc + th * th + rT * tc * th);
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

/**
 * Colour change of one specimen between two illuminants: CIELAB under each, relative to its
 * own white (the practice for colour-change gem materials, e.g. Liu, Shigley, Fritsch &
 * Hemphill, Color Res. Appl. 19, 186 (1994)), or after chromatic adaptation of the second
 * to the first white. ΔE00 and ΔE*ab, ΔL*, ΔC*ab and the signed hue-angle change Δh
 * (degrees, wrapped to −180…180, positive counter-clockwise from the first to the second).
 *
 * @module
 */
import { type AdaptationMethod, adaptXyz } from "./adaptation.ts";
import { deltaE2000, deltaE76 } from "./delta_e.ts";
import { getIlluminant, type Illuminant } from "./illuminants.ts";
import { type Lab, labToLch, xyzToLab } from "./spaces.ts";
import { tristimulusWeights, weightedXyz } from "./tristimulus.ts";

/** Colour change of one sample from one illuminant to another. */
export interface ColorChange {
  /** First illuminant. */
  from: string;
  /** Second illuminant. */
  to: string;
  /** Observer. */
  observer: string;
  /** Adaptation before comparing, or none (each under its own white). */
  adapt: AdaptationMethod | "none";
  /** ΔE00 between the two colours (Sharma, Wu & Dalal 2005). */
  dE00: number;
  /** ΔE*ab. */
  dEab: number;
  /** ΔL*. */
  dL: number;
  /** ΔC*ab. */
  dC: number;
  /** Signed hue difference, degrees, −180…180. */
  dh: number;
  /** CIELAB under the first illuminant. */
  labFrom: Lab;
  /** CIELAB under the second. */
  labTo: Lab;
  /** C*ab under the first illuminant. */
  chromaFrom: number;
  /** C*ab under the second. */
  chromaTo: number;
  /** h_ab under the first illuminant, degrees. */
  hueFrom: number;
  /** h_ab under the second, degrees. */
  hueTo: number;
}

/** Signed hue difference h2 − h1 in degrees, wrapped into −180…180. */
export function hueDifferenceDeg(h1: number, h2: number): number {
  let d = h2 - h1;
  while (d > 180) d -= 360;
  while (d <= -180) d += 360;
  return d;
}

/**
 * Colour change of transmittance (or reflectance) values between two illuminants.
 *
 * @param adapt `"none"` (each under its own white) or a transform taking the second colour to
 *   the first white before comparing.
 */
export function colorChange(
  wavelengthNm: ArrayLike<number>,
  values: ArrayLike<number>,
  from: string | Illuminant,
  to: string | Illuminant,
  observer: string,
  adapt: AdaptationMethod | "none" = "none",
): ColorChange {
  const fromIll = typeof from === "string" ? getIlluminant(from) : from;
  const toIll = typeof to === "string" ? getIlluminant(to) : to;
  const w1 = tristimulusWeights(wavelengthNm, fromIll, observer);
  const w2 = tristimulusWeights(wavelengthNm, toIll, observer);
  const xyz1 = weightedXyz(values, w1), xyz2 = weightedXyz(values, w2);
  const lab1 = xyzToLab(xyz1, w1.white);
  const lab2 = adapt === "none"
    ? xyzToLab(xyz2, w2.white)
    : xyzToLab(adaptXyz(xyz2, w2.white, w1.white, adapt), w1.white);
  const l1 = labToLch(lab1), l2 = labToLch(lab2);
  return {
    from: fromIll.name,
    to: toIll.name,
    observer: w1.observer,
    adapt,
    dE00: deltaE2000(lab1, lab2),
    dEab: deltaE76(lab1, lab2),
    dL: lab2.L - lab1.L,
    dC: l2.C - l1.C,
    dh: hueDifferenceDeg(l1.h, l2.h),
    labFrom: lab1,
    labTo: lab2,
    chromaFrom: l1.C,
    chromaTo: l2.C,
    hueFrom: l1.h,
    hueTo: l2.h,
  };
}

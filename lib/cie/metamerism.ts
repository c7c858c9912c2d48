/**
 * CIE special metamerism index for a change in illuminant (CIE 15:2018 §9.2.2; CIE 80):
 * the colour difference of two specimens under a test illuminant after the multiplicative
 * correction that makes them match exactly under the reference illuminant
 * (X₂′ = X₂·X₁r/X₂r, likewise Y and Z, applied under the test illuminant).
 *
 * @module
 */
import { deltaE2000, deltaE76 } from "./delta_e.ts";
import { xyzToLab } from "./spaces.ts";
import { tristimulusWeights, weightedXyz } from "./tristimulus.ts";

/** Metamerism index of two spectra on one grid. */
export interface MetamerismIndex {
  reference: string;
  test: string;
  observer: string;
  /** ΔE00 between the specimens under the reference illuminant (how close the match is). */
  mismatchReference: number;
  /** Index as ΔE*ab (the form CIE 15 gives) and as ΔE00. */
  indexAb: number;
  index00: number;
}

/** Special metamerism index of specimens 1 and 2 for reference → test illuminant. */
export function metamerismIndex(
  wavelengthNm: ArrayLike<number>,
  values1: ArrayLike<number>,
  values2: ArrayLike<number>,
  reference = "D65",
  test = "A",
  observer = "10",
): MetamerismIndex {
  const wr = tristimulusWeights(wavelengthNm, reference, observer);
  const wt = tristimulusWeights(wavelengthNm, test, observer);
  const r1 = weightedXyz(values1, wr), r2 = weightedXyz(values2, wr);
  const t1 = weightedXyz(values1, wt), t2 = weightedXyz(values2, wt);
  // the ratio first, so identical specimens get factors of exactly 1 and an index of exactly 0
  const corrected = { X: t2.X * (r1.X / r2.X), Y: t2.Y * (r1.Y / r2.Y), Z: t2.Z * (r1.Z / r2.Z) };
  const lab1 = xyzToLab(t1, wt.white), lab2 = xyzToLab(corrected, wt.white);
  return {
    reference: wr.illuminant,
    test: wt.illuminant,
    observer: wr.observer,
    mismatchReference: deltaE2000(xyzToLab(r1, wr.white), xyzToLab(r2, wr.white)),
    indexAb: deltaE76(lab1, lab2),
    index00: deltaE2000(lab1, lab2),
  };
}

/**
 * Pass/fail of a measured colour against a target colour, by ΔE00 (Sharma et al. 2005), with
 * the direction of the miss in words: lighter/darker, more/less chroma, hue shifted toward a
 * named CIELAB direction (+a* red, +b* yellow, −a* green, −b* blue).
 *
 * @module
 */
import { deltaE2000 } from "../cie/delta_e.ts";
import { hueDifferenceDeg } from "../cie/color_change.ts";
import { type Lab, labToLch } from "../cie/spaces.ts";

/** Result of comparing a colour to its target. */
export interface TargetCheck {
  /** ΔE00 from the target. */
  dE00: number;
  /** Whether ΔE00 is within the tolerance. */
  pass: boolean;
  /** The tolerance, ΔE00. */
  toleranceDE00: number;
  /** Measured minus target. */
  dL: number;
  /** C*ab of the sample minus the target's. */
  dC: number;
  /** Signed hue difference, degrees. */
  dh: number;
  /** Plain-language direction of the miss, e.g. "darker, less chroma, hue toward yellow". */
  words: string;
}

/** Below this size (CIELAB units) a component is not mentioned in the words (common practice). */
export const WORDS_THRESHOLD = 0.5;

const DIRECTIONS = ["red", "yellow", "green", "blue"] as const;

function hueWord(targetHue: number, dh: number): string {
  const quadrant = Math.floor((((targetHue % 360) + 360) % 360) / 90);
  return dh > 0 ? DIRECTIONS[(quadrant + 1) % 4]! : DIRECTIONS[quadrant]!;
}

/**
 * Compares a measured CIELAB colour with a target.
 *
 * @param toleranceDE00 Pass when ΔE00 ≤ tolerance; 2.0 is a common production tolerance
 *   (common practice, not a standard).
 */
export function checkTarget(measured: Lab, target: Lab, toleranceDE00 = 2): TargetCheck {
  const m = labToLch(measured), t = labToLch(target);
  const dE00 = deltaE2000(target, measured);
  const dL = m.L - t.L, dC = m.C - t.C;
  const dh = t.C > 0 && m.C > 0 ? hueDifferenceDeg(t.h, m.h) : 0;
  const dH = 2 * Math.sqrt(m.C * t.C) * Math.sin(((dh / 2) * Math.PI) / 180);
  const words: string[] = [];
  if (Math.abs(dL) >= WORDS_THRESHOLD) words.push(dL > 0 ? "lighter" : "darker");
  if (Math.abs(dC) >= WORDS_THRESHOLD) words.push(dC > 0 ? "more chroma" : "less chroma");
  if (Math.abs(dH) >= WORDS_THRESHOLD) words.push(`hue toward ${hueWord(t.h, dh)}`);
  return {
    dE00,
    pass: dE00 <= toleranceDE00,
    toleranceDE00,
    dL,
    dC,
    dh,
    words: words.length ? words.join(", ") : "on target",
  };
}

/**
 * Analysis step: the target check under each illuminant of the target (ΔE00 against a
 * tolerance; the tolerance is common practice, not a standard).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import type { ColorRow } from "../cie/spectrum_color.ts";
import { checkTarget } from "../dopant/target.ts";
import type { SampleSettings } from "./sample_settings.ts";
import type { TargetConditionCheck, TargetResult } from "./sample_result.ts";
import { colorRowUnder } from "./color_step.ts";

/** The verdict over all illuminants of the target: pass only when every check passes. */
export function targetStep(
  spectrum: Spectrum,
  t: Float64Array,
  rows: ColorRow[],
  s: SampleSettings,
): TargetResult | null {
  const goal = s.target;
  if (!goal) return null;
  const checks: TargetConditionCheck[] = [goal, ...goal.also].map((c) => {
    const row = colorRowUnder(rows, spectrum, t, c.illuminant, goal.observer);
    const measured = { L: row.L, a: row.a, b: row.b };
    return {
      ...checkTarget(measured, c, goal.toleranceDE00),
      illuminant: row.illuminant,
      L: c.L,
      a: c.a,
      b: c.b,
      measured,
    };
  });
  const worst = checks.reduce((w, c) => (c.dE00 > w.dE00 ? c : w), checks[0]!);
  return {
    ...checks[0]!,
    pass: checks.every((c) => c.pass),
    dE00: worst.dE00,
    words: checks.length > 1
      ? checks.map((c) => `${c.illuminant}: ${c.words}`).join("; ")
      : checks[0]!.words,
    name: goal.name,
    observer: goal.observer,
    checks,
  };
}

/**
 * Analysis step: standard uncertainties (k = 1) of the colour rows by first-order propagation
 * (GUM, JCGM 100:2008), σ of the colour change's ΔE00, and the probability that a target is
 * met with its guard-banded verdict (JCGM 106:2012; ISO 14253-1-style guard bands).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { spectrumColorUncertainty } from "../cie/color_uncertainty.ts";
import { colorChangeUncertainty } from "../cie/color_difference_uncertainty.ts";
import { targetPassProbability, verdictRule } from "../dopant/target_probability.ts";
import type { SampleSettings, UncertaintySetting } from "./sample_settings.ts";
import type { ChangeResult, TargetResult, UncertaintyResult } from "./sample_result.ts";

/**
 * Computes the uncertainties and adds pass probabilities and verdicts to the target (in
 * place). Returns null, with a warning, when the propagation is not possible.
 */
export function uncertaintyStep(
  spectrum: Spectrum,
  s: SampleSettings,
  change: ChangeResult,
  target: TargetResult | null,
  warnings: string[],
): UncertaintyResult | null {
  const u = s.uncertainty;
  if (!u) return null;
  const common = {
    reflection: s.reflection,
    sources: u.sources,
    ...(s.pathMm === undefined ? {} : { pathMm: s.pathMm }),
  };
  let rows;
  try {
    rows = spectrumColorUncertainty(spectrum, {
      ...common,
      illuminants: s.illuminants,
      observers: s.observers,
    });
  } catch (e) {
    warnings.push(`uncertainty skipped: ${(e as Error).message}`);
    return null;
  }
  let changeDE00Sd: number | null = null;
  try {
    changeDE00Sd = colorChangeUncertainty(
      spectrum,
      change.from,
      change.to,
      change.observer,
      { ...common, adapt: s.change.adapt },
    ).dE00Sd;
  } catch (e) {
    warnings.push(`uncertainty of the colour change skipped: ${(e as Error).message}`);
  }
  if (target) addPassProbability(spectrum, s, target, u, warnings);
  return {
    rows: rows.map((r) => ({
      illuminant: r.illuminant,
      observer: r.observer,
      LSd: r.LSd,
      aSd: r.aSd,
      bSd: r.bSd,
      CSd: r.CSd,
      hSd: r.hSd,
      labCovariance: r.labCovariance,
    })),
    changeDE00Sd,
    sources: rows[0]!.sources,
    notes: rows[0]!.notes,
  };
}

/** Pass probability per target condition; the target's own is the smallest of them. */
function addPassProbability(
  spectrum: Spectrum,
  s: SampleSettings,
  target: TargetResult,
  u: UncertaintySetting,
  warnings: string[],
): void {
  const passAt = u.passAt ?? 0.95, failAt = u.failAt ?? 0.05;
  let cov;
  try {
    cov = spectrumColorUncertainty(spectrum, {
      reflection: s.reflection,
      sources: u.sources,
      ...(s.pathMm === undefined ? {} : { pathMm: s.pathMm }),
      illuminants: target.checks.map((c) => c.illuminant),
      observers: [target.observer],
    });
  } catch (e) {
    warnings.push(`pass probability skipped: ${(e as Error).message}`);
    return;
  }
  target.checks.forEach((check, i) => {
    const p = targetPassProbability(check.measured, cov[i]!.labCovariance, check, {
      toleranceDE00: check.toleranceDE00,
      passAt,
      failAt,
      seed: i + 1,
    });
    check.passProbability = p.passProbability;
    check.verdict = p.verdict;
  });
  // the stone meets the target only under every light: the joint probability lies between
  // the Bonferroni bound 1 − Σ(1 − Pᵢ) and the smallest Pᵢ
  const ps = target.checks.map((c) => c.passProbability!);
  const upper = Math.min(...ps);
  const lower = Math.max(0, 1 - ps.reduce((sum, q) => sum + (1 - q), 0));
  target.passProbability = upper;
  target.verdict = lower >= passAt ? "pass" : upper <= failAt ? "fail" : "undecided";
  target.rule = ps.length === 1 ? verdictRule(passAt, failAt) : `${verdictRule(passAt, failAt)}; ` +
    `over several lights: pass when 1 − Σ(1 − Pᵢ) reaches the pass level, fail when the ` +
    `smallest Pᵢ is at or below the fail level (passProbability is that smallest Pᵢ)`;
}

/**
 * Probability that the true colour of a stone is within a ΔE00 tolerance of its target, from
 * the propagated CIELAB covariance (normal distribution, seeded Monte Carlo as in JCGM
 * 101:2008, or the stated first-order normal approximation of ΔE00), and a verdict by the
 * conformance-probability rule of JCGM 106:2012 §8–9 with guard bands in the manner of
 * ISO 14253-1: `pass` when the probability is at least `passAt` (95 %), `fail` when at most
 * `failAt` (5 %), `undecided` in between.
 *
 * @module
 */
import { deltaE2000 } from "../cie/delta_e.ts";
import type { Lab } from "../cie/spaces.ts";
import { deltaE2000Sd } from "../cie/color_difference_uncertainty.ts";
import { seededNormal } from "../cie/color_monte_carlo.ts";

/** Verdict of a target check with its risk. */
export type TargetVerdict = "pass" | "fail" | "undecided";

/** Settings of {@linkcode targetPassProbability}. */
export interface TargetProbabilityOptions {
  /** Tolerance in ΔE00 (common practice 2.0, not a standard). @default 2 */
  toleranceDE00?: number;
  /** Smallest probability that is a pass. @default 0.95 */
  passAt?: number;
  /** Largest probability that is a fail. @default 0.05 */
  failAt?: number;
  /**
   * `mc`: draws of L*a*b* from N(measured, covariance); `normal`: Φ((tol − ΔE00)/σ_ΔE00), the
   * first-order approximation, poor when ΔE00 is not several times its σ.
   * @default "mc"
   */
  method?: "mc" | "normal";
  /** Monte Carlo draws. @default 20000 */
  draws?: number;
  /** Monte Carlo seed. @default 1 */
  seed?: number;
}

/** Result of a target check with risk; plain JSON. */
export interface TargetProbability {
  /** Probability that the true colour is within tolerance. */
  passProbability: number;
  /** Standard error of the probability itself (Monte Carlo: √(P(1−P)/M); normal: 0). */
  probabilitySe: number;
  /** pass, fail or undecided (guard bands). */
  verdict: TargetVerdict;
  /** ΔE00 of the measured colour from the target. */
  dE00: number;
  /** First-order σ of ΔE00 to the target. */
  dE00Sd: number;
  /** The tolerance. */
  toleranceDE00: number;
  /** Smallest probability that is a pass. */
  passAt: number;
  /** Largest probability that is a fail. */
  failAt: number;
  /** How the probability was computed. */
  method: "mc" | "normal" | "draws";
  /** Monte Carlo draws. */
  draws?: number;
  /** Monte Carlo seed. */
  seed?: number;
  /** The decision rule in words. */
  rule: string;
}

/** The rule text every result carries. */
export function verdictRule(passAt: number, failAt: number): string {
  return `conformance probability (JCGM 106:2012, guard bands as in ISO 14253-1): pass when P(ΔE00 ≤ tolerance) ≥ ${
    100 * passAt
  } %, fail when ≤ ${100 * failAt} %, otherwise undecided`;
}

/** The verdict for a probability. */
export function verdictFor(p: number, passAt = 0.95, failAt = 0.05): TargetVerdict {
  if (!(failAt < passAt) || failAt < 0 || passAt > 1) {
    throw new RangeError(`Cannot decide with passAt ${passAt} and failAt ${failAt}`);
  }
  return p >= passAt ? "pass" : p <= failAt ? "fail" : "undecided";
}

/** Lower Cholesky factor of a 3×3 covariance; semidefinite directions get a zero column. */
function cholesky3(c: number[][]): number[][] {
  const l = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
  for (let j = 0; j < 3; j++) {
    let d = c[j]![j]!;
    for (let k = 0; k < j; k++) d -= l[j]![k]! ** 2;
    const ljj = d > 1e-14 * Math.max(1e-300, c[j]![j]!) ? Math.sqrt(d) : 0;
    l[j]![j] = ljj;
    for (let i = j + 1; i < 3; i++) {
      let s = c[i]![j]!;
      for (let k = 0; k < j; k++) s -= l[i]![k]! * l[j]![k]!;
      l[i]![j] = ljj > 0 ? s / ljj : 0;
    }
  }
  return l;
}

/** Standard normal distribution function (Abramowitz & Stegun 7.1.26 for erf, |ε| < 1.5e-7). */
function normalCdf(z: number): number {
  const x = Math.abs(z) / Math.SQRT2;
  const t = 1 / (1 + 0.3275911 * x);
  const erf = 1 - t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 +
                t * (-1.453152027 + t * 1.061405429)))) *
      Math.exp(-x * x);
  return z >= 0 ? (1 + erf) / 2 : (1 - erf) / 2;
}

function settings(options: TargetProbabilityOptions) {
  const toleranceDE00 = options.toleranceDE00 ?? 2;
  if (!(toleranceDE00 > 0)) {
    throw new RangeError(`Cannot use tolerance ${toleranceDE00}: must be > 0`);
  }
  return { toleranceDE00, passAt: options.passAt ?? 0.95, failAt: options.failAt ?? 0.05 };
}

/**
 * Probability that the true colour is within tolerance of the target, and the verdict.
 *
 * @param measured Measured L*a*b*.
 * @param labCovariance Its 3×3 covariance (from the first-order or Monte Carlo route).
 * @param target Target L*a*b* (taken as exact).
 * @throws {RangeError} For a tolerance ≤ 0, thresholds out of order or bad draws.
 *
 * @example Far inside the tolerance is a pass
 * ```ts
 * import { targetPassProbability } from "./target_probability.ts";
 * const c = [[0.01, 0, 0], [0, 0.01, 0], [0, 0, 0.01]];
 * const r = targetPassProbability({ L: 50, a: 20, b: 5 }, c, { L: 50, a: 20.3, b: 5 });
 * if (r.verdict !== "pass") throw new Error(r.verdict);
 * ```
 */
export function targetPassProbability(
  measured: Lab,
  labCovariance: number[][],
  target: Lab,
  options: TargetProbabilityOptions = {},
): TargetProbability {
  const { toleranceDE00, passAt, failAt } = settings(options);
  const zero = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
  const dE00 = deltaE2000(target, measured);
  const dE00Sd = deltaE2000Sd(target, measured, zero, labCovariance);
  const base = { dE00, dE00Sd, toleranceDE00, passAt, failAt, rule: verdictRule(passAt, failAt) };
  if (options.method === "normal") {
    const p = dE00Sd > 0
      ? normalCdf((toleranceDE00 - dE00) / dE00Sd)
      : dE00 <= toleranceDE00
      ? 1
      : 0;
    return {
      ...base,
      passProbability: p,
      probabilitySe: 0,
      verdict: verdictFor(p, passAt, failAt),
      method: "normal",
    };
  }
  const draws = options.draws ?? 20000;
  const seed = options.seed ?? 1;
  if (!Number.isInteger(draws) || draws < 1) {
    throw new RangeError(`Cannot run ${draws} Monte Carlo draws: need a positive integer`);
  }
  const l = cholesky3(labCovariance);
  const normal = seededNormal(seed);
  let inside = 0;
  for (let k = 0; k < draws; k++) {
    const z0 = normal(), z1 = normal(), z2 = normal();
    const lab = {
      L: measured.L + l[0]![0]! * z0,
      a: measured.a + l[1]![0]! * z0 + l[1]![1]! * z1,
      b: measured.b + l[2]![0]! * z0 + l[2]![1]! * z1 + l[2]![2]! * z2,
    };
    if (deltaE2000(target, lab) <= toleranceDE00) inside++;
  }
  const p = inside / draws;
  return {
    ...base,
    passProbability: p,
    probabilitySe: Math.sqrt((p * (1 - p)) / draws),
    verdict: verdictFor(p, passAt, failAt),
    method: "mc",
    draws,
    seed,
  };
}

/**
 * The same decision from Monte Carlo draws of the colour itself (no normal assumption): the
 * fraction of draws within tolerance.
 *
 * @param labDraws Interleaved [L0, a0, b0, L1, …] (e.g. `labDraws` of color_monte_carlo.ts).
 * @param measured The colour of the unperturbed spectrum (for dE00 and its first-order σ).
 */
export function targetPassProbabilityFromDraws(
  labDraws: ArrayLike<number>,
  measured: Lab,
  target: Lab,
  options: Omit<TargetProbabilityOptions, "method" | "draws" | "seed"> = {},
): TargetProbability {
  const { toleranceDE00, passAt, failAt } = settings(options);
  const m = Math.floor(labDraws.length / 3);
  if (m < 1) throw new RangeError("Cannot decide from no draws");
  let inside = 0;
  const d = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    d[k] = deltaE2000(target, {
      L: labDraws[3 * k]!,
      a: labDraws[3 * k + 1]!,
      b: labDraws[3 * k + 2]!,
    });
    if (d[k]! <= toleranceDE00) inside++;
  }
  let mean = 0;
  d.forEach((v) => (mean += v / m));
  const sd = Math.sqrt(d.reduce((s, v) => s + (v - mean) ** 2, 0) / Math.max(1, m - 1));
  const p = inside / m;
  return {
    dE00: deltaE2000(target, measured),
    dE00Sd: sd,
    toleranceDE00,
    passAt,
    failAt,
    rule: verdictRule(passAt, failAt),
    passProbability: p,
    probabilitySe: Math.sqrt((p * (1 - p)) / m),
    verdict: verdictFor(p, passAt, failAt),
    method: "draws",
    draws: m,
  };
}

/**
 * Standard uncertainty of a CIEDE2000 difference (Sharma, Wu & Dalal 2005) between two
 * uncertain colours — first order (JCGM 100:2008 eq. 13, with the covariance between the two
 * colours when the same spectrum gives both, as in a colour change) or from Monte Carlo draws
 * (JCGM 101:2008). NOTE: ΔE00 ≥ 0 has a kink at zero; where ΔE00 is not several times its σ,
 * the first-order σ is not meaningful and the Monte Carlo route should be used.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { pathTransmittanceSensitivity } from "../optics/path_transmittance_sensitivity.ts";
import { transmittanceForPath } from "../optics/path_transmittance.ts";
import { colorChange } from "./color_change.ts";
import type { AdaptationMethod } from "./adaptation.ts";
import { adaptXyz } from "./adaptation.ts";
import { deltaE2000 } from "./delta_e.ts";
import { getIlluminant, type Illuminant } from "./illuminants.ts";
import { type Lab, xyzToLab } from "./spaces.ts";
import { tristimulusWeights } from "./tristimulus.ts";
import {
  type ColorUncertaintyOptions,
  labCovarianceBetween,
  labSensitivity,
  type ResolvedUncertaintySources,
  resolveUncertaintySources,
} from "./color_uncertainty.ts";
import { drawColorsMonteCarlo, interval95, meanAndSd } from "./color_monte_carlo.ts";

const STEP = 1e-5;

/** ∂ΔE00/∂(L1, a1, b1) and ∂ΔE00/∂(L2, a2, b2) by central differences. */
export function deltaE2000Gradient(lab1: Lab, lab2: Lab): [number[], number[]] {
  const keys = ["L", "a", "b"] as const;
  const along = (which: 1 | 2) =>
    keys.map((k) => {
      const up = { ...(which === 1 ? lab1 : lab2) }, down = { ...up };
      up[k] += STEP;
      down[k] -= STEP;
      return which === 1
        ? (deltaE2000(up, lab2) - deltaE2000(down, lab2)) / (2 * STEP)
        : (deltaE2000(lab1, up) - deltaE2000(lab1, down)) / (2 * STEP);
    });
  return [along(1), along(2)];
}

function quadratic(g: number[], c: number[][], h: number[]): number {
  let s = 0;
  for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) s += g[i]! * c[i]![j]! * h[j]!;
  return s;
}

/**
 * First-order σ of ΔE00(lab1, lab2).
 *
 * @param cov1 Covariance of lab1 (3×3); zeros for a fixed reference such as a target.
 * @param cov2 Covariance of lab2.
 * @param cov12 Cross-covariance [i][j] = cov(lab1_i, lab2_j); omit for independent colors.
 *
 * @example A target with no uncertainty: σ(ΔE00) along L* only is σ_L / S_L at L* = 50
 * ```ts
 * import { deltaE2000Sd } from "./color_difference_uncertainty.ts";
 * const zero = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
 * const sd = deltaE2000Sd({ L: 50, a: 0, b: 0 }, { L: 52, a: 0, b: 0 }, zero,
 *   [[0.01, 0, 0], [0, 0, 0], [0, 0, 0]]);
 * if (Math.abs(sd - 0.1) > 1e-3) throw new Error(String(sd));
 * ```
 */
export function deltaE2000Sd(
  lab1: Lab,
  lab2: Lab,
  cov1: number[][],
  cov2: number[][],
  cov12?: number[][],
): number {
  const [g1, g2] = deltaE2000Gradient(lab1, lab2);
  let v = quadratic(g1, cov1, g1) + quadratic(g2, cov2, g2);
  if (cov12) v += 2 * quadratic(g1, cov12, g2);
  return Math.sqrt(Math.max(0, v));
}

/** Uncertainty of a colour change between two illuminants; plain JSON. */
export interface ColorChangeUncertainty {
  mode: "linear" | "mc";
  dE00: number;
  dE00Sd: number;
  /** Monte Carlo only. */
  dE00Mean?: number;
  dE00Interval95?: [number, number];
  draws?: number;
  seed?: number;
  sources: ResolvedUncertaintySources;
}

/** Options of {@linkcode colorChangeUncertainty}. */
export interface ColorChangeUncertaintyOptions
  extends Omit<ColorUncertaintyOptions, "illuminants" | "observers"> {
  adapt?: AdaptationMethod | "none";
  mode?: "linear" | "mc";
  draws?: number;
  seed?: number;
}

/**
 * σ of the ΔE00 colour change of a spectrum between two illuminants (the two colours are
 * correlated: the same noise, offset, shift, thickness and path act on both).
 *
 * @throws {RangeError} When the rescaling needs a missing thickness, or a σ is negative.
 */
export function colorChangeUncertainty(
  spectrum: Spectrum,
  from: string | Illuminant,
  to: string | Illuminant,
  observer: string,
  options: ColorChangeUncertaintyOptions = {},
): ColorChangeUncertainty {
  const fromIll = typeof from === "string" ? getIlluminant(from) : from;
  const toIll = typeof to === "string" ? getIlluminant(to) : to;
  const adapt = options.adapt ?? "none";
  const nm = spectrum.wavelengthNm;
  const white1 = tristimulusWeights(nm, fromIll, observer).white;
  if (options.mode === "mc") {
    const run = drawColorsMonteCarlo(spectrum, {
      ...options,
      illuminants: [fromIll, toIll],
      observers: [observer],
    });
    const [r1, r2] = run.rows as [(typeof run.rows)[0], (typeof run.rows)[0]];
    const labOf = (row: typeof r1, k: number): Lab => {
      const xyz = { X: row.xyz[3 * k]!, Y: row.xyz[3 * k + 1]!, Z: row.xyz[3 * k + 2]! };
      return adapt === "none" || row === r1
        ? xyzToLab(xyz, row.white)
        : xyzToLab(adaptXyz(xyz, row.white, white1, adapt), white1);
    };
    const d = Float64Array.from(
      { length: run.draws },
      (_, k) => deltaE2000(labOf(r1, k), labOf(r2, k)),
    );
    const t = transmittanceForPath(spectrum, options.pathMm, options.reflection).values;
    const nominal = colorChange(nm, t, fromIll, toIll, observer, adapt).dE00;
    const { mean, sd } = meanAndSd(d);
    return {
      mode: "mc",
      dE00: nominal,
      dE00Sd: sd,
      dE00Mean: mean,
      dE00Interval95: interval95(d),
      draws: run.draws,
      seed: run.seed,
      sources: run.resolved,
    };
  }
  const { resolved, noisePerPoint } = resolveUncertaintySources(spectrum, options.sources);
  const path = pathTransmittanceSensitivity(spectrum, options.pathMm, options.reflection);
  const s1 = labSensitivity(nm, path, fromIll, observer);
  const s2 = labSensitivity(
    nm,
    path,
    toIll,
    observer,
    adapt === "none" ? undefined : { white: white1, method: adapt },
  );
  const c11 = labCovarianceBetween(s1, s1, noisePerPoint, resolved);
  const c22 = labCovarianceBetween(s2, s2, noisePerPoint, resolved);
  const c12 = labCovarianceBetween(s1, s2, noisePerPoint, resolved);
  return {
    mode: "linear",
    dE00: deltaE2000(s1.lab, s2.lab),
    dE00Sd: deltaE2000Sd(s1.lab, s2.lab, c11, c22, c12),
    sources: resolved,
  };
}

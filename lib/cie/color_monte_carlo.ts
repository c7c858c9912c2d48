/**
 * Monte Carlo propagation of measurement uncertainty from a spectrum to CIELAB (JCGM 101:2008
 * §5–7): every draw perturbs the measured values (independent noise per point plus one common
 * offset), shifts the wavelength scale, draws the thickness and the path, and runs the
 * production colour route (path rescaling, weighting factors, CIELAB). Seeded, so a run is
 * repeatable. Use it where the first-order route is doubtful: dark stones (the logarithm of
 * Beer–Lambert and the clamp at the dark level), colours near the white (hue undefined), or a
 * ΔE near zero.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { transmittanceForPath } from "../optics/path_transmittance.ts";
import { getIlluminant } from "./illuminants.ts";
import { type Lab, xyzToLab } from "./spaces.ts";
import { tristimulusWeights, weightedXyz, type Xyz } from "./tristimulus.ts";
import { hueDifferenceDeg } from "./color_change.ts";
import {
  type ColorUncertainty,
  type ColorUncertaintyOptions,
  type ResolvedUncertaintySources,
  resolveUncertaintySources,
  uncertaintyNotes,
} from "./color_uncertainty.ts";

/** Monte Carlo settings. */
export interface MonteCarloOptions extends ColorUncertaintyOptions {
  /**
   * Number of draws. 10⁴ gives σ to about 1 % (σ/√(2M)); JCGM 101 §7.2 asks for about 10⁴/(1 − p)
   * for a coverage interval of probability p.
   * @default 10000
   */
  draws?: number;
  /** Seed of the generator. @default 1 */
  seed?: number;
}

/** Default number of draws. */
export const DEFAULT_DRAWS = 10000;

/**
 * Standard normal deviates from a seeded generator (mulberry32 uniform, Box–Muller transform;
 * Box & Muller, Ann. Math. Stat. 29, 610 (1958)).
 *
 * @example Repeatable
 * ```ts
 * import { seededNormal } from "./color_monte_carlo.ts";
 * if (seededNormal(7)() !== seededNormal(7)()) throw new Error("same seed, same draw");
 * ```
 */
export function seededNormal(seed: number): () => number {
  let state = seed >>> 0;
  const uniform = () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
  let spare: number | undefined;
  return () => {
    if (spare !== undefined) {
      const s = spare;
      spare = undefined;
      return s;
    }
    const r = Math.sqrt(-2 * Math.log(1 - uniform()));
    const phi = 2 * Math.PI * uniform();
    spare = r * Math.sin(phi);
    return r * Math.cos(phi);
  };
}

/** The draws of one colour row. */
export interface ColorDraws {
  illuminant: string;
  observer: string;
  white: Xyz;
  /** Colour of the unperturbed spectrum. */
  nominal: Lab;
  /** XYZ of every draw, interleaved [X0, Y0, Z0, X1, …]. */
  xyz: Float64Array<ArrayBuffer>;
}

/** Values at λ_i − s by linear interpolation, end values held (as CIE 15 §7.2.2). */
function shifted(nm: Float64Array, v: Float64Array, s: number, out: Float64Array): void {
  const n = nm.length;
  let j = 0;
  for (let i = 0; i < n; i++) {
    const x = nm[i]! - s;
    if (x <= nm[0]!) {
      out[i] = v[0]!;
      continue;
    }
    if (x >= nm[n - 1]!) {
      out[i] = v[n - 1]!;
      continue;
    }
    while (j < n - 2 && nm[j + 1]! < x) j++;
    while (j > 0 && nm[j]! > x) j--;
    const f = (x - nm[j]!) / (nm[j + 1]! - nm[j]!);
    out[i] = v[j]! + f * (v[j + 1]! - v[j]!);
  }
}

/** A normal draw truncated to positive values (a thickness or path cannot be ≤ 0). */
function positiveDraw(mean: number, sd: number, normal: () => number): number {
  for (let k = 0; k < 100; k++) {
    const x = mean + sd * normal();
    if (x > 0) return x;
  }
  throw new RangeError(`Cannot draw a positive length from ${mean} ± ${sd} mm`);
}

/**
 * Draws the colour of a spectrum under each illuminant × observer by Monte Carlo.
 *
 * @throws {RangeError} When draws is not a positive integer, or the rescaling needs a missing
 *   thickness.
 */
export function drawColorsMonteCarlo(
  spectrum: Spectrum,
  options: MonteCarloOptions = {},
): { rows: ColorDraws[]; resolved: ResolvedUncertaintySources; draws: number; seed: number } {
  const draws = options.draws ?? DEFAULT_DRAWS;
  const seed = options.seed ?? 1;
  if (!Number.isInteger(draws) || draws < 2) {
    throw new RangeError(`Cannot run ${draws} Monte Carlo draws: need an integer ≥ 2`);
  }
  const { resolved, noisePerPoint } = resolveUncertaintySources(spectrum, options.sources);
  const nm = spectrum.wavelengthNm;
  const n = nm.length;
  const weights = (options.illuminants ?? ["D65", "A"]).flatMap((ill) => {
    const illuminant = typeof ill === "string" ? getIlluminant(ill) : ill;
    return (options.observers ?? ["2"]).map((o) => tristimulusWeights(nm, illuminant, o));
  });
  const nominalT = transmittanceForPath(spectrum, options.pathMm, options.reflection).values;
  const rows: ColorDraws[] = weights.map((w) => ({
    illuminant: w.illuminant,
    observer: w.observer,
    white: w.white,
    nominal: xyzToLab(weightedXyz(nominalT, w), w.white),
    xyz: new Float64Array(3 * draws),
  }));
  const normal = seededNormal(seed);
  const values = new Float64Array(n);
  const d = spectrum.thicknessMm;
  for (let k = 0; k < draws; k++) {
    const s = resolved.wavelengthSdNm > 0 ? resolved.wavelengthSdNm * normal() : 0;
    if (s !== 0) shifted(nm, spectrum.values, s, values);
    else values.set(spectrum.values);
    const offset = resolved.offsetSd * normal();
    for (let i = 0; i < n; i++) values[i] = values[i]! + offset + noisePerPoint[i]! * normal();
    const draw: Spectrum = { ...spectrum, values };
    if (d !== undefined && resolved.thicknessSdMm > 0) {
      draw.thicknessMm = positiveDraw(d, resolved.thicknessSdMm, normal);
    }
    const p = options.pathMm === undefined || resolved.pathSdMm === 0
      ? options.pathMm
      : positiveDraw(options.pathMm, resolved.pathSdMm, normal);
    const t = transmittanceForPath(draw, p, options.reflection).values;
    weights.forEach((w, r) => {
      const xyz = weightedXyz(t, w);
      const out = rows[r]!.xyz;
      out[3 * k] = xyz.X;
      out[3 * k + 1] = xyz.Y;
      out[3 * k + 2] = xyz.Z;
    });
  }
  return { rows, resolved, draws, seed };
}

/** CIELAB of every draw of a row, interleaved [L0, a0, b0, …]. */
export function labDraws(row: ColorDraws): Float64Array<ArrayBuffer> {
  const m = row.xyz.length / 3;
  const out = new Float64Array(3 * m);
  for (let k = 0; k < m; k++) {
    const lab = xyzToLab(
      { X: row.xyz[3 * k]!, Y: row.xyz[3 * k + 1]!, Z: row.xyz[3 * k + 2]! },
      row.white,
    );
    out[3 * k] = lab.L;
    out[3 * k + 1] = lab.a;
    out[3 * k + 2] = lab.b;
  }
  return out;
}

/** The 2.5 % and 97.5 % quantiles (probabilistically symmetric 95 % interval, JCGM 101 §7.7). */
export function interval95(samples: Float64Array): [number, number] {
  const s = Float64Array.from(samples).sort();
  const at = (p: number) => {
    const x = p * (s.length - 1);
    const i = Math.floor(x);
    return s[i]! + (x - i) * ((s[Math.min(i + 1, s.length - 1)] ?? s[i]!) - s[i]!);
  };
  return [at(0.025), at(0.975)];
}

/** Sample mean and standard deviation. */
export function meanAndSd(samples: ArrayLike<number>): { mean: number; sd: number } {
  const m = samples.length;
  let mean = 0;
  for (let k = 0; k < m; k++) mean += samples[k]!;
  mean /= m;
  let ss = 0;
  for (let k = 0; k < m; k++) ss += (samples[k]! - mean) ** 2;
  return { mean, sd: Math.sqrt(ss / (m - 1)) };
}

/**
 * Summary of CIELAB draws: mean, covariance, σ of L*, a*, b*, C*, h (hue deviations wrapped
 * around the circular mean) and 95 % intervals.
 */
export function summariseLabDraws(lab: Float64Array): Omit<
  ColorUncertainty,
  "illuminant" | "observer" | "mode" | "sources" | "notes" | "budget"
> {
  const m = lab.length / 3;
  const comp = [0, 1, 2].map((c) => Float64Array.from({ length: m }, (_, k) => lab[3 * k + c]!));
  const means = comp.map((x) => meanAndSd(x).mean);
  const cov = [0, 1, 2].map((i) =>
    [0, 1, 2].map((j) => {
      let s = 0;
      for (let k = 0; k < m; k++) s += (comp[i]![k]! - means[i]!) * (comp[j]![k]! - means[j]!);
      return s / (m - 1);
    })
  );
  const chroma = Float64Array.from({ length: m }, (_, k) => Math.hypot(comp[1]![k]!, comp[2]![k]!));
  let sx = 0, sy = 0;
  for (let k = 0; k < m; k++) {
    const c = chroma[k]! || 1;
    sx += comp[1]![k]! / c;
    sy += comp[2]![k]! / c;
  }
  const hMean = ((Math.atan2(sy, sx) * 180) / Math.PI + 360) % 360;
  const hue = Float64Array.from({ length: m }, (_, k) => {
    const h = ((Math.atan2(comp[2]![k]!, comp[1]![k]!) * 180) / Math.PI + 360) % 360;
    return hMean + hueDifferenceDeg(hMean, h);
  });
  const hSd = meanAndSd(hue).sd;
  return {
    LSd: Math.sqrt(cov[0]![0]!),
    aSd: Math.sqrt(cov[1]![1]!),
    bSd: Math.sqrt(cov[2]![2]!),
    CSd: meanAndSd(chroma).sd,
    hSd: Number.isFinite(hSd) ? hSd : null,
    labCovariance: cov,
    labMean: { L: means[0]!, a: means[1]!, b: means[2]! },
    interval95: {
      L: interval95(comp[0]!),
      a: interval95(comp[1]!),
      b: interval95(comp[2]!),
      C: interval95(chroma),
      h: interval95(hue).map((h) => (h + 360) % 360) as [number, number],
    },
    draws: m,
  };
}

/**
 * Monte Carlo (JCGM 101) uncertainty of the colour of a spectrum under each illuminant ×
 * observer; the same shape as the first-order result, plus mean, draws, seed and intervals.
 *
 * @throws {RangeError} As {@linkcode drawColorsMonteCarlo}.
 */
export function spectrumColorMonteCarlo(
  spectrum: Spectrum,
  options: MonteCarloOptions = {},
): ColorUncertainty[] {
  const { rows, resolved, draws, seed } = drawColorsMonteCarlo(spectrum, options);
  const notes = [
    ...uncertaintyNotes(spectrum, resolved, options.pathMm),
    `Monte Carlo, ${draws} draws, seed ${seed}; σ of the result itself about ${
      (100 / Math.sqrt(2 * draws)).toFixed(1)
    } %`,
  ];
  return rows.map((row) => ({
    illuminant: row.illuminant,
    observer: row.observer,
    mode: "mc" as const,
    ...summariseLabDraws(labDraws(row)),
    seed,
    sources: resolved,
    notes,
  }));
}

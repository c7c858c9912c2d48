/**
 * Inverse doping ("aim"): the non-negative dopant levels (and, optionally, the path length
 * within bounds) whose predicted colour is closest in ΔE00 to a target, under one illuminant
 * or a weighted set. The forward model is physical: α(λ) = α_base + Σ cᵢ·αᵢ(λ), internal
 * transmittance e^(−α d), the two Fresnel surfaces when a surface reflectance is given, then
 * CIE tristimulus values and CIELAB under each illuminant's own white.
 *
 * @module
 */
import { deltaE2000 } from "../cie/delta_e.ts";
import { type Lab, xyzToLab } from "../cie/spaces.ts";
import { tristimulusWeights, weightedXyz } from "../cie/tristimulus.ts";
import { slabTransmittance } from "../optics/slab.ts";
import { nelderMead } from "../numeric/nelder_mead.ts";

/** One dopant: α in cm⁻¹ per unit level on the problem's grid. */
export interface DopantSpectrum {
  /** Dopant name, e.g. Cr. */
  name: string;
  /** α (cm⁻¹, natural log) per unit level at each wavelength. */
  alphaPerUnit: Float64Array;
}

/** A target colour under one illuminant and observer, with its weight in the objective. */
export interface AimTarget {
  /** Target CIELAB. */
  lab: Lab;
  /** Illuminant of the target. */
  illuminant: string;
  /** Observer of the target. */
  observer: string;
  /** Weight in the objective (default 1). */
  weight?: number;
}

/** The problem to solve. */
export interface AimProblem {
  /** Wavelength grid, nm. */
  wavelengthNm: Float64Array;
  /** The dopants whose levels are sought. */
  dopants: DopantSpectrum[];
  /** α of the undoped host, cm⁻¹ (default 0). */
  baseAlpha?: Float64Array;
  /** Fixed path in mm, or bounds when the path is free. */
  path: number | { minMm: number; maxMm: number };
  /** Surface reflectance R(λ) of each face; omit for no surfaces. */
  surfaceReflectance?: Float64Array;
  /** Target colors. */
  targets: AimTarget[];
  /** Upper bound of each level (default 100× the level that gives α = 10 cm⁻¹ at its peak). */
  maxLevels?: number[];
  /** ΔE00 above which the target counts as unreachable (default 1.0; common practice). */
  reachableDE00?: number;
}

/** The answer. */
export interface AimResult {
  /** Level of each dopant, in its unit spectrum's units. */
  levels: Record<string, number>;
  /** Path, mm. */
  pathMm: number;
  /** Achieved colour under the first target's illuminant. */
  L: number;
  /** Achieved a*. */
  a: number;
  /** Achieved b*. */
  b: number;
  /** ΔE00 to the first target; `dE00All` lists every target. */
  dE00: number;
  /** ΔE00 to every target. */
  dE00All: number[];
  /** ΔE00 per unit change of each level, from the achieved colour (first target). */
  sensitivity: Record<string, number>;
  /** Whether the best ΔE00 is within the reachable limit. */
  reachable: boolean;
  /** What the result means, in words. */
  message: string;
}

/** Predicted CIELAB of levels and path under each target's illuminant. */
export function predictLab(problem: AimProblem, levels: number[], pathMm: number): Lab[] {
  const nm = problem.wavelengthNm;
  const t = new Float64Array(nm.length);
  for (let i = 0; i < nm.length; i++) {
    let alpha = problem.baseAlpha ? problem.baseAlpha[i]! : 0;
    problem.dopants.forEach((d, k) => (alpha += levels[k]! * d.alphaPerUnit[i]!));
    const x = Math.exp((-alpha * pathMm) / 10);
    t[i] = problem.surfaceReflectance ? slabTransmittance(x, problem.surfaceReflectance[i]!) : x;
  }
  return problem.targets.map((target) => {
    const w = tristimulusWeights(nm, target.illuminant, target.observer);
    return xyzToLab(weightedXyz(t, w), w.white);
  });
}

/**
 * Solves for the dopant levels (and path) nearest the target colour.
 *
 * @throws {RangeError} For a problem with no dopants or no targets.
 */
export function aimDoping(problem: AimProblem): AimResult {
  const m = problem.dopants.length;
  if (m === 0 || problem.targets.length === 0) {
    throw new RangeError("Cannot aim: give at least one dopant and one target");
  }
  const free = typeof problem.path !== "number";
  const bounds = typeof problem.path === "number" ? undefined : problem.path;
  const scale = problem.dopants.map((d) => 1 / Math.max(...d.alphaPerUnit, 1e-12));
  const maxLevels = problem.maxLevels ?? scale.map((s) => 1000 * s);
  const decode = (u: number[]) => {
    const levels = u.slice(0, m).map((v, k) => Math.min(maxLevels[k]!, (v * v) * scale[k]!));
    const pathMm = bounds
      ? bounds.minMm + ((bounds.maxMm - bounds.minMm) * (1 + Math.sin(u[m]!))) / 2
      : (problem.path as number);
    return { levels, pathMm };
  };
  const objective = (u: number[]) => {
    const { levels, pathMm } = decode(u);
    const labs = predictLab(problem, levels, pathMm);
    return labs.reduce(
      (s, lab, j) =>
        s + (problem.targets[j]!.weight ?? 1) * deltaE2000(problem.targets[j]!.lab, lab) ** 2,
      0,
    );
  };
  let best = { x: [] as number[], value: Infinity };
  // Starts: equal peak absorptions α·d of several sizes, and each dopant alone.
  const starts: number[][] = [];
  for (const strength of [0.3, 1, 3, 10, 30]) {
    starts.push(problem.dopants.map(() => Math.sqrt(strength / m)));
    problem.dopants.forEach((_, k) =>
      starts.push(problem.dopants.map((__, j) => (j === k ? Math.sqrt(strength) : 0.05)))
    );
  }
  for (const s of starts) {
    const x0 = free ? [...s, 0] : s;
    const r = nelderMead(objective, x0, x0.map(() => 0.5), {
      maxEvaluations: 1500,
      tolerance: 1e-10,
    });
    if (r.value < best.value) best = r;
  }
  for (let round = 0; round < 3; round++) {
    const r = nelderMead(objective, best.x, best.x.map((v) => 0.05 * Math.max(Math.abs(v), 0.1)), {
      maxEvaluations: 3000,
      tolerance: 1e-16,
    });
    if (r.value <= best.value) best = r;
  }
  const { levels, pathMm } = decode(best.x);
  const labs = predictLab(problem, levels, pathMm);
  const dE00All = labs.map((lab, j) => deltaE2000(problem.targets[j]!.lab, lab));
  const sensitivity: Record<string, number> = {};
  problem.dopants.forEach((d, k) => {
    const delta = Math.max(1e-3 * levels[k]!, 1e-6 * maxLevels[k]!);
    const bumped = levels.slice();
    bumped[k] = bumped[k]! + delta;
    sensitivity[d.name] = deltaE2000(labs[0]!, predictLab(problem, bumped, pathMm)[0]!) / delta;
  });
  const limit = problem.reachableDE00 ?? 1;
  const reachable = dE00All.every((v) => v <= limit);
  const first = labs[0]!;
  return {
    levels: Object.fromEntries(problem.dopants.map((d, k) => [d.name, levels[k]!])),
    pathMm,
    L: first.L,
    a: first.a,
    b: first.b,
    dE00: dE00All[0]!,
    dE00All,
    sensitivity,
    reachable,
    message: reachable
      ? `target reached within ΔE00 ${limit}`
      : `unreachable with these dopants: the closest colour is ΔE00 ${
        Math.max(...dE00All).toFixed(2)
      } away (limit ${limit})`,
  };
}

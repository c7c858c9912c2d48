/**
 * Colour as the path through the crystal grows: L*, C*ab, h_ab and a swatch at each path,
 * the path of maximum chroma, and the path that reaches a target lightness.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { pathRescaling, type ReflectionSettings } from "../optics/path_transmittance.ts";
import { colorFromXyz } from "./spectrum_color.ts";
import { swatchFromXyz } from "./swatch.ts";
import { tristimulusWeights, weightedXyz } from "./tristimulus.ts";

/** One point of a thickness series. */
export interface ThicknessPoint {
  /** Path, mm. */
  pathMm: number;
  /** L* at that path. */
  L: number;
  /** C*ab. */
  C: number;
  /** h_ab, degrees; null below the luminance floor. */
  h: number;
  /** a*. */
  a: number;
  /** b*. */
  b: number;
  /** sRGB swatch. */
  srgb: string;
}

/** A thickness series under one illuminant and observer. */
export interface ThicknessSeries {
  /** Illuminant. */
  illuminant: string;
  /** Observer. */
  observer: string;
  /** The colour at each path. */
  points: ThicknessPoint[];
  /** Path of maximum C*ab (refined by golden-section search between the grid points). */
  maxChromaPathMm: number;
  /** Largest C*ab over the paths. */
  maxChroma: number;
  /**
   * Whether the largest C*ab sits at an end of the range searched (chroma still rising or
   * already falling there): then `maxChromaPathMm` is that end, not a maximum of the colour.
   */
  maxChromaAtRangeEnd: boolean;
  /** Path where L* reaches the target, when a target was asked for and is reachable. */
  targetLightnessPathMm?: number;
}

/** Choices for {@linkcode thicknessSeries}. */
export interface SeriesOptions {
  fromMm?: number;
  toMm?: number;
  steps?: number;
  illuminant?: string;
  observer?: string;
  reflection?: ReflectionSettings;
  targetL?: number;
}

/**
 * Colour of a spectrum's crystal over a range of path lengths.
 *
 * @throws {RangeError} When the spectrum cannot be rescaled (unknown thickness).
 */
export function thicknessSeries(spectrum: Spectrum, options: SeriesOptions = {}): ThicknessSeries {
  const { fromMm = 0.5, toMm = 12, steps = 24, illuminant = "D65", observer = "2" } = options;
  const reflection = options.reflection ?? { reflection: "none" };
  const w = tristimulusWeights(spectrum.wavelengthNm, illuminant, observer);
  const rescale = pathRescaling(spectrum, reflection);
  const at = (pathMm: number) => {
    const t = rescale(pathMm).values;
    const xyz = weightedXyz(t, w);
    return { xyz, c: colorFromXyz(xyz, w.white) };
  };
  const points: ThicknessPoint[] = [];
  for (let i = 0; i <= steps; i++) {
    const pathMm = fromMm + ((toMm - fromMm) * i) / steps;
    const { xyz, c } = at(pathMm);
    points.push({
      pathMm,
      L: c.L,
      C: c.C,
      h: c.h,
      a: c.a,
      b: c.b,
      srgb: swatchFromXyz(xyz, w.white).srgb.css,
    });
  }
  let best = 0;
  points.forEach((p, i) => (p.C > points[best]!.C ? (best = i) : 0));
  let lo = points[Math.max(0, best - 1)]!.pathMm, hi = points[Math.min(steps, best + 1)]!.pathMm;
  const g = (Math.sqrt(5) - 1) / 2;
  for (let k = 0; k < 40; k++) {
    const m1 = hi - g * (hi - lo), m2 = lo + g * (hi - lo);
    if (at(m1).c.C >= at(m2).c.C) hi = m2;
    else lo = m1;
  }
  const maxChromaPathMm = (lo + hi) / 2;
  const series: ThicknessSeries = {
    illuminant: w.illuminant,
    observer: w.observer,
    points,
    maxChromaPathMm,
    maxChroma: at(maxChromaPathMm).c.C,
    maxChromaAtRangeEnd: best === 0 || best === steps,
  };
  if (options.targetL !== undefined) {
    const target = options.targetL;
    const k = points.findIndex((p, i) =>
      i > 0 && (points[i - 1]!.L - target) * (p.L - target) <= 0
    );
    if (k > 0) {
      let a = points[k - 1]!.pathMm, b = points[k]!.pathMm;
      const fa = at(a).c.L - target;
      for (let it = 0; it < 60; it++) {
        const m = (a + b) / 2;
        if ((at(m).c.L - target) * fa > 0) a = m;
        else b = m;
      }
      series.targetLightnessPathMm = (a + b) / 2;
    }
  }
  return series;
}

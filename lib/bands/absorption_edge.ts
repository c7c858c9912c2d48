/**
 * The absorption edge: Tauc analysis, (α·hν)^(1/r) = B (hν − Eg) with r = 1/2 for direct
 * allowed and r = 2 for indirect allowed transitions (Tauc, Grigorovici & Vancu, Phys. Status
 * Solidi 15, 627 (1966)), with the linear region chosen automatically and reported; and the
 * Urbach tail α = α0 exp((E − E0)/Eu) (Urbach, Phys. Rev. 92, 1324 (1953)).
 *
 * @module
 */

/** Result of a straight-line region search. */
export interface LinearRegion {
  fromEv: number;
  toEv: number;
  slope: number;
  intercept: number;
  r2: number;
  points: number;
}

function lineFit(x: number[], y: number[]): { slope: number; intercept: number; r2: number } {
  const n = x.length;
  const mx = x.reduce((a, b) => a + b, 0) / n, my = y.reduce((a, b) => a + b, 0) / n;
  let sxx = 0, sxy = 0, syy = 0;
  for (let i = 0; i < n; i++) {
    sxx += (x[i]! - mx) ** 2;
    sxy += (x[i]! - mx) * (y[i]! - my);
    syy += (y[i]! - my) ** 2;
  }
  const slope = sxy / sxx;
  return { slope, intercept: my - slope * mx, r2: syy > 0 ? (sxy * sxy) / (sxx * syy) : 0 };
}

/** The steepest window (of `fraction` of the points) whose straight-line fit has R² ≥ minR2. */
function steepestLinear(
  x: number[],
  y: number[],
  fraction: number,
  minR2: number,
): LinearRegion | undefined {
  const n = x.length;
  const size = Math.max(5, Math.round(n * fraction));
  let best: LinearRegion | undefined;
  for (let i = 0; i + size <= n; i++) {
    const xs = x.slice(i, i + size), ys = y.slice(i, i + size);
    const f = lineFit(xs, ys);
    if (f.r2 < minR2 || !(f.slope > 0)) continue;
    if (!best || f.slope > best.slope) {
      best = {
        fromEv: xs[0]!,
        toEv: xs[size - 1]!,
        slope: f.slope,
        intercept: f.intercept,
        r2: f.r2,
        points: size,
      };
    }
  }
  return best;
}

/** Result of a Tauc analysis. */
export interface TaucResult {
  gapEv: number;
  exponent: "direct" | "indirect";
  region: LinearRegion;
}

/**
 * Optical gap from α(E) by the Tauc construction.
 *
 * @param energyEv Photon energies, eV (any order).
 * @param alphaPerCm Absorption coefficient at those energies.
 * @returns undefined when no straight region is found.
 */
export function taucGap(
  energyEv: ArrayLike<number>,
  alphaPerCm: ArrayLike<number>,
  exponent: "direct" | "indirect" = "direct",
  options: { windowFraction?: number; minR2?: number } = {},
): TaucResult | undefined {
  const order = Array.from({ length: energyEv.length }, (_, i) => i).sort((a, b) =>
    energyEv[a]! - energyEv[b]!
  );
  const x = order.map((i) => energyEv[i]!);
  const y = order.map((i) =>
    Math.max(0, alphaPerCm[i]! * energyEv[i]!) ** (exponent === "direct" ? 2 : 0.5)
  );
  const region = steepestLinear(x, y, options.windowFraction ?? 0.15, options.minR2 ?? 0.995);
  if (!region) return undefined;
  return { gapEv: -region.intercept / region.slope, exponent, region };
}

/** Result of an Urbach-tail fit. */
export interface UrbachResult {
  urbachEv: number;
  region: LinearRegion;
}

/**
 * Urbach energy from the exponential tail below the gap: ln α linear in E, Eu = 1/slope.
 *
 * @param belowEv Only energies below this are used (e.g. the Tauc gap).
 */
export function urbachEnergy(
  energyEv: ArrayLike<number>,
  alphaPerCm: ArrayLike<number>,
  belowEv = Infinity,
  options: { windowFraction?: number; minR2?: number } = {},
): UrbachResult | undefined {
  const idx = Array.from({ length: energyEv.length }, (_, i) => i)
    .filter((i) => energyEv[i]! < belowEv && alphaPerCm[i]! > 0)
    .sort((a, b) => energyEv[a]! - energyEv[b]!);
  const x = idx.map((i) => energyEv[i]!), y = idx.map((i) => Math.log(alphaPerCm[i]!));
  if (x.length < 5) return undefined;
  const region = steepestLinear(x, y, options.windowFraction ?? 0.3, options.minR2 ?? 0.995);
  return region ? { urbachEv: 1 / region.slope, region } : undefined;
}

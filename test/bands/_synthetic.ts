/**
 * Seeded synthetic absorbance exports for the band tests: Gaussian bands in wavenumber on a
 * baseline b0 + b1·t + s·(ν̃/20000)⁴ and an Urbach-type UV edge A₀·exp((ν̃ − ν̃₀)/w)
 * (Urbach 1953), turned into transmittance, given photometric noise of σ_T in T (so the
 * absorbance noise grows as 1/T) and written as A = −log10|T| rounded to 5 decimals, as an
 * instrument export would be: below the edge the reading sits in a noisy plateau.
 */
import { seededNormal } from "../_random.ts";

export type TrueBand = { centerCm1: number; fwhmCm1: number; height: number };

export interface SyntheticExport {
  wavelengthNm: Float64Array<ArrayBuffer>;
  absorbance: Float64Array<ArrayBuffer>;
  /** The noise-free absorbance. */
  truth: Float64Array<ArrayBuffer>;
  bands: TrueBand[];
}

const K = 4 * Math.LN2;

/** Uniform numbers in [0, 1) from a seed (mulberry32, as in ../_random.ts). */
export function seededUniform(seed: number): () => number {
  let a = (seed * 7919 + 17) >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** An export of the given bands; `edge` = [A₀ at ν̃₀, ν̃₀, w] or null for no edge. */
export function syntheticExport(
  bands: TrueBand[],
  seed: number,
  options: {
    sigmaT?: number;
    fromNm?: number;
    toNm?: number;
    stepNm?: number;
    edge?: [number, number, number] | null;
  } = {},
): SyntheticExport {
  const { sigmaT = 1e-3, fromNm = 300, toNm = 900, stepNm = 1 } = options;
  const edge = options.edge === undefined ? [1, 29000, 1200] : options.edge;
  const n = Math.round((toNm - fromNm) / stepNm) + 1;
  const wavelengthNm = Float64Array.from({ length: n }, (_, i) => fromNm + i * stepNm);
  const normal = seededNormal(seed);
  const truth = wavelengthNm.map((nm) => {
    const nu = 1e7 / nm;
    let a = 0.05 + 0.01 * (nu - 22000) / 11000 + 0.01 * (nu / 20000) ** 4;
    if (edge) a += edge[0]! * Math.exp((nu - edge[1]!) / edge[2]!);
    for (const b of bands) a += b.height * Math.exp(-K * ((nu - b.centerCm1) / b.fwhmCm1) ** 2);
    return a;
  });
  const absorbance = truth.map((a) => {
    const t = 10 ** -a + sigmaT * normal();
    return Math.round(-Math.log10(Math.abs(t) + 1e-5) * 1e5) / 1e5;
  });
  return { wavelengthNm, absorbance, truth, bands };
}

/** Three bands: an overlapping pair `gap` FWHM apart and a separated band in the red. */
export function pairAndSeparated(seed: number): TrueBand[] {
  const u = seededUniform(seed);
  const f1 = 1600 + 800 * u(), f2 = 1600 + 800 * u();
  const gap = 1.0 + 0.6 * u();
  const c1 = 17500 + 2000 * u();
  const c2 = c1 + gap * (f1 + f2) / 2;
  return [
    { centerCm1: 12800 + 600 * u(), fwhmCm1: 1400 + 400 * u(), height: 0.2 + 0.3 * u() },
    { centerCm1: c1, fwhmCm1: f1, height: 0.3 + 0.6 * u() },
    { centerCm1: c2, fwhmCm1: f2, height: 0.3 + 0.6 * u() },
  ];
}

/**
 * α(E) of an edge: above the join the Tauc form, direct allowed α = A√(E − Eg)/E or
 * indirect allowed α = A(E − Eg)²/E (Tauc, Grigorovici & Vancu 1966); below it the Urbach
 * tail α(Ej)·exp((E − Ej)/Eu) (Urbach 1953), joined where d ln α/dE = 1/Eu so that α and its
 * logarithmic slope are continuous. Returns the join energy with the function.
 */
export function edgeAlpha(
  kind: "direct" | "indirect",
  gapEv: number,
  urbachEv: number,
  amplitude: number,
): { alpha: (e: number) => number; joinEv: number } {
  const tauc = (e: number) =>
    e <= gapEv
      ? 0
      : kind === "direct"
      ? (amplitude * Math.sqrt(e - gapEv)) / e
      : (amplitude * (e - gapEv) ** 2) / e;
  const slope = (e: number) =>
    kind === "direct" ? 1 / (2 * (e - gapEv)) - 1 / e : 2 / (e - gapEv) - 1 / e;
  // d ln α/dE falls from +∞ at Eg: bisect for slope = 1/Eu
  let lo = gapEv + 1e-9, hi = gapEv + 2;
  for (let k = 0; k < 200; k++) {
    const mid = (lo + hi) / 2;
    if (slope(mid) > 1 / urbachEv) lo = mid;
    else hi = mid;
  }
  const joinEv = (lo + hi) / 2, at = tauc(joinEv);
  return {
    alpha: (e) => (e >= joinEv ? tauc(e) : at * Math.exp((e - joinEv) / urbachEv)),
    joinEv,
  };
}

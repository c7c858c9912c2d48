/**
 * Structure in a fit residual above the noise: the Wald–Wolfowitz runs test on the signs
 * (Wald & Wolfowitz, Ann. Math. Stat. 11, 147 (1940)) for the whole residual, and moving
 * sums of the normalised residual zᵢ = rᵢ/σᵢ over windows of w points, S = Σz/√w, which is
 * N(0, 1) for white noise, to say where the structure is.
 *
 * @module
 */

/** A stretch where the residual stands above the noise. */
export interface ResidualFeature {
  centerCm1: number;
  fromCm1: number;
  toCm1: number;
  /** Largest |S| in the stretch, in noise units. */
  score: number;
  /** +1 where the data lie above the model (a missing band), −1 below. */
  sign: 1 | -1;
}

/** Result of {@linkcode residualStructure}. */
export interface ResidualStructure {
  /** Runs-test z: strongly negative when residual signs come in long runs. */
  runsZ: number;
  features: ResidualFeature[];
}

/** |S| above this marks structure (our choice: a false alarm about once in 100 spectra of 900 points). */
export const STRUCTURE_THRESHOLD = 4.5;

/**
 * Residual structure of a fit.
 *
 * @param x Ascending wavenumbers, cm⁻¹.
 * @param residual Data − model.
 * @param sigma Noise σ per point (from the noise model, not from the residual).
 */
export function residualStructure(
  x: ArrayLike<number>,
  residual: ArrayLike<number>,
  sigma: ArrayLike<number>,
  windows: number[] = [5, 15, 45, 135],
): ResidualStructure {
  const n = x.length;
  let runs = 1, pos = 0, neg = 0;
  for (let i = 0; i < n; i++) {
    if (residual[i]! >= 0) pos++;
    else neg++;
    if (i > 0 && (residual[i]! >= 0) !== (residual[i - 1]! >= 0)) runs++;
  }
  const mean = (2 * pos * neg) / n + 1;
  const variance = ((mean - 1) * (mean - 2)) / (n - 1);
  const runsZ = variance > 0 ? (runs - mean) / Math.sqrt(variance) : 0;
  const z = Float64Array.from({ length: n }, (_, i) => residual[i]! / sigma[i]!);
  const prefix = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) prefix[i + 1] = prefix[i]! + z[i]!;
  const score = new Float64Array(n);
  const widest = new Int32Array(n);
  for (const w of windows) {
    if (w > n) continue;
    const h = Math.floor(w / 2);
    for (let i = h; i < n - (w - 1 - h); i++) {
      const s = (prefix[i - h + w]! - prefix[i - h]!) / Math.sqrt(w);
      if (Math.abs(s) > Math.abs(score[i]!)) {
        score[i] = s;
        widest[i] = w;
      }
    }
  }
  const features: ResidualFeature[] = [];
  for (let i = 0; i < n;) {
    if (!(Math.abs(score[i]!) > STRUCTURE_THRESHOLD)) {
      i++;
      continue;
    }
    const sign = score[i]! > 0 ? 1 : -1;
    let j = i, best = i;
    while (
      j + 1 < n && Math.abs(score[j + 1]!) > STRUCTURE_THRESHOLD &&
      Math.sign(score[j + 1]!) === sign
    ) {
      j++;
      if (Math.abs(score[j]!) > Math.abs(score[best]!)) best = j;
    }
    const h = Math.floor(widest[best]! / 2);
    const lo = Math.max(0, i - h), hi = Math.min(n - 1, j + h);
    features.push({
      centerCm1: x[best]!,
      fromCm1: x[lo]!,
      toCm1: x[hi]!,
      score: Math.abs(score[best]!),
      sign,
    });
    i = j + 1;
  }
  features.sort((a, b) => b.score - a.score);
  return { runsZ, features };
}

/**
 * Savitzky–Golay smoothing and derivatives on a uniform grid (Savitzky & Golay, Anal. Chem.
 * 36, 1627 (1964)): least-squares polynomial of a given order over a moving window; the
 * convolution weights are computed here from the normal equations. Used for band detection
 * only, never for fitting.
 *
 * @module
 */

/** Convolution weights for the `derivative`-th derivative (per unit grid step). */
export function savitzkyGolayWeights(
  halfWidth: number,
  order: number,
  derivative = 0,
): Float64Array {
  return cachedWeights(halfWidth, order, derivative).slice();
}

function computeWeights(
  halfWidth: number,
  order: number,
  derivative = 0,
): Float64Array {
  const m = order + 1;
  const size = 2 * halfWidth + 1;
  // A^T A for the Vandermonde matrix over offsets −h…h
  const ata = Array.from({ length: m }, (_, i) =>
    Array.from({ length: m }, (_, j) => {
      let s = 0;
      for (let k = -halfWidth; k <= halfWidth; k++) s += k ** (i + j);
      return s;
    }));
  // invert A^T A (small, symmetric positive definite) by Gauss–Jordan
  const inv = ata.map((
    row,
    i,
  ) => [...row, ...Array.from({ length: m }, (_, j) => (i === j ? 1 : 0))]);
  for (let c = 0; c < m; c++) {
    let p = c;
    for (let r = c + 1; r < m; r++) if (Math.abs(inv[r]![c]!) > Math.abs(inv[p]![c]!)) p = r;
    [inv[c], inv[p]] = [inv[p]!, inv[c]!];
    const d = inv[c]![c]!;
    for (let j = 0; j < 2 * m; j++) inv[c]![j]! /= d;
    for (let r = 0; r < m; r++) {
      if (r === c) continue;
      const f = inv[r]![c]!;
      for (let j = 0; j < 2 * m; j++) inv[r]![j]! -= f * inv[c]![j]!;
    }
  }
  let factorial = 1;
  for (let k = 2; k <= derivative; k++) factorial *= k;
  const w = new Float64Array(size);
  for (let k = -halfWidth; k <= halfWidth; k++) {
    let s = 0;
    for (let j = 0; j < m; j++) s += inv[derivative]![m + j]! * k ** j;
    w[k + halfWidth] = s * factorial;
  }
  return w;
}

/** Weights already worked out, by half-width, order and derivative (a few per run). */
const WEIGHTS = new Map<string, Float64Array>();

function cachedWeights(halfWidth: number, order: number, derivative: number): Float64Array {
  const key = `${halfWidth}/${order}/${derivative}`;
  let w = WEIGHTS.get(key);
  if (!w) {
    if (WEIGHTS.size >= 64) WEIGHTS.clear();
    w = computeWeights(halfWidth, order, derivative);
    WEIGHTS.set(key, w);
  }
  return w;
}

/** Applies SG weights to uniformly spaced values (edges use the nearest full window). */
export function savitzkyGolay(
  values: ArrayLike<number>,
  halfWidth: number,
  order: number,
  derivative = 0,
  step = 1,
): Float64Array {
  const n = values.length;
  const w = cachedWeights(halfWidth, order, derivative);
  const out = new Float64Array(n);
  const scale = step ** derivative;
  for (let i = 0; i < n; i++) {
    const c = Math.min(Math.max(i, halfWidth), n - 1 - halfWidth);
    let s = 0;
    for (let k = -halfWidth; k <= halfWidth; k++) s += w[k + halfWidth]! * values[c + k]!;
    out[i] = s / scale;
  }
  return out;
}

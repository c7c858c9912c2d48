/**
 * Bounded Levenberg–Marquardt least squares (Levenberg 1944; Marquardt, J. SIAM 11, 431
 * (1963); Marquardt's diagonal scaling, steps projected onto box bounds). Parameter standard
 * errors come from the covariance s²·(JᵀJ)⁻¹ at the optimum, s² = RSS/(n − p).
 * The inner loop works in preallocated arrays.
 *
 * @module
 */

/** Fills `out` with the model at `params` and, when given, the row-major n×p Jacobian. */
export type ModelFunction = (params: Float64Array, out: Float64Array, jac?: Float64Array) => void;

/** Options of {@linkcode levenbergMarquardt}. */
export interface LmOptions {
  lower?: Float64Array;
  upper?: Float64Array;
  maxIterations?: number;
  /** Stop when the relative RSS decrease falls below this. */
  tolerance?: number;
  /** Weights 1/σᵢ² per point (default all 1). */
  weights?: Float64Array;
}

/** Result of a fit. */
export interface LmResult {
  params: Float64Array;
  /** Standard errors of the parameters (NaN when the covariance is singular). */
  sigmas: Float64Array;
  covariance: Float64Array;
  rss: number;
  /** Residual standard deviation √(RSS/(n − p)). */
  residualSigma: number;
  iterations: number;
  converged: boolean;
}

/** Cholesky solve of the symmetric positive-definite system A x = b (p×p, in place on copies). */
function choleskySolve(
  a: Float64Array,
  b: Float64Array,
  p: number,
  l: Float64Array,
  x: Float64Array,
): boolean {
  for (let i = 0; i < p; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i * p + j]!;
      for (let k = 0; k < j; k++) s -= l[i * p + k]! * l[j * p + k]!;
      if (i === j) {
        if (!(s > 0)) return false;
        l[i * p + i] = Math.sqrt(s);
      } else {
        l[i * p + j] = s / l[j * p + j]!;
      }
    }
  }
  for (let i = 0; i < p; i++) {
    let s = b[i]!;
    for (let k = 0; k < i; k++) s -= l[i * p + k]! * x[k]!;
    x[i] = s / l[i * p + i]!;
  }
  for (let i = p - 1; i >= 0; i--) {
    let s = x[i]!;
    for (let k = i + 1; k < p; k++) s -= l[k * p + i]! * x[k]!;
    x[i] = s / l[i * p + i]!;
  }
  return true;
}

/** Inverse of a symmetric positive-definite matrix via Cholesky (NaN-filled when singular). */
export function invertSpd(a: Float64Array, p: number): Float64Array {
  const inv = new Float64Array(p * p);
  const l = new Float64Array(p * p), e = new Float64Array(p), x = new Float64Array(p);
  for (let c = 0; c < p; c++) {
    e.fill(0);
    e[c] = 1;
    if (!choleskySolve(a, e, p, l, x)) return inv.fill(NaN);
    for (let r = 0; r < p; r++) inv[r * p + c] = x[r]!;
  }
  return inv;
}

/**
 * Minimises Σ wᵢ (yᵢ − model(params)ᵢ)².
 *
 * @param y Data, length n.
 * @param model Model and Jacobian evaluator.
 * @param start Initial parameters, length p (not modified).
 */
export function levenbergMarquardt(
  y: Float64Array,
  model: ModelFunction,
  start: Float64Array,
  options: LmOptions = {},
): LmResult {
  const n = y.length, p = start.length;
  const { maxIterations = 200, tolerance = 1e-10 } = options;
  const lower = options.lower, upper = options.upper, w = options.weights;
  const params = start.slice(), trial = new Float64Array(p);
  const f = new Float64Array(n), ft = new Float64Array(n), jac = new Float64Array(n * p);
  const jtj = new Float64Array(p * p), jtr = new Float64Array(p), a = new Float64Array(p * p);
  const l = new Float64Array(p * p), step = new Float64Array(p);
  const clamp = (v: Float64Array) => {
    for (let k = 0; k < p; k++) {
      if (lower && v[k]! < lower[k]!) v[k] = lower[k]!;
      if (upper && v[k]! > upper[k]!) v[k] = upper[k]!;
    }
  };
  clamp(params);
  const rssOf = (m: Float64Array) => {
    let s = 0;
    for (let i = 0; i < n; i++) {
      const r = y[i]! - m[i]!;
      s += (w ? w[i]! : 1) * r * r;
    }
    return s;
  };
  const normal = () => {
    jtj.fill(0);
    jtr.fill(0);
    for (let i = 0; i < n; i++) {
      const wi = w ? w[i]! : 1, r = y[i]! - f[i]!, row = i * p;
      for (let j = 0; j < p; j++) {
        const jj = jac[row + j]! * wi;
        jtr[j] = jtr[j]! + jj * r;
        for (let k = 0; k <= j; k++) jtj[j * p + k] = jtj[j * p + k]! + jj * jac[row + k]!;
      }
    }
    for (let j = 0; j < p; j++) for (let k = 0; k < j; k++) jtj[k * p + j] = jtj[j * p + k]!;
  };
  model(params, f, jac);
  let rss = rssOf(f);
  let lambda = 1e-3;
  let iterations = 0, converged = false;
  normal();
  while (iterations < maxIterations) {
    iterations++;
    let improved = false;
    for (let attempt = 0; attempt < 30; attempt++) {
      for (let k = 0; k < p * p; k++) a[k] = jtj[k]!;
      for (let j = 0; j < p; j++) a[j * p + j] = jtj[j * p + j]! * (1 + lambda) + 1e-300;
      if (!choleskySolve(a, jtr, p, l, step)) {
        lambda *= 10;
        continue;
      }
      for (let k = 0; k < p; k++) trial[k] = params[k]! + step[k]!;
      clamp(trial);
      model(trial, ft, undefined);
      const rssTrial = rssOf(ft);
      if (rssTrial < rss) {
        const relative = (rss - rssTrial) / Math.max(rss, 1e-300);
        params.set(trial);
        rss = rssTrial;
        lambda = Math.max(lambda / 10, 1e-12);
        improved = true;
        if (relative < tolerance) converged = true;
        break;
      }
      lambda *= 10;
      if (lambda > 1e12) break;
    }
    model(params, f, jac);
    normal();
    if (!improved) {
      converged = true;
      break;
    }
    if (converged) break;
  }
  const dof = Math.max(1, n - p);
  const s2 = rss / dof;
  // Parameters held at a bound (or with no influence) are left out of the covariance; their
  // σ is NaN ("not determined"), the others come from the inverse of the free block.
  const free: number[] = [];
  for (let k = 0; k < p; k++) {
    const near = (bound: number | undefined) =>
      bound !== undefined && Number.isFinite(bound) &&
      Math.abs(params[k]! - bound) <= 1e-12 * Math.max(1, Math.abs(bound));
    const atLower = near(lower?.[k]), atUpper = near(upper?.[k]);
    if (!atLower && !atUpper && jtj[k * p + k]! > 0) free.push(k);
  }
  const m = free.length;
  const block = new Float64Array(m * m);
  free.forEach((r, i) => free.forEach((c, j) => (block[i * m + j] = jtj[r * p + c]!)));
  const inverse = invertSpd(block, m);
  const covariance = new Float64Array(p * p).fill(NaN);
  free.forEach((r, i) =>
    free.forEach((c, j) => (covariance[r * p + c] = inverse[i * m + j]! * s2))
  );
  const sigmas = Float64Array.from({ length: p }, (_, k) => Math.sqrt(covariance[k * p + k]!));
  return { params, sigmas, covariance, rss, residualSigma: Math.sqrt(s2), iterations, converged };
}

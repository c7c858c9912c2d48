/**
 * Separable nonlinear least squares by variable projection (Golub & Pereyra, SIAM J. Numer.
 * Anal. 10, 413 (1973)): for a model y ≈ Σⱼ cⱼ φⱼ(x; θ) the linear coefficients c are solved
 * exactly (weighted QR) for every θ, and only θ is iterated, by Levenberg–Marquardt on the
 * projected residual with the Golub–Pereyra Jacobian (both terms, not Kaufman's shortcut).
 * Standard errors come from the covariance s²·(JᵀWJ)⁻¹ of the full, unseparated model at the
 * optimum, s² = RSS/(n − p); parameters held at a bound are left out of it and reported as held.
 *
 * @module
 */
import { invertSpd } from "./levenberg_marquardt.ts";

/**
 * A separable model. Each nonlinear parameter θₖ acts on one basis column `columnOf[k]` (as
 * a band's centre and width act on that band only), which keeps the Jacobian cheap.
 */
export interface SeparableModel {
  /** Number of linear coefficients m (basis columns). */
  linearCount: number;
  /** Basis column each nonlinear parameter acts on (length q). */
  columnOf: ArrayLike<number>;
  /**
   * Fills `phi` (column-major n×m: phi[j·n + i] = φⱼ(xᵢ; θ)) and, when given, `dphi`
   * (column-major n×q: dphi[k·n + i] = ∂φ_columnOf[k](xᵢ; θ)/∂θₖ).
   */
  basis: (theta: Float64Array, phi: Float64Array, dphi?: Float64Array) => void;
  /**
   * Optional second derivatives, for exact-Hessian Newton steps near the optimum: fills
   * `d2phi` (n per pair) with ∂²φⱼ/∂θₖ∂θₗ for every pair k ≤ l acting on the same column j,
   * pairs ordered by k, then l; `phi` holds the basis at theta (as `basis` filled it).
   */
  curvature?: (theta: Float64Array, phi: Float64Array, d2phi: Float64Array) => void;
}

/** Options of {@linkcode variableProjection}. */
export interface VarProOptions {
  lower?: ArrayLike<number>;
  upper?: ArrayLike<number>;
  /** Weights 1/σᵢ² (default all 1). */
  weights?: ArrayLike<number>;
  /** @default 200 */
  maxIterations?: number;
  /** Stop when the relative RSS decrease of an accepted step falls below this. @default 1e-10 */
  tolerance?: number;
}

/** Result of {@linkcode variableProjection}. */
export interface VarProResult {
  /** Nonlinear parameters θ at the optimum. */
  nonlinear: Float64Array;
  /** Linear coefficients c at the optimum. */
  linear: Float64Array;
  /** Covariance of [θ, c] (row-major (q+m)²); rows/columns of held parameters are 0. */
  covariance: Float64Array;
  /** Standard errors of [θ, c]; null for held parameters or an undetermined covariance. */
  sigmas: (number | null)[];
  /** True for each nonlinear parameter that ended at a bound (held, out of the covariance). */
  held: boolean[];
  /** Weighted residual sum of squares. */
  rss: number;
  /** The model at the optimum (unweighted), length n. */
  model: Float64Array;
  iterations: number;
  converged: boolean;
}

/** Newton steps take over once an LM step lowers the RSS by less than this fraction (our choice). */
const NEWTON_BELOW = 1e-3;
/** What a Newton step gives instead of an RSS: the Hessian is not positive definite. */
const NOT_DEFINITE = -1;
/** What a Newton step gives instead of an RSS: the decrement says θ is the optimum. */
const AT_OPTIMUM = -2;

/**
 * out[k] = Σᵢ cols[k·n + i]·v[vo + i] for k < count: four columns a pass, each with its own sum,
 * so the additions of one pass do not wait on each other.
 */
function dots(
  cols: Float64Array,
  n: number,
  count: number,
  v: Float64Array,
  vo: number,
  out: Float64Array,
): void {
  let k = 0;
  for (; k + 3 < count; k += 4) {
    const o0 = k * n, o1 = o0 + n, o2 = o1 + n, o3 = o2 + n;
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
    for (let i = 0; i < n; i++) {
      const x = v[vo + i]!;
      s0 += cols[o0 + i]! * x;
      s1 += cols[o1 + i]! * x;
      s2 += cols[o2 + i]! * x;
      s3 += cols[o3 + i]! * x;
    }
    out[k] = s0;
    out[k + 1] = s1;
    out[k + 2] = s2;
    out[k + 3] = s3;
  }
  for (; k < count; k++) {
    const o = k * n;
    let s0 = 0, s1 = 0;
    let i = 0;
    for (; i + 1 < n; i += 2) {
      s0 += cols[o + i]! * v[vo + i]!;
      s1 += cols[o + i + 1]! * v[vo + i + 1]!;
    }
    if (i < n) s0 += cols[o + i]! * v[vo + i]!;
    out[k] = s0 + s1;
  }
}

/** v[vo + i] −= Σₖ s[k]·cols[k·n + i] for k < count (four columns a pass). */
function subtractColumns(
  cols: Float64Array,
  n: number,
  count: number,
  s: Float64Array,
  v: Float64Array,
  vo: number,
): void {
  let k = 0;
  for (; k + 3 < count; k += 4) {
    const o0 = k * n, o1 = o0 + n, o2 = o1 + n, o3 = o2 + n;
    const s0 = s[k]!, s1 = s[k + 1]!, s2 = s[k + 2]!, s3 = s[k + 3]!;
    for (let i = 0; i < n; i++) {
      v[vo + i] = v[vo + i]! -
        (s0 * cols[o0 + i]! + s1 * cols[o1 + i]! + s2 * cols[o2 + i]! + s3 * cols[o3 + i]!);
    }
  }
  for (; k < count; k++) {
    const o = k * n, sk = s[k]!;
    for (let i = 0; i < n; i++) v[vo + i] = v[vo + i]! - sk * cols[o + i]!;
  }
}

/**
 * The n-long buffers of a fit, kept between fits of the same size: a batch fits thousands of
 * spectra of one grid, and fresh buffers for each would leave their memory to the collector
 * (typed-array stores live outside the JS heap, where V8 lets tens of MB pile up per worker).
 * Fits run one at a time in a thread, so one set per size is enough.
 */
class Workspace {
  readonly sw: Float64Array;
  readonly b: Float64Array;
  readonly phi: Float64Array;
  readonly dphi: Float64Array;
  readonly a: Float64Array;
  readonly jac: Float64Array;
  readonly solvers: [LinearSolve, LinearSolve];
  #curvature = new Float64Array(0);
  #columns = new Float64Array(0);
  constructor(n: number, m: number, q: number) {
    this.sw = new Float64Array(n);
    this.b = new Float64Array(n);
    this.phi = new Float64Array(n * m);
    this.dphi = new Float64Array(n * q);
    this.a = new Float64Array(n * m);
    this.jac = new Float64Array(n * q);
    this.solvers = [new LinearSolve(n, m), new LinearSolve(n, m)];
  }
  /** A zeroed buffer for the second derivatives, of this length. */
  curvature(length: number): Float64Array {
    if (this.#curvature.length !== length) this.#curvature = new Float64Array(length);
    else this.#curvature.fill(0);
    return this.#curvature;
  }
  /** A buffer for columns of the model (the Newton system, the covariance), at least this long. */
  columns(length: number): Float64Array {
    if (this.#columns.length < length) this.#columns = new Float64Array(length);
    return this.#columns;
  }
}

/** Workspaces by size (a few sizes per run: the number of bands and terms varies). */
const WORKSPACES = new Map<string, Workspace>();

function workspaceFor(n: number, m: number, q: number): Workspace {
  const key = `${n}/${m}/${q}`;
  let w = WORKSPACES.get(key);
  if (!w) {
    if (WORKSPACES.size >= 32) WORKSPACES.clear();
    w = new Workspace(n, m, q);
    WORKSPACES.set(key, w);
  }
  return w;
}

/** Linear least squares for fixed θ by Gram–Schmidt QR with selective reorthogonalisation. */
class LinearSolve {
  readonly q: Float64Array;
  readonly r: Float64Array;
  readonly c: Float64Array;
  readonly res: Float64Array;
  readonly qtb: Float64Array;
  readonly ok: Uint8Array;
  private readonly sums: Float64Array;
  constructor(readonly n: number, readonly m: number) {
    this.q = new Float64Array(n * m);
    this.r = new Float64Array(m * m);
    this.c = new Float64Array(m);
    this.res = new Float64Array(n);
    this.qtb = new Float64Array(m);
    this.ok = new Uint8Array(m);
    this.sums = new Float64Array(m);
  }
  /** Factorises A (column-major, weighted) and solves for b; columns that add nothing get c = 0. */
  solve(a: Float64Array, b: Float64Array): void {
    const { n, m, q, r, c, res, qtb, ok, sums } = this;
    r.fill(0);
    for (let j = 0; j < m; j++) {
      let norm0 = 0;
      for (let i = 0; i < n; i++) {
        const v = a[j * n + i]!;
        q[j * n + i] = v;
        norm0 += v * v;
      }
      // classical Gram–Schmidt, with a second pass only where the first cancelled much of the
      // column ("twice is enough": Daniel, Gragg, Kaufman & Stewart, Math. Comp. 30, 772
      // (1976); Parlett, The Symmetric Eigenvalue Problem, 1980, §6-9, Kahan's factor 1/√2).
      // Dropped columns are zero in q and contribute nothing.
      let norm = norm0;
      for (let pass = 0; pass < 2 && j > 0; pass++) {
        if (pass === 1 && !(norm < 0.5 * norm0)) break;
        dots(q, n, j, q, j * n, sums);
        for (let k = 0; k < j; k++) r[k * m + j] = r[k * m + j]! + sums[k]!;
        subtractColumns(q, n, j, sums, q, j * n);
        norm = 0;
        for (let i = 0; i < n; i++) norm += q[j * n + i]! ** 2;
      }
      // a column (nearly) inside the span of the others carries no information of its own
      if (!(norm > 1e-24 * Math.max(norm0, 1e-300))) {
        ok[j] = 0;
        for (let i = 0; i < n; i++) q[j * n + i] = 0;
        continue;
      }
      ok[j] = 1;
      const d = Math.sqrt(norm);
      r[j * m + j] = d;
      for (let i = 0; i < n; i++) q[j * n + i] = q[j * n + i]! / d;
    }
    res.set(b.subarray(0, n));
    dots(q, n, m, b, 0, qtb);
    subtractColumns(q, n, m, qtb, res, 0);
    for (let j = m - 1; j >= 0; j--) {
      if (!ok[j]) {
        c[j] = 0;
        continue;
      }
      let s = qtb[j]!;
      for (let k = j + 1; k < m; k++) if (ok[k]) s -= r[j * m + k]! * c[k]!;
      c[j] = s / r[j * m + j]!;
    }
  }
  /** z = R⁻ᵀ eⱼ (zero for dropped columns). */
  rInvTransposeUnit(j: number, z: Float64Array): void {
    const { m, r, ok } = this;
    z.fill(0);
    if (!ok[j]) return;
    for (let i = 0; i < m; i++) {
      if (!ok[i]) continue;
      let s = i === j ? 1 : 0;
      for (let k = 0; k < i; k++) if (ok[k]) s -= r[k * m + i]! * z[k]!;
      z[i] = s / r[i * m + i]!;
    }
  }
}

/** Solves the p×p system (A + λ·diag A) x = b by Cholesky; false when not positive definite. */
function dampedSolve(
  a: Float64Array,
  b: Float64Array,
  p: number,
  lambda: number,
  l: Float64Array,
  x: Float64Array,
): boolean {
  for (let i = 0; i < p; i++) {
    for (let j = 0; j <= i; j++) {
      let s = a[i * p + j]!;
      if (i === j) s = s * (1 + lambda) + 1e-300;
      for (let k = 0; k < j; k++) s -= l[i * p + k]! * l[j * p + k]!;
      if (i === j) {
        if (!(s > 0)) return false;
        l[i * p + i] = Math.sqrt(s);
      } else l[i * p + j] = s / l[j * p + j]!;
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

/**
 * Minimises Σ wᵢ (yᵢ − Σⱼ cⱼ φⱼ(xᵢ; θ))² over θ (box-bounded) and c (free).
 *
 * @param y Data, length n.
 * @param model The separable model.
 * @param start Starting θ, length q (not modified).
 * @returns The optimum, its covariance and which parameters were held at a bound.
 * @throws {RangeError} When there are not more points than parameters.
 * @example Misra1a-type model y = b₁(1 − e^(−b₂x)), b₁ linear
 * ```ts
 * import { variableProjection } from "./variable_projection.ts";
 * const x = [1, 2, 3, 4, 5, 6];
 * const y = Float64Array.from(x, (v) => 3 * (1 - Math.exp(-0.4 * v)));
 * const fit = variableProjection(y, {
 *   linearCount: 1,
 *   columnOf: [0],
 *   basis: (t, phi, dphi) => x.forEach((v, i) => {
 *     phi[i] = 1 - Math.exp(-t[0]! * v);
 *     if (dphi) dphi[i] = v * Math.exp(-t[0]! * v);
 *   }),
 * }, Float64Array.of(1));
 * if (Math.abs(fit.nonlinear[0]! - 0.4) > 1e-8) throw new Error("b2");
 * ```
 */
export function variableProjection(
  y: ArrayLike<number>,
  model: SeparableModel,
  start: ArrayLike<number>,
  options: VarProOptions = {},
): VarProResult {
  const n = y.length, m = model.linearCount, q = start.length;
  const p = q + m;
  if (n <= p) {
    throw new RangeError(`Cannot fit ${p} parameters to ${n} points: need more points`);
  }
  const { maxIterations = 200, tolerance = 1e-10, lower, upper } = options;
  const work = workspaceFor(n, m, q);
  const { sw, b, phi, dphi, a, jac } = work;
  for (let i = 0; i < n; i++) sw[i] = Math.sqrt(options.weights ? options.weights[i]! : 1);
  for (let i = 0; i < n; i++) b[i] = sw[i]! * y[i]!;
  const col = Int32Array.from({ length: q }, (_, k) => model.columnOf[k]!);
  // a model's basis may rely on entries it does not write being zero
  phi.fill(0);
  dphi.fill(0);
  const jtj = new Float64Array(q * q), jtr = new Float64Array(q);
  const sys = new Float64Array(q * q), rhs = new Float64Array(q);
  const l = new Float64Array(q * q), step = new Float64Array(q);
  const z = new Float64Array(m), qtd = new Float64Array(q * m), zs = new Float64Array(q * m);
  const dotR = new Float64Array(q), gram = new Float64Array(q);
  const theta = Float64Array.from(start), trial = new Float64Array(q);
  const solver = work.solvers[0], trialSolver = work.solvers[1];
  const clamp = (v: Float64Array) => {
    for (let k = 0; k < q; k++) {
      if (lower && v[k]! < lower[k]!) v[k] = lower[k]!;
      if (upper && v[k]! > upper[k]!) v[k] = upper[k]!;
    }
  };
  const project = (t: Float64Array, s: LinearSolve, withDerivatives: boolean): number => {
    model.basis(t, phi, withDerivatives ? dphi : undefined);
    for (let j = 0; j < m; j++) {
      for (let i = 0; i < n; i++) a[j * n + i] = sw[i]! * phi[j * n + i]!;
    }
    s.solve(a, b);
    let rss = 0;
    for (let i = 0; i < n; i++) rss += s.res[i]! ** 2;
    return rss;
  };
  /**
   * JᵀJ and Jᵀr of the Golub–Pereyra Jacobian of the projected residual,
   * Jₖ = −[cⱼ P⊥ dₖ + Q R⁻ᵀ eⱼ (dₖ·r)], j = columnOf[k], formed without J itself: Qᵀr = 0 and
   * P⊥Q = 0 leave JₖᵀJₗ = cⱼcₗ (dₖ·dₗ − (Qᵀdₖ)·(Qᵀdₗ)) + (dₖ·r)(dₗ·r) (R⁻ᵀeⱼ)·(R⁻ᵀeₗ)
   * and Jₖᵀr = −cⱼ dₖ·r (Golub & Pereyra 1973, eq. 5.4; the same algebra as Kaufman, BIT 15,
   * 49 (1975), with the second term kept).
   */
  const jacobian = (s: LinearSolve) => {
    for (let k = 0; k < q; k++) {
      const j = col[k]!;
      let dr = 0;
      for (let i = 0; i < n; i++) {
        const d = sw[i]! * dphi[k * n + i]!;
        jac[k * n + i] = d;
        dr += d * s.res[i]!;
      }
      dotR[k] = dr;
      jtr[k] = s.c[j]! * dr;
      dots(s.q, n, m, jac, k * n, z);
      qtd.set(z, k * m);
      s.rInvTransposeUnit(j, z);
      zs.set(z, k * m);
    }
    for (let k = 0; k < q; k++) {
      const ck = s.c[col[k]!]!;
      dots(jac, n, k + 1, jac, k * n, gram);
      for (let kk = 0; kk <= k; kk++) {
        const ckk = s.c[col[kk]!]!;
        const dd = gram[kk]!;
        let qq = 0, zz = 0;
        for (let jj = 0; jj < m; jj++) {
          qq += qtd[k * m + jj]! * qtd[kk * m + jj]!;
          zz += zs[k * m + jj]! * zs[kk * m + jj]!;
        }
        let t = ck * ckk * (dd - qq) + dotR[k]! * dotR[kk]! * zz;
        // ‖P⊥dₖ‖² by difference can round below zero where dₖ lies almost inside span(A)
        if (kk === k && t < 0) t = 0;
        jtj[k * q + kk] = t;
        jtj[kk * q + k] = t;
      }
    }
  };
  clamp(theta);
  let rss = project(theta, solver, true);
  let current = solver, spare = trialSolver;
  jacobian(current);
  // damping update by the gain ratio ρ = actual/predicted decrease (Nielsen's rule, as in
  // Madsen, Nielsen & Tingleff, Methods for Non-Linear Least Squares Problems, 2004, §3.2),
  // which stops the undamped zig-zag of a line only a grid step or two wide
  let lambda = 1e-3, nu = 2, iterations = 0, converged = false;
  const atBound = (k: number, v: number, dir: number) =>
    (dir < 0 && lower !== undefined && v <= lower[k]!) ||
    (dir > 0 && upper !== undefined && v >= upper[k]!);
  // Near the optimum, Newton steps with the exact Hessian of the unseparated problem: its
  // θ-part is Newton's step for the projected functional (the Schur complement of the c-block
  // is the reduced Hessian where c is optimal), so convergence is quadratic even where a large
  // residual leaves Gauss–Newton and Levenberg–Marquardt linear (Dennis & Schnabel, Numerical
  // Methods for Unconstrained Optimization, 1983, §10.1). A step that fails hands back to LM.
  const pairs: [number, number][] = [];
  for (let k = 0; k < q; k++) {
    for (let kk = k; kk < q; kk++) if (col[k] === col[kk]) pairs.push([k, kk]);
  }
  const d2phi = model.curvature ? work.curvature(n * pairs.length) : undefined;
  const size = q + m;
  const hess = new Float64Array(size * size), grad = new Float64Array(size);
  const hl = new Float64Array(size * size), delta = new Float64Array(size);
  const freeIdx = new Int32Array(size);
  const mcols = d2phi ? work.columns(size * n) : new Float64Array(0),
    row = new Float64Array(size);
  let newton = false, newtonBelow = NEWTON_BELOW;
  /** Whether phi, dphi and a hold the basis at θ (a rejected trial overwrites them). */
  let basisAtTheta = true;
  /**
   * One Newton step from θ (phi, a, jac and the solver state at θ): the RSS its trial reaches
   * (the trial then in `trial` and `spare`), NOT_DEFINITE when the Hessian is not positive
   * definite (no trial made), or AT_OPTIMUM when the Newton decrement is below the tolerance.
   * As in the LM steps, a parameter at a bound is held only while the gradient pushes it out.
   */
  const newtonStep = (s: LinearSolve): number => {
    model.curvature!(theta, phi, d2phi!);
    let f = 0;
    for (let k = 0; k < q; k++) if (!atBound(k, theta[k]!, jtr[k]!)) freeIdx[f++] = k;
    for (let j = 0; j < m; j++) if (s.ok[j]) freeIdx[f++] = q + j;
    const res = s.res, cs = s.c;
    // the columns of M (weighted ∂model/∂p): cⱼ·dₖ for θₖ, aⱼ for cⱼ
    for (let u = 0; u < f; u++) {
      const k = freeIdx[u]!;
      if (k < q) {
        const ck = cs[col[k]!]!;
        for (let i = 0; i < n; i++) mcols[u * n + i] = ck * jac[k * n + i]!;
      } else mcols.set(a.subarray((k - q) * n, (k - q + 1) * n), u * n);
    }
    dots(mcols, n, f, res, 0, grad);
    for (let u = 0; u < f; u++) {
      dots(mcols, n, u + 1, mcols, u * n, row);
      for (let v = 0; v <= u; v++) hess[u * f + v] = hess[v * f + u] = row[v]!;
    }
    // minus Σ rᵢ ∇²mᵢ: within a column's nonlinear parameters, and between θₖ and its cⱼ
    for (let u = 0; u < f; u++) {
      const ku = freeIdx[u]!;
      if (ku >= q) continue;
      for (let v = 0; v < f; v++) {
        const kv = freeIdx[v]!;
        if (kv >= q) {
          if (kv - q === col[ku]!) {
            hess[u * f + v] = hess[u * f + v]! - dotR[ku]!;
            hess[v * f + u] = hess[u * f + v]!;
          }
          continue;
        }
        if (kv < ku || col[kv] !== col[ku]) continue;
        const pi = pairs.findIndex(([k1, k2]) => k1 === ku && k2 === kv);
        let t = 0;
        for (let i = 0; i < n; i++) t += res[i]! * sw[i]! * d2phi![pi * n + i]!;
        hess[u * f + v] = hess[u * f + v]! - cs[col[ku]!]! * t;
        if (v !== u) hess[v * f + u] = hess[u * f + v]!;
      }
    }
    if (!dampedSolve(hess, grad, f, 0, hl, delta)) return NOT_DEFINITE;
    // the Newton decrement gᵀH⁻¹g is the decrease of the RSS the step predicts (Boyd &
    // Vandenberghe, Convex Optimization, 2004, §9.5.1): below the tolerance θ is the optimum
    let decrement = 0;
    for (let u = 0; u < f; u++) decrement += grad[u]! * delta[u]!;
    if (decrement >= 0 && decrement < tolerance * rss) return AT_OPTIMUM;
    trial.set(theta);
    for (let u = 0; u < f; u++) {
      if (freeIdx[u]! < q) trial[freeIdx[u]!] = theta[freeIdx[u]!]! + delta[u]!;
    }
    clamp(trial);
    return project(trial, spare, true);
  };
  while (iterations < maxIterations && q > 0) {
    iterations++;
    let improved = false, relative = Infinity, stepSmall = false, solved = false;
    if (newton) {
      const rssTrial = newtonStep(current);
      if (rssTrial === AT_OPTIMUM) {
        converged = true;
        break;
      }
      if (rssTrial === NOT_DEFINITE) newtonBelow /= 10; // not near enough yet
      else basisAtTheta = false; // the trial overwrote the basis
      if (rssTrial >= 0 && rssTrial < rss) {
        basisAtTheta = true;
        relative = (rss - rssTrial) / Math.max(rss, 1e-300);
        theta.set(trial);
        rss = rssTrial;
        [current, spare] = [spare, current];
        jacobian(current);
        if (relative < tolerance) {
          converged = true;
          break;
        }
        continue;
      }
      newton = false;
      // the failed trial overwrote the basis: LM below starts from θ's JᵀJ, which is kept
    }
    for (let attempt = 0; attempt < 40; attempt++) {
      // parameters at a bound that the gradient pushes outward are frozen for this step
      sys.set(jtj);
      rhs.set(jtr);
      for (let k = 0; k < q; k++) {
        if (atBound(k, theta[k]!, jtr[k]!)) {
          for (let kk = 0; kk < q; kk++) sys[k * q + kk] = sys[kk * q + k] = 0;
          sys[k * q + k] = 1;
          rhs[k] = 0;
        }
      }
      if (!dampedSolve(sys, rhs, q, lambda, l, step)) {
        lambda *= nu;
        nu *= 2;
        continue;
      }
      solved = true;
      let predicted = 0;
      stepSmall = true;
      for (let k = 0; k < q; k++) {
        trial[k] = theta[k]! + step[k]!;
        predicted += step[k]! * (rhs[k]! + lambda * sys[k * q + k]! * step[k]!);
        if (Math.abs(step[k]!) > 1e-9 * (Math.abs(theta[k]!) + 1e-9)) stepSmall = false;
      }
      clamp(trial);
      const rssTrial = project(trial, spare, true);
      basisAtTheta = rssTrial < rss;
      if (rssTrial < rss) {
        relative = (rss - rssTrial) / Math.max(rss, 1e-300);
        const rho = predicted > 0 ? (rss - rssTrial) / predicted : 1;
        theta.set(trial);
        rss = rssTrial;
        [current, spare] = [spare, current];
        lambda = Math.max(lambda * Math.max(1 / 3, 1 - (2 * rho - 1) ** 3), 1e-12);
        nu = 2;
        improved = true;
        break;
      }
      lambda *= nu;
      nu *= 2;
      if (lambda > 1e14 || stepSmall) break;
    }
    if (!improved) {
      // no step lowers the RSS at any damping: a (local) optimum (unless no damped system
      // could even be solved, which says nothing about the point)
      converged = solved;
      break;
    }
    jacobian(current);
    if (relative < tolerance || stepSmall) {
      converged = true;
      break;
    }
    if (d2phi && relative < newtonBelow) newton = true;
  }
  if (q === 0) converged = true;
  // refresh the basis and derivatives at the optimum when a rejected trial overwrote them
  // (the solver holds the last accepted θ)
  if (!basisAtTheta) rss = project(theta, current, true);
  const c = current.c.slice();
  const fitted = new Float64Array(n);
  for (let j = 0; j < m; j++) {
    for (let i = 0; i < n; i++) fitted[i] = fitted[i]! + c[j]! * phi[j * n + i]!;
  }
  const held = Array.from(
    { length: q },
    (_, k) =>
      (lower !== undefined && theta[k]! <= lower[k]!) ||
      (upper !== undefined && theta[k]! >= upper[k]!),
  );
  // covariance of the unseparated model: columns cⱼ ∂φⱼ/∂θₖ for θ, φⱼ for c (weighted)
  const free: number[] = [];
  for (let k = 0; k < q; k++) if (!held[k]) free.push(k);
  for (let j = 0; j < m; j++) if (current.ok[j]) free.push(q + j);
  const f = free.length;
  // the columns written out once (the same products as term by term, so the same sums)
  const columns = work.columns(f * n);
  for (let u = 0; u < f; u++) {
    const idx = free[u]!, o = u * n;
    if (idx < q) {
      const cj = c[col[idx]!]!, d = idx * n;
      for (let i = 0; i < n; i++) columns[o + i] = sw[i]! * cj * dphi[d + i]!;
    } else {
      const d = (idx - q) * n;
      for (let i = 0; i < n; i++) columns[o + i] = sw[i]! * phi[d + i]!;
    }
  }
  const info = new Float64Array(f * f);
  for (let u = 0; u < f; u++) {
    for (let v = 0; v <= u; v++) {
      const ou = u * n, ov = v * n;
      let t = 0;
      for (let i = 0; i < n; i++) t += columns[ou + i]! * columns[ov + i]!;
      info[u * f + v] = t;
      info[v * f + u] = t;
    }
  }
  const s2 = rss / Math.max(1, n - f);
  const inverse = invertSpd(info, f);
  const covariance = new Float64Array(p * p);
  const sigmas: (number | null)[] = new Array(p).fill(null);
  const determined = inverse.every(Number.isFinite);
  if (determined) {
    free.forEach((r, u) =>
      free.forEach((cc, v) => (covariance[r * p + cc] = inverse[u * f + v]! * s2))
    );
    for (const r of free) sigmas[r] = Math.sqrt(Math.max(covariance[r * p + r]!, 0));
  }
  return {
    nonlinear: theta,
    linear: c,
    covariance,
    sigmas,
    held,
    rss,
    model: fitted,
    iterations,
    converged,
  };
}

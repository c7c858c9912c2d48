/**
 * The absorption edge: Tauc analysis, (α·hν)^(1/r) = B (hν − Eg) with r = 1/2 for direct
 * allowed and r = 2 for indirect allowed transitions (Tauc, Grigorovici & Vancu, Phys. Status
 * Solidi 15, 627 (1966); Davis & Mott, Philos. Mag. 22, 903 (1970)), and the Urbach tail
 * α = α0 exp((E − E0)/Eu) below it (Urbach, Phys. Rev. 92, 1324 (1953)).
 *
 * The Tauc window is grown down from the highest-energy usable point for as long as a
 * quadratic term stays insignificant (|t| < 4, our choice) and the points stand above the
 * noise; the Urbach window is the longest stretch below it where ln α is straight in the same
 * sense. Both lines are weighted least squares with σ from the covariance; the gap's σ follows
 * by first-order propagation (JCGM 100:2008).
 *
 * @module
 */

/** A straight-line window of the edge analysis. */
export interface LinearRegion {
  fromEv: number;
  toEv: number;
  slope: number;
  intercept: number;
  r2: number;
  points: number;
}

/** Options of the edge fits. */
export interface EdgeOptions {
  /** 1 for usable points (default all). */
  usable?: ArrayLike<number>;
  /** Noise σ of α per point (default: estimated from the line residuals). */
  alphaSigma?: ArrayLike<number>;
  /** Fewest points in a window (default 6). */
  minPoints?: number;
}

/** Curvature |t| above which a window is no longer straight (our choice). */
const CURVATURE_T = 4;
/** α must stand this many σ above zero to count as inside the dynamic range (our choice). */
const ABOVE_NOISE = 5;

interface Point {
  x: number;
  y: number;
  w: number;
}

/** Incremental weighted sums for straight-line and quadratic fits about a fixed origin. */
class Sums {
  s = new Float64Array(9);
  constructor(readonly origin: number) {}
  add(p: Point) {
    const x = p.x - this.origin, w = p.w, s = this.s;
    s[0] = s[0]! + w;
    s[1] = s[1]! + w * x;
    s[2] = s[2]! + w * x * x;
    s[3] = s[3]! + w * x * x * x;
    s[4] = s[4]! + w * x ** 4;
    s[5] = s[5]! + w * p.y;
    s[6] = s[6]! + w * x * p.y;
    s[7] = s[7]! + w * x * x * p.y;
    s[8] = s[8]! + w * p.y * p.y;
  }
  /** Line y = a + b (x − origin) with covariance scaled by the residual variance. */
  line(k: number) {
    const [s0, s1, s2, , , t0, t1, , yy] = this.s as unknown as number[];
    const det = s0! * s2! - s1! * s1!;
    const b = (s0! * t1! - s1! * t0!) / det, a = (t0! - b * s1!) / s0!;
    const rss = Math.max(yy! - a * t0! - b * t1!, 0);
    const s2r = rss / Math.max(k - 2, 1);
    const my = t0! / s0!;
    const syy = yy! - s0! * my * my;
    return {
      a,
      b,
      chi2: rss,
      varA: (s2! / det) * s2r,
      varB: (s0! / det) * s2r,
      covAB: (-s1! / det) * s2r,
      r2: syy > 0 ? 1 - rss / syy : 1,
    };
  }
  /** t value of the quadratic coefficient. */
  curvatureT(k: number): number {
    if (k < 5) return 0;
    const [s0, s1, s2, s3, s4, t0, t1, t2, yy] = this.s as unknown as number[];
    const m = [[s0!, s1!, s2!], [s1!, s2!, s3!], [s2!, s3!, s4!]];
    const inv = invert3(m);
    if (!inv) return Infinity;
    const beta = [0, 1, 2].map((i) => inv[i]![0]! * t0! + inv[i]![1]! * t1! + inv[i]![2]! * t2!);
    const rss = Math.max(yy! - beta[0]! * t0! - beta[1]! * t1! - beta[2]! * t2!, 0);
    const s2r = rss / (k - 3);
    const v = inv[2]![2]! * s2r;
    if (!(v > 0)) return beta[2] === 0 ? 0 : Infinity;
    return beta[2]! / Math.sqrt(v);
  }
}

function invert3(m: number[][]): number[][] | undefined {
  const [a, b, c] = m[0]!, [d, e, f] = m[1]!, [g, h, i] = m[2]!;
  const A = e! * i! - f! * h!, B = -(d! * i! - f! * g!), C = d! * h! - e! * g!;
  const det = a! * A + b! * B + c! * C;
  if (!(Math.abs(det) > 0)) return undefined;
  return [
    [A / det, -(b! * i! - c! * h!) / det, (b! * f! - c! * e!) / det],
    [B / det, (a! * i! - c! * g!) / det, -(a! * f! - c! * d!) / det],
    [C / det, -(a! * h! - b! * g!) / det, (a! * e! - b! * d!) / det],
  ];
}

function sortedUsable(
  energyEv: ArrayLike<number>,
  alphaPerCm: ArrayLike<number>,
  options: EdgeOptions,
): { e: number[]; a: number[]; s: (number | undefined)[] } {
  const idx = Array.from({ length: energyEv.length }, (_, i) => i)
    .filter((i) =>
      (!options.usable || options.usable[i]) && Number.isFinite(alphaPerCm[i]!) &&
      energyEv[i]! > 0
    )
    .sort((p, q) => energyEv[p]! - energyEv[q]!);
  return {
    e: idx.map((i) => energyEv[i]!),
    a: idx.map((i) => alphaPerCm[i]!),
    s: idx.map((i) => options.alphaSigma?.[i]),
  };
}

/** Grows a window down from index `end` while it stays straight and above the noise. */
function growDown(
  points: Point[],
  end: number,
  lowest: number,
  minPoints: number,
  inRange: (k: number) => boolean,
  stillFits: (sums: Sums, k: number, next: Point) => boolean = () => true,
): { start: number; sums: Sums } | undefined {
  if (!inRange(end)) return undefined;
  const sums = new Sums(points[end]!.x);
  let start = end;
  sums.add(points[end]!);
  let good: { start: number; sums: Sums } | undefined;
  while (start - 1 >= lowest && inRange(start - 1)) {
    const trial = new Sums(sums.origin);
    trial.s.set(sums.s);
    trial.add(points[start - 1]!);
    const k = end - start + 2;
    if (k >= minPoints && Math.abs(trial.curvatureT(k)) > CURVATURE_T) break;
    if (k > minPoints && !stillFits(sums, k - 1, points[start - 1]!)) break;
    sums.s.set(trial.s);
    start--;
    if (end - start + 1 >= minPoints) {
      const copy = new Sums(sums.origin);
      copy.s.set(sums.s);
      good = { start, sums: copy };
    }
  }
  return good;
}

/** Result of a Tauc analysis. */
export interface TaucResult {
  gapEv: number;
  gapEvSigma: number;
  exponent: "direct" | "indirect";
  region: LinearRegion;
}

/** Why no gap was given. */
export interface EdgeOutside {
  /** Plain-language reason, e.g. "edge above 4.13 eV: outside the data". */
  message: string;
}

/**
 * Optical gap from α(E) by the Tauc construction, the window chosen just below the
 * highest-energy usable point.
 *
 * @param energyEv Photon energies, eV (any order).
 * @param alphaPerCm Absorption coefficient at those energies, cm⁻¹.
 * @returns The gap with its window, or a message when no edge is inside the data.
 */
export function taucGap(
  energyEv: ArrayLike<number>,
  alphaPerCm: ArrayLike<number>,
  exponent: "direct" | "indirect" = "direct",
  options: EdgeOptions = {},
): TaucResult | EdgeOutside {
  const { e, a, s } = sortedUsable(energyEv, alphaPerCm, options);
  const n = e.length, minPoints = options.minPoints ?? 6;
  if (n < minPoints) return { message: "too few usable points for an edge analysis" };
  const top = e[n - 1]!;
  const power = exponent === "direct" ? 2 : 0.5;
  // the edge must rise toward the top of the data: the mean α of the last points clearly
  // above that of the points before them, and the top well above the median of the data
  const last = Math.max(minPoints, Math.round(n * 0.02));
  const block = (from: number, to: number) => {
    const v = a.slice(Math.max(0, from), to);
    const mean = v.reduce((p, q) => p + q, 0) / v.length;
    const sd = Math.sqrt(v.reduce((p, q) => p + (q - mean) ** 2, 0) / Math.max(1, v.length - 1));
    return { mean, se: sd / Math.sqrt(v.length) };
  };
  const top1 = block(n - last, n), top2 = block(n - 2 * last, n - last);
  const median = [...a].sort((p, q) => p - q)[Math.floor(n / 2)]!;
  const sTop = s[n - 1];
  const rising = top1.mean > top2.mean + 3 * Math.hypot(top1.se, top2.se) &&
    a[n - 1]! - median > Math.max(sTop !== undefined ? 10 * sTop : 0, 0.2 * Math.abs(median));
  if (!rising) {
    return { message: `edge above ${top.toFixed(2)} eV: outside the data` };
  }
  const points: Point[] = e.map((x, k) => {
    const y = Math.max(a[k]! * x, 0) ** power;
    const sa = s[k];
    // σ of (αE)^p from σ_α: p (αE)^(p−1) E σ_α
    const sy = sa === undefined ? undefined : power * Math.max(a[k]! * x, 1e-300) ** (power - 1) *
      x * sa;
    return { x, y, w: sy === undefined ? 1 : 1 / Math.max(sy * sy, 1e-300) };
  });
  const aboveNoise = (k: number) => {
    const sa = s[k];
    return sa === undefined ? a[k]! > 0 : a[k]! > ABOVE_NOISE * sa;
  };
  // a point below the gap of the window so far, or more than 4σ off its line (σ scaled by
  // the window's own χ²/(k − 2), so a σ of the wrong size does not decide), belongs to the
  // tail, not to the Tauc region
  const aboveGap = (sums: Sums, k: number, next: Point) => {
    const l = sums.line(k);
    const off = next.y - (l.a + l.b * (next.x - sums.origin));
    return l.b > 0 && next.x > sums.origin - l.a / l.b &&
      off * off * next.w <= 16 * Math.max(1, l.chi2 / Math.max(1, k - 2));
  };
  const win = growDown(points, n - 1, 0, minPoints, aboveNoise, aboveGap);
  if (!win) return { message: "no straight Tauc region below the top of the data" };
  const k = n - win.start;
  const l = win.sums.line(k);
  if (!(l.b > 0)) return { message: "no rising Tauc region below the top of the data" };
  // in the Tauc region ln α bends (it goes as ln √(E − Eg) or ln (E − Eg)²); where ln α is
  // straight over the whole window, the window holds only the exponential tail
  const logSums = new Sums(top);
  for (let j = win.start; j < n; j++) {
    if (a[j]! > 0) logSums.add({ x: e[j]!, y: Math.log(a[j]!), w: 1 });
  }
  if (Math.abs(logSums.curvatureT(k)) < CURVATURE_T) {
    return {
      message: `only the exponential tail reaches into the usable range (up to ${
        top.toFixed(2)
      } eV): the Tauc region lies above it`,
    };
  }
  // y = a + b (E − top) = 0 at E = top − a/b
  const gap = top - l.a / l.b;
  const dA = -1 / l.b, dB = l.a / (l.b * l.b);
  const varGap = dA * dA * l.varA + dB * dB * l.varB + 2 * dA * dB * l.covAB;
  return {
    gapEv: gap,
    gapEvSigma: Math.sqrt(Math.max(varGap, 0)),
    exponent,
    region: {
      fromEv: e[win.start]!,
      toEv: top,
      slope: l.b,
      intercept: l.a - l.b * top,
      r2: l.r2,
      points: k,
    },
  };
}

/** Result of an Urbach-tail fit. */
export interface UrbachResult {
  urbachEv: number;
  urbachEvSigma: number;
  region: LinearRegion;
}

/**
 * Urbach energy from the exponential tail below `belowEv` (e.g. the Tauc window's lower end):
 * the longest stretch where ln α is straight and α stands above the noise; Eu = 1/slope.
 */
export function urbachEnergy(
  energyEv: ArrayLike<number>,
  alphaPerCm: ArrayLike<number>,
  belowEv = Infinity,
  options: EdgeOptions = {},
): UrbachResult | undefined {
  const { e, a, s } = sortedUsable(energyEv, alphaPerCm, options);
  const minPoints = options.minPoints ?? 6;
  let end = e.length - 1;
  while (end >= 0 && !(e[end]! < belowEv)) end--;
  if (end + 1 < minPoints) return undefined;
  const points: Point[] = e.map((x, k) => {
    const sa = s[k];
    // σ of ln α is σ_α/α
    const w = sa === undefined ? 1 : (a[k]! / sa) ** 2;
    return { x, y: Math.log(Math.max(a[k]!, 1e-300)), w };
  });
  const aboveNoise = (k: number) => {
    const sa = s[k];
    return a[k]! > 0 && (sa === undefined || a[k]! > ABOVE_NOISE * sa);
  };
  let best: { start: number; end: number; sums: Sums } | undefined;
  // the tail may start a little below the window above it: try ends over the next points
  const tries = Math.min(end + 1, Math.max(10, Math.round(0.05 * e.length)));
  for (let t = 0; t < tries; t++) {
    const w = growDown(points, end - t, 0, minPoints, aboveNoise);
    if (w && (!best || end - t - w.start > best.end - best.start)) {
      best = { start: w.start, end: end - t, sums: w.sums };
    }
  }
  if (!best) return undefined;
  const k = best.end - best.start + 1;
  const l = best.sums.line(k);
  if (!(l.b > 0)) return undefined;
  return {
    urbachEv: 1 / l.b,
    urbachEvSigma: Math.sqrt(Math.max(l.varB, 0)) / (l.b * l.b),
    region: {
      fromEv: e[best.start]!,
      toEv: e[best.end]!,
      slope: l.b,
      intercept: l.a - l.b * best.sums.origin,
      r2: l.r2,
      points: k,
    },
  };
}

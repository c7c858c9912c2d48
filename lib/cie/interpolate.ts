/**
 * Interpolation of measured spectral data onto the 1 nm grid, as CIE 167:2005 recommends:
 * Sprague (fifth-order, CIE 167 §3) for uniform steps, a monotone piecewise cubic (PCHIP,
 * Fritsch & Carlson, SIAM J. Numer. Anal. 17, 238 (1980)) for irregular steps such as
 * instrument pixel grids — it never overshoots across gaps, unlike a natural spline, cubic Lagrange for 10/20 nm data (ASTM E2022 §7), and
 * constant extrapolation of the end values outside the measured range (CIE 15:2018 §7.2.2).
 *
 * @module
 */
import { GRID_LENGTH, GRID_NM, GRID_START_NM } from "./grid.ts";

/** How measured data were carried onto the 1 nm grid. */
export type InterpolationMethod = "sprague" | "pchip" | "astm-e2022-lagrange" | "linear";

/** Result of carrying a spectrum onto the 1 nm grid. */
export interface GridResample {
  values: Float64Array<ArrayBuffer>;
  method: InterpolationMethod;
  /** True when grid points below the first measured wavelength were filled by extrapolation. */
  extrapolatedBelow: boolean;
  /** True when grid points above the last measured wavelength were filled by extrapolation. */
  extrapolatedAbove: boolean;
}

const TOLERANCE_NM = 1e-6;

/** Uniform step of an axis in nm, or undefined when the steps differ by more than 0.1 %. */
export function uniformStep(wavelengthNm: ArrayLike<number>): number | undefined {
  const n = wavelengthNm.length;
  if (n < 2) return undefined;
  const step = (wavelengthNm[n - 1]! - wavelengthNm[0]!) / (n - 1);
  for (let i = 1; i < n; i++) {
    if (
      Math.abs(wavelengthNm[i]! - wavelengthNm[i - 1]! - step) > Math.max(1e-3 * step, TOLERANCE_NM)
    ) {
      return undefined;
    }
  }
  return step;
}

/** The method CIE 167 / ASTM E2022 recommend for an axis. */
export function chooseMethod(wavelengthNm: ArrayLike<number>): InterpolationMethod {
  const n = wavelengthNm.length;
  const step = uniformStep(wavelengthNm);
  if (step !== undefined) {
    const onIntegers = Math.abs(wavelengthNm[0]! - Math.round(wavelengthNm[0]!)) < TOLERANCE_NM;
    if (
      onIntegers && (Math.abs(step - 10) < TOLERANCE_NM || Math.abs(step - 20) < TOLERANCE_NM) &&
      n >= 3
    ) {
      return "astm-e2022-lagrange";
    }
    if (n >= 6) return "sprague";
  }
  return n >= 3 ? "pchip" : "linear";
}

/** CIE 167 coefficients for the two extra points beyond each end of a Sprague table (÷209). */
const SPRAGUE_END = [
  [884, -1960, 3033, -2648, 1080, -180],
  [508, -540, 488, -367, 144, -24],
] as const;

function spragueExtend(v: ArrayLike<number>): Float64Array {
  const n = v.length;
  const out = new Float64Array(n + 4);
  for (let i = 0; i < n; i++) out[i + 2] = v[i]!;
  for (let r = 0; r < 2; r++) {
    let head = 0, tail = 0;
    for (let k = 0; k < 6; k++) {
      head += SPRAGUE_END[r]![k]! * v[k]!;
      tail += SPRAGUE_END[r]![k]! * v[n - 1 - k]!;
    }
    out[r] = head / 209;
    out[n + 3 - r] = tail / 209;
  }
  return out;
}

/** Sprague quintic between p0 and p1 (points p−2 … p3) at fraction t (CIE 167 eq. 1). */
function spragueAt(p: Float64Array, i: number, t: number): number {
  const m2 = p[i]!, m1 = p[i + 1]!, p0 = p[i + 2]!, p1 = p[i + 3]!, p2 = p[i + 4]!, p3 = p[i + 5]!;
  const a1 = (2 * m2 - 16 * m1 + 16 * p1 - 2 * p2) / 24;
  const a2 = (-m2 + 16 * m1 - 30 * p0 + 16 * p1 - p2) / 24;
  const a3 = (-9 * m2 + 39 * m1 - 70 * p0 + 66 * p1 - 33 * p2 + 7 * p3) / 24;
  const a4 = (13 * m2 - 64 * m1 + 126 * p0 - 124 * p1 + 61 * p2 - 12 * p3) / 24;
  const a5 = (-5 * m2 + 25 * m1 - 50 * p0 + 50 * p1 - 25 * p2 + 5 * p3) / 24;
  return p0 + t * (a1 + t * (a2 + t * (a3 + t * (a4 + t * a5))));
}

/** Node slopes of the Fritsch–Carlson monotone cubic through (x, y) (Moler's three-point form). */
function pchipSlopes(x: ArrayLike<number>, y: ArrayLike<number>): Float64Array {
  const n = x.length;
  const h = new Float64Array(n - 1), delta = new Float64Array(n - 1), d = new Float64Array(n);
  for (let i = 0; i < n - 1; i++) {
    h[i] = x[i + 1]! - x[i]!;
    delta[i] = (y[i + 1]! - y[i]!) / h[i]!;
  }
  for (let i = 1; i < n - 1; i++) {
    const a = delta[i - 1]!, b = delta[i]!;
    if (a * b <= 0) continue;
    const w1 = 2 * h[i]! + h[i - 1]!, w2 = h[i]! + 2 * h[i - 1]!;
    d[i] = (w1 + w2) / (w1 / a + w2 / b);
  }
  const end = (h0: number, h1: number, d0: number, d1: number) => {
    let v = ((2 * h0 + h1) * d0 - h0 * d1) / (h0 + h1);
    if (Math.sign(v) !== Math.sign(d0)) v = 0;
    else if (Math.sign(d0) !== Math.sign(d1) && Math.abs(v) > Math.abs(3 * d0)) v = 3 * d0;
    return v;
  };
  if (n === 2) {
    d[0] = d[1] = delta[0]!;
  } else {
    d[0] = end(h[0]!, h[1]!, delta[0]!, delta[1]!);
    d[n - 1] = end(h[n - 2]!, h[n - 3]!, delta[n - 2]!, delta[n - 3]!);
  }
  return d;
}

/** Lagrange basis weights at t for nodes at integer offsets `nodes` (relative positions). */
function lagrange(nodes: readonly number[], t: number): number[] {
  return nodes.map((xi, i) =>
    nodes.reduce((acc, xj, j) => (j === i ? acc : (acc * (t - xj)) / (xi - xj)), 1)
  );
}

/**
 * Carries a measured spectrum onto the 360–830 nm 1 nm grid.
 *
 * @param wavelengthNm Strictly ascending wavelengths in nm.
 * @param values Values at those wavelengths.
 * @param method Defaults to {@linkcode chooseMethod}'s choice.
 */
export function resampleTo1nm(
  wavelengthNm: ArrayLike<number>,
  values: ArrayLike<number>,
  method: InterpolationMethod = chooseMethod(wavelengthNm),
): GridResample {
  const first = wavelengthNm[0]!, last = wavelengthNm[wavelengthNm.length - 1]!;
  return {
    values: resampleToGrid(wavelengthNm, values, GRID_NM, method),
    method,
    extrapolatedBelow: first > GRID_START_NM + TOLERANCE_NM,
    extrapolatedAbove: last < GRID_START_NM + GRID_LENGTH - 1 - TOLERANCE_NM,
  };
}

/**
 * Carries measured data onto any ascending grid with the same CIE 167 methods as
 * {@linkcode resampleTo1nm} (end values held outside the data, CIE 15:2018 §7.2.2).
 *
 * @param wavelengthNm Strictly ascending abscissae (any unit, the same as `grid`).
 * @param values Values at those abscissae.
 * @param grid Ascending abscissae to interpolate at.
 * @param method Defaults to {@linkcode chooseMethod}'s choice.
 */
export function resampleToGrid(
  wavelengthNm: ArrayLike<number>,
  values: ArrayLike<number>,
  grid: ArrayLike<number>,
  method: InterpolationMethod = chooseMethod(wavelengthNm),
): Float64Array<ArrayBuffer> {
  const n = wavelengthNm.length;
  const out = new Float64Array(grid.length);
  const first = wavelengthNm[0]!, last = wavelengthNm[n - 1]!;
  const extended = method === "sprague" ? spragueExtend(values) : undefined;
  const slopes = method === "pchip" ? pchipSlopes(wavelengthNm, values) : undefined;
  const step = method === "sprague" || method === "astm-e2022-lagrange"
    ? (last - first) / (n - 1)
    : 0;
  let j = 0;
  for (let g = 0; g < grid.length; g++) {
    const wl = grid[g]!;
    if (wl <= first + TOLERANCE_NM) {
      out[g] = values[0]!;
      continue;
    }
    if (wl >= last - TOLERANCE_NM) {
      out[g] = values[n - 1]!;
      continue;
    }
    if (step > 0) {
      const pos = (wl - first) / step;
      j = Math.min(Math.floor(pos), n - 2);
      const t = pos - j;
      if (extended) {
        out[g] = spragueAt(extended, j, t);
      } else {
        const nodes = j === 0 ? [0, 1, 2] : j === n - 2 ? [-1, 0, 1] : [-1, 0, 1, 2];
        const usable = n === 3 ? [-j, 1 - j, 2 - j] : nodes;
        const w = lagrange(usable, t);
        let s = 0;
        usable.forEach((o, k) => (s += w[k]! * values[j + o]!));
        out[g] = s;
      }
      continue;
    }
    while (j < n - 2 && wavelengthNm[j + 1]! <= wl) j++;
    const x0 = wavelengthNm[j]!, x1 = wavelengthNm[j + 1]!;
    const h = x1 - x0;
    const t = (wl - x0) / h;
    const y0 = values[j]!, y1 = values[j + 1]!;
    if (slopes) {
      const t2 = t * t, t3 = t2 * t;
      out[g] = (2 * t3 - 3 * t2 + 1) * y0 + (t3 - 2 * t2 + t) * h * slopes[j]! +
        (-2 * t3 + 3 * t2) * y1 + (t3 - t2) * h * slopes[j + 1]!;
    } else {
      out[g] = y0 + (y1 - y0) * t;
    }
  }
  return out;
}

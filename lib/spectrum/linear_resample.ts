/**
 * Linear interpolation on an ascending axis: one value, or a whole curve onto another axis
 * (ends held constant outside the data).
 *
 * @module
 */

/**
 * Value of y(x) at `at` by linear interpolation.
 *
 * @throws {RangeError} When `at` lies outside the data.
 */
export function valueAt(x: ArrayLike<number>, y: ArrayLike<number>, at: number): number {
  const n = x.length;
  if (!(at >= x[0]! && at <= x[n - 1]!)) {
    throw new RangeError(`Cannot read ${at} nm: outside the data`);
  }
  let j = 0;
  while (j < n - 2 && x[j + 1]! < at) j++;
  const f = (at - x[j]!) / (x[j + 1]! - x[j]!);
  return y[j]! * (1 - f) + y[j + 1]! * f;
}

/** y(x) carried onto the axis `to`, linearly, end values held outside the data. */
export function resampleLinear(
  x: ArrayLike<number>,
  y: ArrayLike<number>,
  to: ArrayLike<number>,
): Float64Array<ArrayBuffer> {
  const n = x.length;
  const out = new Float64Array(to.length);
  let j = 0;
  for (let i = 0; i < to.length; i++) {
    const w = to[i]!;
    if (w <= x[0]!) out[i] = y[0]!;
    else if (w >= x[n - 1]!) out[i] = y[n - 1]!;
    else {
      while (j > 0 && x[j]! > w) j--;
      while (j < n - 2 && x[j + 1]! < w) j++;
      const f = (w - x[j]!) / (x[j + 1]! - x[j]!);
      out[i] = y[j]! * (1 - f) + y[j + 1]! * f;
    }
  }
  return out;
}

/**
 * Fixed-point precision of written numbers: the coarsest power of ten every value is a
 * multiple of, bounded by a number of significant digits (the JCAMP-DX XFACTOR / YFACTOR
 * idea of McDonald & Wilks, Appl. Spectrosc. 42, 151 (1988), §5.2, used for text too).
 *
 * @module
 */

/** Values as integers in units of 10^exponent (exact for negative exponents up to 22). */
export function toUnits(value: number, exponent: number): number {
  return exponent < 0 ? value * 10 ** -exponent : value / 10 ** exponent;
}

/**
 * The largest exponent k such that every value is an integer multiple of 10^k (to 1e-6 of a
 * unit), but never finer than `maxSignificantDigits` of the largest magnitude.
 */
export function decimalExponent(values: ArrayLike<number>, maxSignificantDigits: number): number {
  let maxAbs = 0;
  for (let i = 0; i < values.length; i++) maxAbs = Math.max(maxAbs, Math.abs(values[i]!));
  if (maxAbs === 0) return 0;
  const top = Math.floor(Math.log10(maxAbs));
  const finest = top - maxSignificantDigits + 1;
  for (let k = top; k > finest; k--) {
    let exact = true;
    for (let i = 0; i < values.length && exact; i++) {
      const u = toUnits(values[i]!, k);
      exact = Math.abs(u - Math.round(u)) <= 1e-6;
    }
    if (exact) return k;
  }
  return finest;
}

/**
 * A value written with the precision 10^exponent (no exponent notation, no "-0"), rounded
 * exactly as the JCAMP-DX integers are, so CSV and JCAMP-DX outputs hold the same digits.
 */
export function formatFixed(value: number, exponent: number): string {
  const units = Math.round(toUnits(value, exponent));
  if (units === 0) return exponent < 0 ? `0.${"0".repeat(-exponent)}` : "0";
  const digits = String(Math.abs(units));
  const sign = units < 0 ? "-" : "";
  if (exponent >= 0) return `${sign}${digits}${"0".repeat(exponent)}`;
  const padded = digits.padStart(-exponent + 1, "0");
  return `${sign}${padded.slice(0, exponent)}.${padded.slice(exponent)}`;
}

/** 10^exponent as a plain decimal string ("0.0001", "1", "100"). */
export function powerOfTenText(exponent: number): string {
  return exponent < 0 ? `0.${"0".repeat(-exponent - 1)}1` : `1${"0".repeat(exponent)}`;
}

/**
 * Rounding for display and storage: the one helper every writer uses.
 *
 * @module
 */

/** `value` rounded to `decimals` places (as `toFixed` does), or NaN for a non-finite value. */
export function roundTo(value: number, decimals: number): number {
  return Number.isFinite(value) ? Number(value.toFixed(decimals)) : NaN;
}

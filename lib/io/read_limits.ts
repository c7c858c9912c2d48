/**
 * Limits every read obeys, so one hostile or oversized file fails alone with an `InputError`
 * instead of exhausting memory (sizes are our choice, documented with each).
 *
 * @module
 */

/** Caps on one file. */
export interface ReadLimits {
  /** Largest file in bytes (a text export of a million points is far below it). */
  maxBytes: number;
  /** Most points (rows) per spectrum. */
  maxPoints: number;
  /** Most columns per table (16,384 is the common spreadsheet column limit). */
  maxColumns: number;
  /** Most numbers per file (points × columns): 2²⁴ values are 128 MB as Float64. */
  maxValues: number;
}

/** The default caps: 64 MB, 1,000,000 points, 16,384 columns, 16,777,216 values. */
export const DEFAULT_READ_LIMITS: Readonly<ReadLimits> = Object.freeze({
  maxBytes: 64 * 1024 * 1024,
  maxPoints: 1_000_000,
  maxColumns: 16_384,
  maxValues: 16_777_216,
});

/**
 * The default limits with the given ones put over them.
 *
 * @throws {RangeError} For a limit that is not a positive integer.
 */
export function resolveReadLimits(limits: Partial<ReadLimits> = {}): ReadLimits {
  const out = { ...DEFAULT_READ_LIMITS, ...limits };
  for (const [k, v] of Object.entries(out)) {
    if (!(Number.isSafeInteger(v) && v > 0)) {
      throw new RangeError(`Cannot use read limit ${k} = ${v}: must be a positive integer`);
    }
  }
  return out;
}

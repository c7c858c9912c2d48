/**
 * CIEDE2000 for many pairs at once, on packed typed arrays (Sharma, Wu & Dalal, Color Res.
 * Appl. 30, 21 (2005)); the same numbers as {@linkcode deltaE2000} pair by pair.
 *
 * @module
 */
import { ciede2000 } from "./_ciede2000.ts";
import type { DeltaE2000Options } from "./delta_e.ts";

/**
 * ΔE00 of pairs packed as L, a, b triples: out[i] = ΔE00(lab1[3i…3i+2], lab2[3i…3i+2]).
 *
 * @param lab1 Reference colours, L*, a*, b* interleaved (length 3·n).
 * @param lab2 Sample colours, same layout and length.
 * @param out Receives n differences; allocated when omitted.
 * @param options Parametric factors kL, kC, kH (default 1).
 * @returns `out`.
 * @throws {RangeError} When the lengths are not 3·n, or `out` is shorter than n.
 *
 * @example Sharma et al. (2005) Table 1, pairs 1 and 16
 * ```ts
 * import { deltaE2000Many } from "./delta_e2000_many.ts";
 * const d = deltaE2000Many(
 *   Float64Array.of(50, 2.6772, -79.7751, 50, 2.5, 0),
 *   Float64Array.of(50, 0, -82.7485, 50, 0, -2.5),
 * );
 * if (Math.abs(d[0]! - 2.0425) > 1e-4 || Math.abs(d[1]! - 4.3065) > 1e-4) throw new Error();
 * ```
 */
export function deltaE2000Many(
  lab1: Float64Array,
  lab2: Float64Array,
  out?: Float64Array,
  options?: DeltaE2000Options,
): Float64Array {
  const n = lab1.length / 3;
  if (!Number.isInteger(n) || lab2.length !== lab1.length) {
    throw new RangeError(
      `Cannot pair colours: lengths ${lab1.length} and ${lab2.length} are not equal multiples of 3`,
    );
  }
  const result = out ?? new Float64Array(n);
  if (result.length < n) {
    throw new RangeError(`Cannot write ${n} differences into an array of ${result.length}`);
  }
  const kL = options?.kL ?? 1, kC = options?.kC ?? 1, kH = options?.kH ?? 1;
  // The core reads {L, a, b} objects; two reused ones carry the packed values (no allocation).
  const first = { L: 0.5, a: 0.5, b: 0.5 }, second = { L: 0.5, a: 0.5, b: 0.5 };
  for (let i = 0, j = 0; i < n; i++, j += 3) {
    first.L = lab1[j]!;
    first.a = lab1[j + 1]!;
    first.b = lab1[j + 2]!;
    second.L = lab2[j]!;
    second.a = lab2[j + 1]!;
    second.b = lab2[j + 2]!;
    result[i] = ciede2000(first, second, kL, kC, kH);
  }
  return result;
}

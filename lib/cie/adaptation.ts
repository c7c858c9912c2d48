/**
 * Chromatic adaptation transforms (von Kries-type): Bradford (Lam 1985, as used in ICC
 * profiles) and CAT16 (Li, Li, Wang, Zu, Luo, Cui, Melgosa, Brill & Pointer, Color Res. Appl.
 * 42, 703 (2017)) with complete adaptation (D = 1).
 *
 * @module
 */
import type { Matrix3 } from "../numeric/matrix3.ts";
import type { Xyz } from "./tristimulus.ts";

/** Bradford cone-response matrix (Lam 1985). */
export const BRADFORD: Matrix3 = [
  [0.8951, 0.2664, -0.1614],
  [-0.7502, 1.7135, 0.0367],
  [0.0389, -0.0685, 1.0296],
];

/** CAT16 matrix M16 (Li et al. 2017, eq. 2). */
export const CAT16: Matrix3 = [
  [0.401288, 0.650173, -0.051461],
  [-0.250268, 1.204414, 0.045854],
  [-0.002079, 0.048952, 0.953127],
];

/** Multiplies a 3×3 matrix by a vector. */
export function multiply(m: Matrix3, v: readonly number[]): [number, number, number] {
  const v0 = v[0]!, v1 = v[1]!, v2 = v[2]!;
  const r0 = m[0]!, r1 = m[1]!, r2 = m[2]!;
  return [
    r0[0]! * v0 + r0[1]! * v1 + r0[2]! * v2,
    r1[0]! * v0 + r1[1]! * v1 + r1[2]! * v2,
    r2[0]! * v0 + r2[1]! * v1 + r2[2]! * v2,
  ];
}

/** Inverse of a 3×3 matrix. */
export function invert(m: Matrix3): Matrix3 {
  const [a, b, c] = m[0]!, [d, e, f] = m[1]!, [g, h, i] = m[2]!;
  const A = e! * i! - f! * h!, B = -(d! * i! - f! * g!), C = d! * h! - e! * g!;
  const det = a! * A + b! * B + c! * C;
  return [
    [A / det, -(b! * i! - c! * h!) / det, (b! * f! - c! * e!) / det],
    [B / det, (a! * i! - c! * g!) / det, -(a! * f! - c! * d!) / det],
    [C / det, -(a! * h! - b! * g!) / det, (a! * e! - b! * d!) / det],
  ];
}

const BRADFORD_INVERSE = invert(BRADFORD), CAT16_INVERSE = invert(CAT16);

/** Name of an adaptation transform. */
export type AdaptationMethod = "bradford" | "cat16";

/**
 * XYZ seen under a source white, adapted to a destination white (corresponding colour).
 *
 * @example A white stays white
 * ```ts
 * import { adaptXyz } from "./adaptation.ts";
 * const a = { X: 109.85, Y: 100, Z: 35.585 }, d65 = { X: 95.047, Y: 100, Z: 108.883 };
 * const w = adaptXyz(a, a, d65, "cat16");
 * if (Math.abs(w.Z - 108.883) > 1e-9) throw new Error("white must map to white");
 * ```
 */
export function adaptXyz(xyz: Xyz, fromWhite: Xyz, toWhite: Xyz, method: AdaptationMethod): Xyz {
  const m = method === "bradford" ? BRADFORD : CAT16;
  const inv = method === "bradford" ? BRADFORD_INVERSE : CAT16_INVERSE;
  const src = multiply(m, [fromWhite.X, fromWhite.Y, fromWhite.Z]);
  const dst = multiply(m, [toWhite.X, toWhite.Y, toWhite.Z]);
  const c = multiply(m, [xyz.X, xyz.Y, xyz.Z]);
  const scaled = [(c[0] * dst[0]) / src[0], (c[1] * dst[1]) / src[1], (c[2] * dst[2]) / src[2]];
  const [X, Y, Z] = multiply(inv, scaled);
  return { X, Y, Z };
}

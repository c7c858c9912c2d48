/**
 * 3×3 matrices for colour-space transforms (rows of three numbers).
 *
 * @module
 */

/** A 3×3 matrix as three rows. */
export type Matrix3 = readonly [readonly number[], readonly number[], readonly number[]];

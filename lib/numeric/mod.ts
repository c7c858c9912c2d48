/**
 * Numerical building blocks: least squares (incl. variable projection), simplex minimisation, Student t, smoothing, rounding.
 *
 * @module
 */
export * from "./levenberg_marquardt.ts";
export * from "./nelder_mead.ts";
export * from "./student_t.ts";
export * from "./savitzky_golay.ts";
export * from "./variable_projection.ts";
export * from "./round.ts";
export * from "./matrix3.ts";

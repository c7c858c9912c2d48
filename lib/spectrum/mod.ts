/**
 * The spectrum model and unit conversions.
 *
 * @module
 */
export * from "./spectrum.ts";
export * from "./ordinate.ts";
export * from "./axis.ts";
export * from "./linear_resample.ts";

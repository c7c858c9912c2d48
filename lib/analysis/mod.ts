/**
 * The analysis of one sample from its spectrum and settings, the results contract, and
 * whole-spectrum conversion (ordinate, axis, grid).
 *
 * @module
 */
export * from "./sample_settings.ts";
export * from "./sample_result.ts";
export * from "./results_document.ts";
export * from "./analyse_sample.ts";
export * from "./color_columns.ts";
export * from "./convert_spectrum.ts";

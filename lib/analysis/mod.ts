/**
 * The analysis of one sample from its spectrum and settings, and the results contract.
 *
 * @module
 */
export * from "./sample_settings.ts";
export * from "./sample_result.ts";
export * from "./results_document.ts";
export * from "./analyse_sample.ts";

/**
 * Dopant levels and target colour: calibration, prediction, Smakula–Dexter, segregation,
 * target checks and inverse doping.
 *
 * @module
 */
export * from "./target.ts";
export * from "./linear_calibration.ts";
export * from "./response_metric.ts";
export * from "./standards.ts";
export * from "./smakula_dexter.ts";
export * from "./scheil.ts";
export * from "./aim_doping.ts";
export * from "./response_header.ts";

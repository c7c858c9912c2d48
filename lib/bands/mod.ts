/**
 * Absorption bands: usable range, noise, detection, variable-projection fit in energy with
 * model selection, assignment, absorption edge.
 *
 * @module
 */
export * from "./band_model.ts";
export * from "./detect_bands.ts";
export * from "./ordinate_noise.ts";
export * from "./usable_range.ts";
export * from "./residual_structure.ts";
export * from "./fit_bands.ts";
export * from "./analyse_bands.ts";
export * from "./assign_bands.ts";
export * from "./absorption_edge.ts";
export * from "./figure_of_merit.ts";
export { BAND_CATALOGUE, type CatalogueBand } from "./data/band_catalogue.ts";

/**
 * Absorption bands: detection, Gaussian fit in energy, assignment, absorption edge.
 *
 * @module
 */
export * from "./band_model.ts";
export * from "./detect_bands.ts";
export * from "./fit_bands.ts";
export * from "./assign_bands.ts";
export * from "./absorption_edge.ts";
export * from "./figure_of_merit.ts";
export { BAND_CATALOGUE, type CatalogueBand } from "./data/band_catalogue.ts";

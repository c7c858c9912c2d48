/**
 * CIE colorimetry: observers, illuminants, tristimulus integration, colour spaces, ΔE.
 *
 * @module
 */
export * from "./grid.ts";
export * from "./observers.ts";
export * from "./illuminants.ts";
export * from "./daylight.ts";
export * from "./illuminant_a.ts";
export * from "./interpolate.ts";
export * from "./tristimulus.ts";
export * from "./spaces.ts";
export * from "./delta_e.ts";
export * from "./delta_e2000_many.ts";
export * from "./spectrum_color.ts";
export * from "./spectra_color_many.ts";
export * from "./adaptation.ts";
export * from "./color_change.ts";
export * from "./dominant_wavelength.ts";
export * from "./swatch.ts";
export * from "./metamerism.ts";
export * from "./thickness_series.ts";

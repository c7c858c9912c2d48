/**
 * crystint — colour, bands and dopant levels of doped oxide crystals from their spectra.
 *
 * The stable public face of the library: the spectrum model, reading exports, and CIE
 * colorimetry. Everything here runs without file-system access except `readSpectrumFile`.
 *
 * @example Colour difference of two CIELAB colours
 * ```ts
 * import { deltaE2000 } from "./mod.ts";
 * const dE = deltaE2000({ L: 50, a: 2.5, b: 0 }, { L: 50, a: 0, b: -2.5 });
 * if (Math.abs(dE - 4.3065) > 1e-4) throw new Error(String(dE));
 * ```
 *
 * @module
 */
export * from "./spectrum/mod.ts";
export * from "./io/mod.ts";
export * from "./cie/mod.ts";
export * from "./optics/mod.ts";
export * from "./dopant/mod.ts";
export * from "./report/mod.ts";
export * from "./batch/mod.ts";
export { VERSION } from "./version.ts";
export * from "./bands/mod.ts";

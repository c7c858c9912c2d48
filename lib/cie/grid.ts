/**
 * The computation grid of CIE 15:2018 §7.1: 360–830 nm at 1 nm, matching the 1 nm tables.
 *
 * @module
 */

/** First wavelength of the tristimulus grid, nm. */
export const GRID_START_NM = 360;
/** Last wavelength of the tristimulus grid, nm. */
export const GRID_END_NM = 830;
/** Number of 1 nm grid points (471). */
export const GRID_LENGTH: number = GRID_END_NM - GRID_START_NM + 1;

/** The grid wavelengths as an array (360, 361, …, 830). */
export const GRID_NM: Float64Array<ArrayBuffer> = Float64Array.from(
  { length: GRID_LENGTH },
  (_, i) => GRID_START_NM + i,
);

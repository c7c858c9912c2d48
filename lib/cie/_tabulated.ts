/**
 * Carries a uniformly tabulated illuminant onto the 1 nm grid, zero outside its table.
 * D65: linear between tabulated values (the CIE's own 1 nm D65 file is the linear
 * interpolation of its 5 nm table). Other smooth or band-integrated tables (C, F-series,
 * D-series from the recipe): Sprague (CIE 167), which reproduces the ASTM E308-01 white
 * points within 0.005.
 */
import { GRID_LENGTH, GRID_START_NM } from "./grid.ts";
import { resampleTo1nm } from "./interpolate.ts";

export function tabulatedTo1nm(
  startNm: number,
  stepNm: number,
  values: ArrayLike<number>,
  method: "linear" | "sprague",
): Float64Array<ArrayBuffer> {
  const n = values.length;
  const endNm = startNm + (n - 1) * stepNm;
  const nm = Float64Array.from({ length: n }, (_, i) => startNm + i * stepNm);
  const { values: out } = resampleTo1nm(nm, values, method);
  for (let g = 0; g < GRID_LENGTH; g++) {
    const wl = GRID_START_NM + g;
    if (wl < startNm - 1e-9 || wl > endNm + 1e-9) out[g] = 0;
  }
  return out;
}

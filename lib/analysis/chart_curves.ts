/**
 * The one place curves are thinned for the results: every k-th point so a curve keeps at most
 * `max` points, at a fixed storage precision. Display rounding is the report builder's job.
 *
 * @module
 */
import { roundTo } from "../numeric/round.ts";
import { wavenumberToNm } from "../spectrum/axis.ts";

/** Most points a stored curve keeps (our choice: enough for any chart, small results). */
export const CURVE_POINTS = 300;

/** Decimals kept in stored curves: wavelength (nm) and ordinate values. */
const NM_DECIMALS = 2, VALUE_DECIMALS = 5;

/** Indices of every k-th point so that at most `max` remain. */
function stride(length: number, max: number): number {
  return Math.max(1, Math.ceil(length / max));
}

/** Transmittance against wavelength, thinned for the charts. */
export function thinTransmittance(
  nm: ArrayLike<number>,
  t: ArrayLike<number>,
  max = CURVE_POINTS,
): { nm: number[]; t: number[] } {
  const step = stride(nm.length, max);
  const outNm: number[] = [], outT: number[] = [];
  for (let i = 0; i < nm.length; i += step) {
    outNm.push(roundTo(nm[i]!, NM_DECIMALS));
    outT.push(roundTo(t[i]!, VALUE_DECIMALS));
  }
  return { nm: outNm, t: outT };
}

/** A band fit's data and model (on a wavenumber grid) as curves against wavelength. */
export function thinBandCurve(
  cm1: ArrayLike<number>,
  data: ArrayLike<number>,
  model: ArrayLike<number>,
  max = CURVE_POINTS,
): { nm: number[]; data: number[]; model: number[] } {
  const step = stride(cm1.length, max);
  const nm: number[] = [], d: number[] = [], m: number[] = [];
  for (let i = 0; i < cm1.length; i += step) {
    nm.push(roundTo(wavenumberToNm(cm1[i]!), NM_DECIMALS));
    d.push(roundTo(data[i]!, VALUE_DECIMALS));
    m.push(roundTo(model[i]!, VALUE_DECIMALS));
  }
  return { nm, data: d, model: m };
}

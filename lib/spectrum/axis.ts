/**
 * Spectral axis units and their conversion to wavelength in nm:
 * λ[nm] = 10⁷ / ν̃[cm⁻¹] = hc / E, with hc = 1239.841984… eV·nm (CODATA 2018 exact constants).
 *
 * @module
 */

/** Units an exported spectral axis may use. */
export type AxisUnit = "nm" | "um" | "cm-1" | "ev";

/** hc in eV·nm (CODATA 2018 exact h, c and e). */
export const HC_EV_NM = 1239.8419843320026;

/** Wavelength in nm from a value on the given axis. */
export function axisToNm(value: number, unit: AxisUnit): number {
  switch (unit) {
    case "nm":
      return value;
    case "um":
      return value * 1000;
    case "cm-1":
      return 1e7 / value;
    case "ev":
      return HC_EV_NM / value;
  }
}

/** Wavenumber in cm⁻¹ from wavelength in nm. */
export function nmToWavenumber(nm: number): number {
  return 1e7 / nm;
}

/** Photon energy in eV from wavelength in nm. */
export function nmToEv(nm: number): number {
  return HC_EV_NM / nm;
}

/** Wavelength in nm from wavenumber in cm⁻¹. */
export function wavenumberToNm(cm1: number): number {
  return 1e7 / cm1;
}

/**
 * A polished slab at normal incidence: Fresnel surface reflectance and transmittance with
 * incoherent multiple reflections, T = (1−R)² x / (1 − R² x²), x = e^(−αd) (e.g. Born & Wolf,
 * Principles of Optics; Pankove, Optical Processes in Semiconductors, eq. 4-34), and its
 * closed-form inversion: x = [√((1−R)⁴ + 4R²T²) − (1−R)²] / (2R²T)
 * = 2T / [(1−R)² + √((1−R)⁴ + 4R²T²)].
 *
 * @module
 */

/** Fresnel reflectance at normal incidence between a medium of index n and air. */
export function fresnelReflectance(n: number, nOutside = 1): number {
  return ((n - nOutside) / (n + nOutside)) ** 2;
}

/** Slab transmittance from the internal transmittance x = e^(−αd) and surface reflectance R. */
export function slabTransmittance(internal: number, r: number): number {
  return ((1 - r) ** 2 * internal) / (1 - r * r * internal * internal);
}

/**
 * Internal transmittance x = e^(−αd) of a slab from its measured transmittance T and R
 * (positive root of T R² x² + (1−R)² x − T = 0). T above the lossless limit gives x = 1.
 */
export function internalFromSlab(t: number, r: number): number {
  if (t <= 0) return 0;
  // The same root written without the cancellation of √(a² + 4R²T²) − a at small R·T.
  const a = (1 - r) ** 2;
  return Math.min(1, (2 * t) / (a + Math.sqrt(a * a + 4 * r * r * t * t)));
}

/** Transmittance of a lossless slab (x = 1): (1−R)/(1+R) = 2n/(n²+1) for n from R. */
export function losslessSlabTransmittance(r: number): number {
  return (1 - r) / (1 + r);
}

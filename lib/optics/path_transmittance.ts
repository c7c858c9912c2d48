/**
 * Transmittance of the crystal at another path length, with or without the two polished
 * surfaces: the measured slab is reduced to its internal transmittance (closed-form inversion
 * of the incoherent slab formula, or plain Beer–Lambert when reflections are ignored), scaled
 * to the new path, and the surfaces put back if wanted.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import {
  absorbanceToTransmittance,
  spectrumAbsorbance,
  transmittanceAtPath,
  transmittanceIsValues,
} from "../spectrum/ordinate.ts";
import {
  type Dispersion,
  dispersionIndex,
  getHost,
  type HostEntry,
  hostIndex,
} from "./refractive_index.ts";
import { fresnelReflectance, internalFromSlab, slabTransmittance } from "./slab.ts";
import { NeedsValueError } from "../spectrum/needs_value_error.ts";

/** How surface reflections are treated. */
export interface ReflectionSettings {
  /** `none`: Beer–Lambert on the measured absorbance; `host`: Fresnel surfaces from n(λ). */
  reflection: "none" | "host";
  /** Host by name (catalogue) or entry; needed for `host` unless `n` is given. */
  host?: string | HostEntry;
  /** Principal axis for n(λ); default from the spectrum's polarisation (o/e) or the first axis. */
  axis?: string;
  /** A constant refractive index overriding the host's dispersion. */
  n?: number;
  /** The user's own dispersion formula (e.g. Sellmeier coefficients), overriding the host's. */
  dispersion?: Dispersion;
  /** Keep the two surfaces in the output (a slab as measured); default true. */
  surfaces?: boolean;
}

/** Surface reflectance R(λ) on a spectrum's grid, with any range warnings. */
export function surfaceReflectance(
  wavelengthNm: Float64Array,
  settings: ReflectionSettings,
  polarisation?: string,
): { r: Float64Array<ArrayBuffer>; warnings: string[] } {
  const warnings: string[] = [];
  if (settings.n !== undefined) {
    return {
      r: new Float64Array(wavelengthNm.length).fill(fresnelReflectance(settings.n)),
      warnings,
    };
  }
  if (settings.dispersion) {
    const d = settings.dispersion;
    return {
      r: Float64Array.from(wavelengthNm, (nm) => fresnelReflectance(dispersionIndex(d, nm))),
      warnings,
    };
  }
  if (settings.host === undefined) {
    throw new RangeError(
      "Cannot compute surface reflections: no host or refractive index given (--host or --n; in a batch, host in the settings or the sample sheet)",
    );
  }
  const host = typeof settings.host === "string" ? getHost(settings.host) : settings.host;
  const axes = Object.keys(host.axes);
  const axis = settings.axis ??
    (polarisation === "e" && axes.includes("e") ? "e" : axes.includes("o") ? "o" : axes[0]!);
  const r = new Float64Array(wavelengthNm.length);
  let warned = false;
  wavelengthNm.forEach((nm, i) => {
    const { n, warning } = hostIndex(host, nm, axis);
    if (warning && !warned && nm >= 380 && nm <= 780) {
      warnings.push(warning);
      warned = true;
    }
    r[i] = fresnelReflectance(n);
  });
  return { r, warnings };
}

/**
 * Transmittance of a spectrum's crystal at `pathMm` under the given reflection settings.
 *
 * @param pathMm Target path in mm; when omitted, the measured path is kept.
 * @throws {RangeError} When a needed thickness, host or index is missing.
 */
export function transmittanceForPath(
  spectrum: Spectrum,
  pathMm: number | undefined,
  settings: ReflectionSettings = { reflection: "none" },
): { values: Float64Array<ArrayBuffer>; warnings: string[] } {
  return pathRescaling(spectrum, settings)(pathMm);
}

/**
 * {@linkcode transmittanceForPath} for many paths of one spectrum: what does not depend on the
 * path (the measured absorbance, R(λ), the internal absorption per mm) is worked out once;
 * each call gives the same values and warnings as transmittanceForPath.
 *
 * @throws {RangeError} When a needed thickness, host or index is missing (from the first call
 *   that needs it, as transmittanceForPath).
 */
export function pathRescaling(
  spectrum: Spectrum,
  settings: ReflectionSettings = { reflection: "none" },
): (pathMm: number | undefined) => { values: Float64Array<ArrayBuffer>; warnings: string[] } {
  const d = spectrum.thicknessMm;
  if (settings.reflection === "none") {
    let absorbance: Float64Array<ArrayBuffer> | undefined;
    const rescalable = spectrum.quantity !== "reflectance" && spectrum.quantity !== "alpha" &&
      d !== undefined && d > 0;
    return (pathMm) => {
      const floor = photometricFloorWarning(spectrum, pathMm);
      if (!rescalable || pathMm === undefined || !(pathMm >= 0)) {
        return { values: transmittanceAtPath(spectrum, pathMm), warnings: floor };
      }
      // as transmittanceAtPath: Beer–Lambert on the measured absorbance
      absorbance ??= spectrumAbsorbance(spectrum);
      const scale = pathMm / d!;
      return {
        values: absorbance.map((a) => absorbanceToTransmittance(a * scale)),
        warnings: floor,
      };
    };
  }
  let prepared: { r: Float64Array; warnings: string[]; internalPerMm: Float64Array } | undefined;
  const prepare = () => {
    const { r, warnings } = surfaceReflectance(
      spectrum.wavelengthNm,
      settings,
      spectrum.polarisation,
    );
    let internalPerMm: Float64Array;
    if (spectrum.quantity === "alpha") {
      internalPerMm = spectrum.values.map((alpha) => -alpha / 10);
    } else {
      if (d === undefined || !(d > 0)) {
        throw new NeedsValueError(
          `Cannot separate surfaces from "${spectrum.meta.sample}": the measured thickness is not known`,
          "thickness",
        );
      }
      const measured = spectrumAbsorbance(spectrum).map((a) => 10 ** -a);
      internalPerMm = measured.map((t, i) =>
        Math.log(Math.max(internalFromSlab(t, r[i]!), 1e-300)) / d
      );
    }
    return { r, warnings, internalPerMm };
  };
  const surfaces = settings.surfaces ?? true;
  return (pathMm) => {
    const floor = photometricFloorWarning(spectrum, pathMm);
    prepared ??= prepare();
    const { r, warnings, internalPerMm } = prepared;
    const path = pathMm ?? d;
    if (path === undefined) {
      throw new RangeError(
        `Cannot compute transmittance of "${spectrum.meta.sample}": no path length given`,
      );
    }
    const values = Float64Array.from(internalPerMm, (k, i) => {
      const x = Math.exp(k * path);
      return surfaces ? slabTransmittance(x, r[i]!) : x;
    });
    return { values, warnings: [...floor, ...warnings] };
  };
}

/**
 * Whether {@linkcode photometricFloorWarning} looks at the values at all: only a measured slab
 * (T, A or R, not α) of known thickness rescaled to a shorter path.
 */
export function floorMatters(
  spectrum: Pick<Spectrum, "thicknessMm" | "quantity">,
  pathMm: number | undefined,
): boolean {
  const d = spectrum.thicknessMm;
  return pathMm !== undefined && d !== undefined && pathMm < d && spectrum.quantity !== "alpha";
}

/**
 * Whether {@linkcode transmittanceForPath} gives the spectrum's values unchanged (a copy): no
 * surfaces to remove, and transmittance at its measured path (or reflectance).
 */
export function pathTransmittanceIsValues(
  spectrum: Pick<Spectrum, "quantity">,
  pathMm: number | undefined,
  settings: ReflectionSettings = { reflection: "none" },
): boolean {
  return settings.reflection === "none" && transmittanceIsValues(spectrum, pathMm);
}

/** Measured T below which a point is near the photometric floor (common practice: 0.2 %). */
export const FLOOR_TRANSMITTANCE = 0.002;

/**
 * A warning when a spectrum measured down at the photometric floor is rescaled to a shorter
 * path: there its absorbance is a lower bound, and a thinner stone would let through light the
 * measurement never saw.
 */
export function photometricFloorWarning(
  spectrum: Spectrum,
  pathMm: number | undefined,
): string[] {
  if (!floorMatters(spectrum, pathMm)) return [];
  let low = 0, fromNm = Infinity, toNm = -Infinity;
  const a = spectrum.quantity === "absorbance";
  for (let i = 0; i < spectrum.values.length; i++) {
    const v = spectrum.values[i]!;
    const t = a ? 10 ** -v : spectrum.quantity === "transmittance" ? v : 1;
    if (t < FLOOR_TRANSMITTANCE) {
      low++;
      const nm = spectrum.wavelengthNm[i]!;
      if (nm < fromNm) fromNm = nm;
      if (nm > toNm) toNm = nm;
    }
  }
  if (low === 0 || toNm < 360 || fromNm > 830) return [];
  return [
    `${low} point(s) between ${fromNm} and ${toNm} nm are below T ${FLOOR_TRANSMITTANCE} ` +
    `(near the photometric floor): rescaled to the shorter path ${pathMm} mm their absorbance ` +
    `is only a lower bound, so the colour there is uncertain`,
  ];
}

/**
 * Unpolarised transmittance of a uniaxial crystal from its o and e spectra on one grid: the
 * mean of the two transmittances. Unpolarised light is two incoherent halves, one along each
 * axis, each attenuated by its own absorption; averaging the absorbances instead would give
 * the geometric mean of T and underestimate the light that gets through.
 */
export function unpolarisedTransmittance(
  tO: ArrayLike<number>,
  tE: ArrayLike<number>,
): Float64Array<ArrayBuffer> {
  if (tO.length !== tE.length) throw new RangeError("Cannot average o and e: different grids");
  return Float64Array.from({ length: tO.length }, (_, i) => (tO[i]! + tE[i]!) / 2);
}

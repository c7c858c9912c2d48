/**
 * Colour of many spectra that share one wavelength grid, for many (illuminant, observer)
 * conditions in one pass (CIE 15:2018 §7): the weights of every condition are looked up once
 * (cached per grid, illuminant and observer), each spectrum is read once for all conditions, and
 * a PCHIP grid is carried to 1 nm once per spectrum, not once per condition.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { getIlluminant, type Illuminant } from "./illuminants.ts";
import { GRID_LENGTH } from "./grid.ts";
import { resampleTo1nm } from "./interpolate.ts";
import { type TristimulusWeights, tristimulusWeights } from "./tristimulus.ts";
import type { ColorRow } from "./spectrum_color.ts";
import { colorRow } from "./_color_row.ts";

/** Spectra on one grid: one array per spectrum, or one flat array spectrum after spectrum. */
export interface SpectraOnGrid {
  /** Ascending wavelengths of the shared grid, nm. */
  wavelengthNm: Float64Array;
  /** Transmittance or reflectance as fractions 0..1. */
  values: Float64Array | readonly Float64Array[];
}

/** One viewing condition. */
export interface ColorCondition {
  illuminant: string | Illuminant;
  /** `"2"` or `"10"`. */
  observer: string;
}

/** XYZ of every spectrum under every condition. */
export interface SpectraXyz {
  /** Number of spectra. */
  count: number;
  /** Weights per condition, in the order the conditions were given. */
  weights: TristimulusWeights[];
  /** Illuminant names per condition. */
  illuminants: string[];
  /** X, Y, Z of spectrum s under condition c at 3·(s·conditions + c). */
  xyz: Float64Array<ArrayBuffer>;
}

/** Every illuminant × observer, illuminants outer (the order of `spectrumColor`'s rows). */
export function conditionsOf(
  illuminants: (string | Illuminant)[],
  observers: string[],
): ColorCondition[] {
  const out: ColorCondition[] = [];
  for (const illuminant of illuminants) {
    for (const observer of observers) out.push({ illuminant, observer });
  }
  return out;
}

/**
 * XYZ (Y = 100 for a perfect transmitter) of many spectra on one grid under many conditions.
 *
 * @throws {RangeError} When a flat array is not a whole number of spectra, a spectrum has the
 *   wrong length, or the grid does not reach 360–830 nm.
 *
 * @example Two perfect transmitters under D65 2° and A 10° give the two whites
 * ```ts
 * import { spectraToXyz } from "./spectra_color_many.ts";
 * const nm = Float64Array.from({ length: 81 }, (_, i) => 380 + 5 * i);
 * const r = spectraToXyz({ wavelengthNm: nm, values: new Float64Array(162).fill(1) }, [
 *   { illuminant: "D65", observer: "2" },
 *   { illuminant: "A", observer: "10" },
 * ]);
 * if (r.count !== 2 || Math.abs(r.xyz[1]! - 100) > 1e-9 || Math.abs(r.xyz[10]! - 100) > 1e-9) {
 *   throw new Error("whites expected");
 * }
 * ```
 */
export function spectraToXyz(spectra: SpectraOnGrid, conditions: ColorCondition[]): SpectraXyz {
  const nm = spectra.wavelengthNm;
  const n = nm.length;
  const flat = spectra.values instanceof Float64Array ? spectra.values : undefined;
  const columns = flat ? undefined : spectra.values as readonly Float64Array[];
  const count = flat ? flat.length / n : columns!.length;
  if (!Number.isInteger(count)) {
    throw new RangeError(`Cannot split ${flat!.length} values into spectra of ${n} points`);
  }
  const m = conditions.length;
  const weights: TristimulusWeights[] = [];
  const illuminants: string[] = [];
  for (const c of conditions) {
    const illuminant = typeof c.illuminant === "string"
      ? getIlluminant(c.illuminant)
      : c.illuminant;
    illuminants.push(illuminant.name);
    weights.push(tristimulusWeights(nm, illuminant, c.observer));
  }
  const linear = weights.length > 0 && weights[0]!.wx !== undefined;
  const xyz = new Float64Array(3 * m * count);
  let one: Float64Array = new Float64Array(0);
  for (let s = 0; s < count; s++) {
    let v: Float64Array;
    let offset = 0;
    if (flat) {
      v = flat;
      offset = s * n;
    } else {
      v = columns![s]!;
      if (v.length !== n) {
        throw new RangeError(`Cannot weight spectrum ${s}: ${v.length} values for ${n} points`);
      }
    }
    let len = n;
    if (!linear) {
      // PCHIP: carried to 1 nm once, for all conditions
      one = resampleTo1nm(nm, flat ? v.subarray(offset, offset + n) : v).values;
      v = one;
      offset = 0;
      len = GRID_LENGTH;
    }
    for (let c = 0; c < m; c++) {
      const w = weights[c]!;
      const fx = linear ? w.wx! : w.gridX, fy = linear ? w.wy! : w.gridY;
      const fz = linear ? w.wz! : w.gridZ;
      let X = 0, Y = 0, Z = 0;
      for (let i = 0; i < len; i++) {
        const t = v[offset + i]!;
        X += fx[i]! * t;
        Y += fy[i]! * t;
        Z += fz[i]! * t;
      }
      const o = 3 * (s * m + c);
      xyz[o] = X;
      xyz[o + 1] = Y;
      xyz[o + 2] = Z;
    }
  }
  return { count, weights, illuminants, xyz };
}

/** Labels of the rows from {@linkcode spectraColorRows}. */
export interface SpectraRowLabels {
  /** Sample name per spectrum; default `s1`, `s2`, … */
  samples?: readonly string[];
  /** Source file shown in every row; default empty. */
  file?: string;
  /** Path length the spectra stand for, mm; default null (unknown). */
  pathMm?: number | null;
}

/**
 * Full colour rows (XYZ, x y, u′v′, CIELAB, LCh, dominant wavelength and purity, swatches,
 * luminance floor) of many spectra on one grid, for every condition, spectrum after spectrum
 * and condition after condition: the same rows `spectrumColor` gives one spectrum at a time.
 */
export function spectraColorRows(
  spectra: SpectraOnGrid,
  conditions: ColorCondition[],
  labels: SpectraRowLabels = {},
): ColorRow[] {
  const sums = spectraToXyz(spectra, conditions);
  return spectraXyzRows(sums, labels, 0, sums.count);
}

/**
 * The colour rows of spectra `from … to − 1` of {@linkcode SpectraXyz} (labelled by their
 * index in all of them), spectrum after spectrum and condition after condition, as
 * {@linkcode spectraColorRows} gives them.
 */
export function spectraXyzRows(
  { weights, illuminants, xyz }: SpectraXyz,
  labels: SpectraRowLabels,
  from: number,
  to: number,
): ColorRow[] {
  const m = weights.length;
  const rows: ColorRow[] = new Array((to - from) * m);
  const pathMm = labels.pathMm ?? null;
  const file = labels.file;
  for (let s = from; s < to; s++) {
    const meta: Spectrum["meta"] = { sample: labels.samples?.[s] ?? `s${s + 1}` };
    if (file !== undefined) meta.sourceFile = file;
    const carrier = { meta };
    for (let c = 0; c < m; c++) {
      const o = 3 * (s * m + c);
      rows[(s - from) * m + c] = colorRow(
        carrier,
        illuminants[c]!,
        pathMm,
        { X: xyz[o]!, Y: xyz[o + 1]!, Z: xyz[o + 2]! },
        weights[c]!,
      );
    }
  }
  return rows;
}

/**
 * XYZ of many spectra on one grid under many conditions, summed a stretch of points at a time
 * (a table read a stretch of rows at a time is never held whole). The sums run over the points
 * in the order {@linkcode spectraToXyz} runs them, so they are the same numbers. Linear
 * interpolation methods only (PCHIP grids need whole spectra).
 *
 * @example Two perfect transmitters, each given in two stretches, give the D65 2° white
 * ```ts
 * import { XyzSums } from "./spectra_color_many.ts";
 * const nm = Float64Array.from({ length: 81 }, (_, i) => 380 + 5 * i);
 * const sums = new XyzSums(nm, [{ illuminant: "D65", observer: "2" }], 2);
 * for (let s = 0; s < 2; s++) {
 *   sums.add(s, new Float64Array(40).fill(1), 0);
 *   sums.add(s, new Float64Array(41).fill(1), 40);
 * }
 * if (Math.abs(sums.result().xyz[4]! - 100) > 1e-9) throw new Error("white expected");
 * ```
 */
export class XyzSums {
  readonly #sums: SpectraXyz;
  readonly #n: number;
  /**
   * @throws {RangeError} When the grid needs PCHIP (irregular steps) or does not reach
   *   360–830 nm.
   */
  constructor(wavelengthNm: Float64Array, conditions: ColorCondition[], count: number) {
    const weights: TristimulusWeights[] = [];
    const illuminants: string[] = [];
    for (const c of conditions) {
      const illuminant = typeof c.illuminant === "string"
        ? getIlluminant(c.illuminant)
        : c.illuminant;
      illuminants.push(illuminant.name);
      const w = tristimulusWeights(wavelengthNm, illuminant, c.observer);
      if (w.wx === undefined) {
        throw new RangeError("Cannot sum XYZ a stretch at a time: the grid needs PCHIP");
      }
      weights.push(w);
    }
    this.#n = wavelengthNm.length;
    this.#sums = {
      count,
      weights,
      illuminants,
      xyz: new Float64Array(3 * conditions.length * count),
    };
  }

  /** Adds the values `t` of spectrum `s` at grid points `from … from + t.length − 1`. */
  add(s: number, t: Float64Array, from: number): void {
    this.addMany(s, t, t.length, from);
  }

  /**
   * Adds the values of spectra `first`, `first + 1`, … at grid points `from … from + points − 1`,
   * side by side in `t` (spectrum `first + j` at `t[j · points …]`).
   */
  addMany(first: number, t: Float64Array, points: number, from: number): void {
    const { weights, xyz } = this.#sums;
    const m = weights.length;
    if (from < 0 || from + points > this.#n || t.length % points !== 0) {
      throw new RangeError(`Cannot add points ${from}–${from + points - 1} of ${this.#n}`);
    }
    const count = t.length / points;
    for (let c = 0; c < m; c++) {
      const w = weights[c]!;
      const fx = w.wx!, fy = w.wy!, fz = w.wz!;
      for (let j = 0; j < count; j++) {
        const at = j * points;
        const o = 3 * ((first + j) * m + c);
        let X = xyz[o]!, Y = xyz[o + 1]!, Z = xyz[o + 2]!;
        for (let k = 0; k < points; k++) {
          const v = t[at + k]!, i = from + k;
          X += fx[i]! * v;
          Y += fy[i]! * v;
          Z += fz[i]! * v;
        }
        xyz[o] = X;
        xyz[o + 1] = Y;
        xyz[o + 2] = Z;
      }
    }
  }

  /** The sums so far, in the form of {@linkcode spectraToXyz}. */
  result(): SpectraXyz {
    return this.#sums;
  }
}

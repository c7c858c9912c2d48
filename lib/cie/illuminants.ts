/**
 * Registry of illuminants by name, each as a relative SPD on the 360–830 nm 1 nm grid.
 * A from its Planck definition; D65 and C tabulated (CIE 15:2018 Table 5); other D-series
 * from the daylight recipe; E equal-energy; F1–F12 tabulated (CIE 15:2018 Table 10); the
 * LED illuminants B1–B5, BH1, RGB1, V1, V2 tabulated (CIE 15:2018 Table 11).
 *
 * @module
 */
import { table as d65Table } from "./data/illuminant_d65.ts";
import { table as cTable } from "./data/illuminant_c.ts";
import { table as fTable } from "./data/illuminant_f.ts";
import { table as ledTable } from "./data/illuminant_led.ts";
import { daylightSpd, nominalToCct } from "./daylight.ts";
import { illuminantASpd } from "./illuminant_a.ts";
import { GRID_LENGTH, GRID_NM } from "./grid.ts";
import { tabulatedTo1nm } from "./_tabulated.ts";

/** A light source as used for object colour. */
export interface Illuminant {
  /** Canonical name, e.g. `D65`, `A`, `F11`, `D5500K`, or `custom:<file>`. */
  readonly name: string;
  /** What it is, in words, with its source. */
  readonly description: string;
  /** Identity for caches: the name for built-ins, name plus a digest of the SPD for custom ones. */
  readonly key: string;
  /** Relative SPD on the 1 nm grid (zero where the source is not defined). */
  readonly spd: Float64Array<ArrayBuffer>;
}

const cache = new Map<string, Illuminant>();

interface Recipe {
  name: string;
  description: string;
  build: () => Float64Array<ArrayBuffer>;
}

function make(name: string, description: string, build: () => Float64Array<ArrayBuffer>): Recipe {
  return { name, description, build };
}

function builtIn(name: string): Recipe | undefined {
  const upper = name.toUpperCase();
  if (upper === "A") {
    return make("A", "CIE A, Planckian 2856 K (CIE 15 definition)", illuminantASpd);
  }
  if (upper === "D65") {
    return make(
      "D65",
      "CIE D65, tabulated (CIE 15:2018 Table 5)",
      () => tabulatedTo1nm(d65Table.startNm, d65Table.stepNm, d65Table.columns["d65"]!, "linear"),
    );
  }
  if (upper === "C") {
    return make(
      "C",
      "CIE C, tabulated (CIE 15:2018 Table 5)",
      () => tabulatedTo1nm(cTable.startNm, cTable.stepNm, cTable.columns["c"]!, "sprague"),
    );
  }
  if (upper === "E") {
    return make("E", "Equal-energy illuminant E", () => new Float64Array(GRID_LENGTH).fill(100));
  }
  const named = /^D(50|55|75)$/.exec(upper);
  if (named) {
    const nominal = Number(named[1]) * 100;
    return make(
      upper,
      `CIE ${upper}, daylight recipe at ${nominal} K nominal`,
      () => daylightSpd(nominalToCct(nominal)),
    );
  }
  const cct = /^D(\d{4,5})K$/.exec(upper);
  if (cct) {
    const k = Number(cct[1]);
    return make(upper, `CIE daylight at ${k} K (CIE 15 recipe)`, () => daylightSpd(k));
  }
  const f = /^F(\d{1,2})$/.exec(upper);
  if (f && Number(f[1]) >= 1 && Number(f[1]) <= 12) {
    const col = fTable.columns[`f${Number(f[1])}`]!;
    return make(
      upper,
      `CIE ${upper}, tabulated (CIE 15:2018 Table 10)`,
      () => tabulatedTo1nm(fTable.startNm, fTable.stepNm, col, "sprague"),
    );
  }
  const led = /^LED-(B[1-5]|BH1|RGB1|V[12])$/.exec(upper);
  if (led) {
    const col = ledTable.columns[led[1]!.toLowerCase()]!;
    return make(
      upper,
      `CIE ${upper}, tabulated (CIE 15:2018 Table 11)`,
      () => tabulatedTo1nm(ledTable.startNm, ledTable.stepNm, col, "sprague"),
    );
  }
  return undefined;
}

/** Names accepted by {@linkcode getIlluminant} besides `D<cct>K` and custom SPDs. */
export const ILLUMINANT_NAMES = [
  "A",
  "C",
  "D50",
  "D55",
  "D65",
  "D75",
  "E",
  "F1",
  "F2",
  "F3",
  "F4",
  "F5",
  "F6",
  "F7",
  "F8",
  "F9",
  "F10",
  "F11",
  "F12",
  "LED-B1",
  "LED-B2",
  "LED-B3",
  "LED-B4",
  "LED-B5",
  "LED-BH1",
  "LED-RGB1",
  "LED-V1",
  "LED-V2",
] as const;

/**
 * Looks an illuminant up by name (case-insensitive): A, C, D50, D55, D65, D75, E, F1–F12,
 * or `D<cct>K` (e.g. `D5500K`) for daylight at a correlated colour temperature in K.
 *
 * @throws {RangeError} For an unknown name.
 */
export function getIlluminant(name: string): Illuminant {
  const key = name.trim().toUpperCase();
  const hit = cache.get(key);
  if (hit) return hit;
  const found = builtIn(key);
  if (!found) {
    throw new RangeError(
      `Unknown illuminant "${name}": use one of ${
        ILLUMINANT_NAMES.join(", ")
      }, D<cct>K or a custom SPD file`,
    );
  }
  const illuminant: Illuminant = {
    name: found.name,
    key: found.name,
    description: found.description,
    spd: found.build(),
  };
  cache.set(key, illuminant);
  return illuminant;
}

/**
 * An illuminant from a measured or published SPD (any grid, ascending nm), linearly
 * interpolated to the 1 nm grid and zero outside its own range.
 */
export function customIlluminant(
  name: string,
  wavelengthNm: ArrayLike<number>,
  power: ArrayLike<number>,
): Illuminant {
  const n = wavelengthNm.length;
  if (n < 2 || power.length !== n) {
    throw new RangeError(`Cannot use SPD "${name}": needs at least 2 points of equal length`);
  }
  const spd = new Float64Array(GRID_LENGTH);
  let j = 0;
  GRID_NM.forEach((wl, i) => {
    if (wl < wavelengthNm[0]! || wl > wavelengthNm[n - 1]!) return;
    while (j < n - 2 && wavelengthNm[j + 1]! < wl) j++;
    const a = wavelengthNm[j]!, b = wavelengthNm[j + 1]!;
    const f = (wl - a) / (b - a);
    spd[i] = power[j]! * (1 - f) + power[j + 1]! * f;
  });
  let digest = 2166136261;
  for (const v of spd) digest = Math.imul(digest ^ Math.round(v * 1e6), 16777619);
  return {
    name: `custom:${name}`,
    key: `custom:${name}#${digest >>> 0}`,
    description: `SPD read from ${name}`,
    spd,
  };
}

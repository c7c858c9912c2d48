/**
 * Reads what a column header says about its column: the spectral axis unit, or the ordinate
 * quantity (T, %T, absorbance, α, R) and a sample name.
 *
 * @module
 */
import type { AxisUnit } from "../spectrum/axis.ts";

import type { OrdinateKind } from "../spectrum/spectrum.ts";

export type { OrdinateKind };

/** What one header cell says. */
export interface HeaderReading {
  axis?: AxisUnit;
  /** True for a header that names a wavelength-type axis without a unit. */
  axisWithoutUnit?: boolean;
  ordinate?: OrdinateKind;
  /** The header text left once unit and quantity words are removed. */
  name?: string;
}

const CM1 = /(cm\s*\^?\s*[-−–]\s*1\b|cm⁻¹|1\s*\/\s*cm\b|\/cm\b|cm-1)/i;
const NM = /\bnm\b|nanomet/i;
const UM = /µm|μm|\bum\b|micron|micromet/i;
const EV = /\bev\b|electron\s*-?volt/i;
const AXIS_WORDS =
  /\b(wavelength|wave\s*length|lambda|wl|λ|wavenumber|wave\s*number|energy|photon\s*energy|x)\b|λ/i;

/** Lowercase word tokens of a header cell, with `%` kept as its own token. */
function tokens(cell: string): string[] {
  return cell.toLowerCase().replace(/%/g, " % ").split(/[^a-z0-9%α]+/).filter(Boolean);
}

/** Reads the header of the spectral axis column. */
export function readAxisHeader(cell: string): HeaderReading {
  // `wavelength_nm`: an underscore separates words as a space does
  const text = cell.trim().replace(/_/g, " ");
  if (CM1.test(text)) return { axis: "cm-1" };
  if (NM.test(text)) return { axis: "nm" };
  if (UM.test(text)) return { axis: "um" };
  if (EV.test(text)) return { axis: "ev" };
  if (/wavenumber|wave\s*number/i.test(text)) return { axis: "cm-1" };
  if (/energy/i.test(text)) return { axis: "ev" };
  if (AXIS_WORDS.test(text)) return { axisWithoutUnit: true };
  return {};
}

/** Reads the header of an ordinate column. */
export function readOrdinateHeader(cell: string): HeaderReading {
  const text = cell.trim();
  const t = tokens(text);
  const has = (...words: string[]) => words.some((w) => t.includes(w));
  const percent = t.includes("%") || has("percent", "pct");
  let ordinate: OrdinateKind | undefined;
  const only = (...words: string[]) => t.filter((w) => w !== "%").every((w) => words.includes(w));
  if (/absorption\s*coeff|alpha|α/i.test(text) || CM1.test(text)) ordinate = "alpha";
  else if (
    has("absorbance", "abs", "od") || /optical\s*density/i.test(text) ||
    (t.length > 0 && only("a", "au"))
  ) {
    ordinate = "absorbance";
  } else if (has("reflectance", "reflection", "refl") || (t.length > 0 && only("r"))) {
    ordinate = percent ? "percent-reflectance" : "reflectance";
  } else if (
    has("transmittance", "transmission", "trans") || (t.length > 0 && only("t", "fraction")) ||
    // "ruby-01 T": a name then a lone T (a lone trailing A is not read: "Sample A" is a name)
    (t.length > 1 && t[t.length - 1] === "t")
  ) {
    ordinate = percent ? "percent" : "transmittance";
  } else if (percent) {
    ordinate = "percent";
  }
  const name = text
    .replace(/[(\[{][^)\]}]*[)\]}]/g, " ")
    .replace(/%\s*[tr]\b|\b[tr]\s*%|%/gi, " ")
    .replace(
      /\b(absorbance|abs|transmittance|transmission|trans|reflectance|refl|alpha|od)\b/gi,
      " ",
    )
    .replace(/absorption\s*coeff\w*|optical\s*density|α/gi, " ")
    .replace(/[\s_:;,/|-]+$|^[\s_:;,/|-]+/g, "")
    .trim();
  const reading: HeaderReading = {};
  if (ordinate) reading.ordinate = ordinate;
  const bare = ordinate && /^[a-z]$/i.test(name) ? "" : name;
  if (bare) reading.name = bare;
  return reading;
}

/** Reads an ordinate kind from free text such as a preamble value or a CLI flag. */
export function ordinateFromText(value: string): OrdinateKind | undefined {
  const v = value.trim().toLowerCase();
  if (["transmittance", "t", "fraction"].includes(v)) return "transmittance";
  if (["percent", "%t", "t%", "%", "percent-transmittance"].includes(v)) return "percent";
  if (["absorbance", "abs", "a", "od"].includes(v)) return "absorbance";
  if (["alpha", "α"].includes(v)) return "alpha";
  if (["reflectance", "r"].includes(v)) return "reflectance";
  if (["%r", "percent-reflectance"].includes(v)) return "percent-reflectance";
  return readOrdinateHeader(value).ordinate;
}

/** Reads an axis unit from free text such as `--axis` or a preamble value. */
export function axisFromText(value: string): AxisUnit | undefined {
  const v = value.trim().toLowerCase();
  if (["nm", "um", "µm", "μm", "cm-1", "ev"].includes(v)) {
    return v === "µm" || v === "μm" ? "um" : (v as AxisUnit);
  }
  if (v === "wavenumber" || v === "1/cm") return "cm-1";
  return readAxisHeader(value).axis;
}

/**
 * Metadata of an export wherever it is written (preamble, `#` comments, footer): a key, a
 * separator (tab, colon, semicolon, comma, `=` or a wide gap), a value; units in brackets or
 * parentheses in the key (`Thickness [mm]`), a decimal comma judged per value (`1,5` is 1.5).
 *
 * @module
 */
import type { FileValue, Polarisation, ReadWarning } from "../spectrum/spectrum.ts";

/** A metadata line split into key and value. */
export interface MetadataEntry {
  key: string;
  value: string;
}

const SEPARATORS = new Set([":", "=", ";", ",", "\t"]);

/**
 * Splits one preamble, comment or footer line into key and value; undefined for a line
 * without a separator (kept verbatim by the caller). A `#` comment mark is dropped first.
 *
 * @example A unit in parentheses, then a colon and a tab
 * ```ts
 * import { splitMetadataLine } from "./read_metadata.ts";
 * const kv = splitMetadataLine("Thickness (mm):\t1,5");
 * if (kv?.key !== "Thickness (mm)" || kv.value !== "1,5") throw new Error(JSON.stringify(kv));
 * ```
 */
export function splitMetadataLine(raw: string): MetadataEntry | undefined {
  const s = raw.trim().replace(/^#+\s*/, "");
  let depth = 0;
  let at = -1;
  for (let i = 0; i < s.length && i < 200; i++) {
    const ch = s[i]!;
    if (ch === "(" || ch === "[" || ch === "{") depth++;
    else if ((ch === ")" || ch === "]" || ch === "}") && depth > 0) depth--;
    else if (depth === 0 && (SEPARATORS.has(ch) || (ch === " " && s[i + 1] === " "))) {
      at = i;
      break;
    }
  }
  if (at <= 0) {
    // no separator: words then a number with its unit ("Thickness 1.5 mm", "Path [cm] 0,15")
    const m =
      /^([A-Za-z][A-Za-z ]*?(?:\s*[(\[][^)\]]*[)\]])?)\s+([+-]?\d[\d.,]*(?:\s*[A-Za-zµμ]+)?)$/
        .exec(s);
    return m ? { key: m[1]!.trim(), value: m[2]! } : undefined;
  }
  const key = s.slice(0, at).trim();
  if (!key || /^[+-]?[\d.]+$/.test(key)) return undefined;
  const value = s.slice(at).replace(/^[\s:=;,]+/, "").replace(/[\s;,]+$/, "");
  return { key, value };
}

/**
 * A number from a metadata value, its decimal mark judged on the value alone: `1,5` and
 * `1.5` are 1.5; `1.234,5` and `1,234.5` are 1234.5; a list (`1,5,7`, `1, 5`) is no number.
 * Any text after the number (a unit) is ignored.
 *
 * @example A decimal comma in a comma-separated file's preamble
 * ```ts
 * import { parseMetaNumber } from "./read_metadata.ts";
 * if (parseMetaNumber("1,5") !== 1.5) throw new Error("1,5 is 1.5");
 * if (parseMetaNumber("1,5,7") !== undefined) throw new Error("a list is no number");
 * ```
 */
export function parseMetaNumber(value: string): number | undefined {
  const m = /^\s*([+-]?(?:\d[\d.,]*|[.,]\d+)(?:[eE][+-]?\d+)?)(?![\d.,])/.exec(value);
  if (!m) return undefined;
  let t = m[1]!;
  if (/,\s+\d/.test(value.slice(m.index))) return undefined;
  const commas = (t.match(/,/g) ?? []).length, dots = (t.match(/\./g) ?? []).length;
  if (commas > 0 && dots > 0) {
    const decimal = t.lastIndexOf(",") > t.lastIndexOf(".") ? "," : ".";
    const group = decimal === "," ? "." : ",";
    if ((t.split(decimal).length - 1) > 1) return undefined;
    t = t.split(group).join("").replace(",", ".");
  } else if (commas > 1 || dots > 1) {
    return undefined;
  } else {
    t = t.replace(",", ".");
  }
  const v = Number(t);
  return Number.isFinite(v) ? v : undefined;
}

/** mm per unit of the thickness units a file may use. */
const THICKNESS_UNITS_MM: Record<string, number> = {
  mm: 1,
  cm: 10,
  m: 1000,
  µm: 1e-3,
  μm: 1e-3,
  um: 1e-3,
  nm: 1e-6,
  mil: 0.0254, // a thousandth of an inch
  in: 25.4,
  inch: 25.4,
};

/**
 * Thickness in mm from a metadata value such as `2.00 mm`, `0,2 cm`, `1500 µm` or `59 mil`
 * (unit in the value, else in the key `Thickness (cm)`, else mm). A value with anything else
 * after its number (an unknown unit, a range `1.5-1.6`) is not a thickness: undefined.
 */
export function parseThicknessMm(value: string, key = ""): number | undefined {
  const m = /^\s*([+-]?[\d.,]+(?:[eE][+-]?\d+)?)\s*([^\s\d.,+-][^\s]*)?\s*$/.exec(value);
  if (!m) return undefined;
  const v = parseMetaNumber(m[1]!);
  if (v === undefined) return undefined;
  const keyUnit = /[(\[]\s*(mm|cm|m|µm|μm|um|nm|mil|in|inch)\s*[)\]]/i.exec(key)?.[1] ??
    (/\bcm\b/i.test(key) ? "cm" : /µm|μm|\bum\b/i.test(key) ? "um" : undefined);
  const unit = (m[2] ?? keyUnit ?? "mm").toLowerCase();
  const factor = THICKNESS_UNITS_MM[unit];
  if (factor === undefined) return undefined;
  const mm = v * factor;
  return mm > 0 && Number.isFinite(mm) ? mm : undefined;
}

/** Polarisation from a value such as `o`, `E⊥c`, `e`, `E∥c`, `unpolarised`. */
export function parsePolarisation(value: string | undefined): Polarisation | undefined {
  if (!value) return undefined;
  const v = value.trim().toLowerCase();
  if (/^(o|ordinary|e\s*(⊥|perp|_\|_)\s*c|sigma|σ)$/.test(v) || /⊥|perp/.test(v)) return "o";
  if (
    /^(e|extraordinary|e\s*(∥|\|\||par(allel)?)\s*c|pi|π)$/.test(v) || /∥|\|\||parallel/.test(v)
  ) return "e";
  if (/unpol|none|natural/.test(v)) return "unpolarised";
  return undefined;
}

/** A key reduced to its words: units in brackets dropped, lower case, single spaces. */
function keyWords(key: string): string {
  return key.replace(/[(\[{][^)\]}]*[)\]}]/g, " ").toLowerCase().replace(/[^a-z0-9]+/g, " ")
    .trim();
}

/** The usual spellings of the keys the reader interprets. */
const KEYS = {
  thickness: /\bthick|\bpath ?length\b|^(optical )?path$/,
  sample: /^(sample|specimen|sample (name|id|no)|name|id|stone)$/,
  polarisation: /^(polari[sz]ation|polari[sz]er|pol)( (state|direction|mode))?$/,
  host: /^(host|host crystal|host material|matrix|crystal|material)$/,
  operator: /^(operator|user|analyst|measured by|technician)$/,
  date: /^(date|measurement date|date time|datetime|acquired|acquisition date|created)$/,
  instrument: /^(instrument|spectrometer|spectrophotometer|device|instrument model)$/,
};

/** What the reader interprets from a file's metadata. */
export interface FileMetadata {
  thicknessMm?: FileValue<number>;
  polarisation?: FileValue<Polarisation>;
  host?: FileValue<string>;
  sample?: string;
  operator?: string;
  date?: string;
  instrument?: string;
  /** Conflicts between two lines of the same file. */
  warnings: ReadWarning[];
}

/**
 * Interprets the metadata fields of a file (in file order); the first line that states a
 * value wins and a later line that states a different one is reported.
 */
export function readFileMetadata(
  fields: Record<string, string>,
  fieldLines: Record<string, number> = {},
): FileMetadata {
  const out: FileMetadata = { warnings: [] };
  const at = (key: string) => fieldLines[key];
  const record = <T>(key: string, value: T): FileValue<T> => {
    const v: FileValue<T> = { value, source: "file", key, how: "field" };
    const line = at(key);
    if (line !== undefined) v.line = line;
    return v;
  };
  const conflict = (what: string, a: FileValue<unknown>, b: FileValue<unknown>, shown: string) =>
    out.warnings.push({
      message: `the file states ${what} twice: ${String(a.value)}${
        a.line ? ` (line ${a.line})` : ""
      } and ${shown}${b.line ? ` (line ${b.line})` : ""}; the first is used`,
      need: what === "thickness" ? "thickness" : "polarisation",
    });
  for (const [key, value] of Object.entries(fields)) {
    const words = keyWords(key);
    if (KEYS.thickness.test(words)) {
      const mm = parseThicknessMm(value, key);
      if (mm === undefined) {
        out.warnings.push({
          message: `thickness "${value.slice(0, 40)}" (${key}) is not a number with a known ` +
            `unit (mm, cm, µm, nm, mil, in): not used`,
          need: "thickness",
        });
        continue;
      }
      const v = record(key, mm);
      if (!out.thicknessMm) out.thicknessMm = v;
      else if (Math.abs(out.thicknessMm.value - mm) > 1e-9 * mm) {
        conflict("thickness", out.thicknessMm, v, `${mm}`);
      }
    } else if (KEYS.polarisation.test(words) || /polari[sz]/.test(words)) {
      const p = parsePolarisation(value);
      if (!p) continue;
      const v = record(key, p);
      if (!out.polarisation) out.polarisation = v;
      else if (out.polarisation.value !== p) conflict("polarisation", out.polarisation, v, p);
    } else if (KEYS.host.test(words) && value) {
      out.host ??= record(key, value);
    } else if (KEYS.sample.test(words) && value) {
      out.sample ??= value;
    } else if (KEYS.operator.test(words) && value) {
      out.operator ??= value;
    } else if (KEYS.date.test(words) && value) {
      out.date ??= value;
    } else if (KEYS.instrument.test(words) && value) {
      out.instrument ??= value;
    }
  }
  return out;
}

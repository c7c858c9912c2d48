/**
 * Options several commands share, defined once: how to read a file, the optics of the path,
 * the output format and the viewing conditions.
 *
 * @module
 */
import type { OptionSpec } from "./_command.ts";

/** The default observer of every command (and of batch): CIE 1931 2°. */
export const DEFAULT_OBSERVER = "2";

/** Why the 2° observer is the default, said once for help texts and README. */
export const OBSERVER_NOTE =
  "Observer: the CIE 1931 2° observer is the default everywhere. CIE 15:2018 §3 advises the 2° " +
  "observer for fields of about 1–4°; a cut stone of 5–10 mm seen at 25–35 cm subtends about " +
  "1–2°. Give --observer 10 for large slabs and wafers seen close up.";

/** What α means, said once for help texts. */
export const ALPHA_NOTE =
  "α (cm⁻¹) is natural-log based by default: T_internal = exp(−α·d), A = α·d / ln 10. Give " +
  "--alpha-base 10 for files whose α is decadic (A = α·d); they are converted on reading.";

/** How the measured file is to be read. */
export const READING_OPTIONS: OptionSpec[] = [
  {
    name: "ordinate",
    type: "string",
    arg: "KIND",
    help: "what the values are: transmittance | percent | absorbance | alpha",
    default: "read from the header or preamble",
  },
  {
    name: "axis",
    type: "string",
    arg: "UNIT",
    help: "x axis unit: nm | um | cm-1 | ev",
    default: "read from the header",
  },
  {
    name: "alpha-base",
    type: "string",
    arg: "e|10",
    help: "logarithm base of α values read or written: e (T = exp(−α·d), A = α·d/ln 10) or 10 " +
      "(decadic, A = α·d)",
    default: "e",
  },
  {
    name: "thickness",
    type: "string",
    arg: "MM",
    help: "thickness of the measured slab, mm (overrides the file's metadata)",
  },
];

/** Path length and surfaces. */
export const OPTICS_OPTIONS: OptionSpec[] = [
  { name: "path", type: "string", arg: "MM", help: "path length to compute for, mm" },
  {
    name: "reflection",
    type: "string",
    arg: "MODE",
    help: "none (Beer–Lambert on the measured absorbance, surface losses scale with the path) " +
      "or host (remove and restore the two Fresnel surfaces using n(λ))",
    default: "host when --host, --n or --sellmeier is given, else none",
  },
  {
    name: "host",
    type: "string",
    arg: "NAME",
    help: "host crystal for n(λ): corundum, yag, spinel, chrysoberyl, quartz, beryl",
    default: "corundum with --reflection host",
  },
  { name: "n", type: "string", arg: "VALUE", help: "constant refractive index instead of a host" },
  {
    name: "sellmeier",
    type: "string",
    arg: "COEFFS",
    help: "your own Sellmeier fit: B1,B2,B3:C1,C2,C3 (C in µm) or A;B…:C… (C in µm²)",
  },
];

/** `--json` and `--csv`. */
export const OUTPUT_OPTIONS: OptionSpec[] = [
  { name: "json", type: "boolean", help: "print JSON on stdout" },
  {
    name: "csv",
    type: "boolean",
    help: "print CSV with a header row on stdout (headers carry units; booleans true/false)",
  },
];

/** `--illuminant` with a command's own default and arity. */
export function illuminantOption(defaultNames: string, list = true): OptionSpec {
  return {
    name: "illuminant",
    type: "string",
    arg: list ? "LIST" : "NAME",
    help: (list ? "comma list of " : "") +
      "A, C, D50, D55, D65, D75, E, F1…F12, LED-B1…LED-V2, D<cct>K, or an SPD file",
    default: defaultNames,
  };
}

/** `--observer` (2 = CIE 1931, 10 = CIE 1964), default 2°. */
export function observerOption(list = true): OptionSpec {
  return {
    name: "observer",
    type: "string",
    arg: list ? "LIST" : "2|10",
    help: (list ? "comma list: " : "") + "2 (CIE 1931 2°) or 10 (CIE 1964 10°)",
    default: DEFAULT_OBSERVER,
  };
}

/**
 * The uncertainty options of `color` and `change`: which route (first order or Monte Carlo),
 * and the standard uncertainty of each input. `--uncertainty` alone is first order;
 * `--uncertainty mc` (or `--uncertainty-mode mc`) is Monte Carlo.
 *
 * @module
 */
import type { Spectrum } from "../lib/spectrum/spectrum.ts";
import {
  type ColorUncertainty,
  type ColorUncertaintyOptions,
  spectrumColorUncertainty,
  type UncertaintySources,
} from "../lib/cie/color_uncertainty.ts";
import { DEFAULT_DRAWS, spectrumColorMonteCarlo } from "../lib/cie/color_monte_carlo.ts";
import {
  colorChangeUncertainty,
  type ColorChangeUncertaintyOptions,
} from "../lib/cie/color_difference_uncertainty.ts";
import type { Illuminant } from "../lib/cie/illuminants.ts";
import { log, UsageError } from "./_shared.ts";
import type { OptionSpec, ParsedArgs } from "./_command.ts";

/** The uncertainty options (GUM first order or JCGM 101 Monte Carlo). */
export const UNCERTAINTY_OPTIONS: OptionSpec[] = [
  {
    name: "uncertainty",
    type: "boolean",
    help:
      'add standard uncertainties (k = 1): first order (GUM, JCGM 100) by default, Monte Carlo (JCGM 101) with "--uncertainty mc"; a file named mc: write ./mc',
  },
  {
    name: "uncertainty-mode",
    type: "string",
    arg: "linear|mc",
    help: "the same choice as an option",
    default: "linear",
  },
  {
    name: "draws",
    type: "string",
    arg: "N",
    help: "Monte Carlo draws",
    default: String(DEFAULT_DRAWS),
  },
  { name: "seed", type: "string", arg: "N", help: "Monte Carlo seed", default: "1" },
  {
    name: "noise-sd",
    type: "string",
    arg: "V",
    help:
      "photometric noise per point in the spectrum's ordinate (T as a fraction, so 0.3 %T is 0.003; A; α in cm⁻¹)",
    default: "estimated from the spectrum's high-frequency residual, and said so",
  },
  {
    name: "offset-sd",
    type: "string",
    arg: "V",
    help: "zero/100 % level error, same unit, fully correlated",
    default: "0",
  },
  {
    name: "wavelength-sd",
    type: "string",
    arg: "NM",
    help: "wavelength-scale error, a shift",
    default: "0",
  },
  { name: "thickness-sd", type: "string", arg: "MM", help: "measured thickness", default: "0" },
  { name: "path-sd", type: "string", arg: "MM", help: "target path", default: "0" },
];

/** Uncertainty settings from parsed arguments, or undefined without `--uncertainty`. */
export function uncertaintyFromArgs(args: ParsedArgs): UncertaintySettings | undefined {
  const values: UncertaintyValues = { uncertainty: args.flag("uncertainty") };
  for (const o of UNCERTAINTY_OPTIONS) {
    if (o.type === "string") {
      (values as Record<string, string | undefined>)[o.name] = args.string(o.name);
    }
  }
  return uncertaintyFrom(values);
}

/** Scalar uncertainty columns of a colour row. */
export const COLOR_UNCERTAINTY_COLUMNS = [
  "LSd",
  "aSd",
  "bSd",
  "CSd",
  "hSd",
  "uncertaintyMode",
  "noiseSd",
  "noiseSource",
];

/** What the uncertainty options ask for. */
export interface UncertaintySettings {
  mode: "linear" | "mc";
  draws: number;
  seed: number;
  sources: UncertaintySources;
}

const MODES = ["linear", "mc"];

/**
 * Rewrites `--uncertainty mc` / `--uncertainty linear` / `--uncertainty=mc` into
 * `--uncertainty --uncertainty-mode=…`, so `--uncertainty` can stay a flag.
 */
export function normaliseUncertaintyArgs(args: string[]): string[] {
  const out: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const a = args[i]!;
    if (a === "--") {
      out.push(...args.slice(i));
      break;
    }
    const eq = /^--uncertainty=(.*)$/.exec(a);
    if (eq) {
      out.push("--uncertainty", `--uncertainty-mode=${eq[1]}`);
    } else if (a === "--uncertainty" && MODES.includes(args[i + 1] ?? "")) {
      out.push(a, `--uncertainty-mode=${args[i + 1]}`);
      i++;
    } else out.push(a);
  }
  return out;
}

function sdOption(value: string | undefined, option: string): number | undefined {
  if (value === undefined) return undefined;
  const v = Number(value.replace(",", "."));
  if (!(v >= 0) || !Number.isFinite(v)) {
    throw new UsageError(`Option --${option} needs a number ≥ 0, got "${value}"`);
  }
  return v;
}

function integerOption(value: string | undefined, option: string, min: number): number | undefined {
  if (value === undefined) return undefined;
  const v = Number(value);
  if (!Number.isInteger(v) || v < min) {
    throw new UsageError(`Option --${option} needs an integer ≥ ${min}, got "${value}"`);
  }
  return v;
}

type UncertaintyValues = {
  uncertainty?: boolean | undefined;
  "uncertainty-mode"?: string | undefined;
  draws?: string | undefined;
  seed?: string | undefined;
  "noise-sd"?: string | undefined;
  "offset-sd"?: string | undefined;
  "wavelength-sd"?: string | undefined;
  "thickness-sd"?: string | undefined;
  "path-sd"?: string | undefined;
};

/**
 * Uncertainty settings from the options, or undefined without `--uncertainty`.
 *
 * @throws {UsageError} For an unknown mode, a bad number, or a σ option without `--uncertainty`.
 */
export function uncertaintyFrom(values: UncertaintyValues): UncertaintySettings | undefined {
  const given = (UNCERTAINTY_OPTIONS.map((o) => o.name) as (keyof UncertaintyValues)[]).filter((
    k,
  ) => k !== "uncertainty" && values[k] !== undefined);
  if (!values.uncertainty) {
    if (given.length) {
      throw new UsageError(`Option --${given[0]} needs --uncertainty`);
    }
    return undefined;
  }
  const mode = values["uncertainty-mode"] ?? "linear";
  if (!MODES.includes(mode)) {
    throw new UsageError(`Unknown uncertainty mode "${mode}": use linear or mc`);
  }
  const sources: UncertaintySources = {};
  const put = (key: keyof UncertaintySources, option: keyof UncertaintyValues) => {
    const v = sdOption(values[option] as string | undefined, option);
    if (v !== undefined) (sources as Record<string, number>)[key] = v;
  };
  put("noiseSd", "noise-sd");
  put("offsetSd", "offset-sd");
  put("wavelengthSdNm", "wavelength-sd");
  put("thicknessSdMm", "thickness-sd");
  put("pathSdMm", "path-sd");
  return {
    mode: mode as "linear" | "mc",
    draws: integerOption(values.draws, "draws", 2) ?? DEFAULT_DRAWS,
    seed: integerOption(values.seed, "seed", 0) ?? 1,
    sources,
  };
}

/** Colour options shared with `spectrumColor`. */
type RowOptions = {
  illuminants: (string | Illuminant)[];
  observers: string[];
  reflection: NonNullable<ColorUncertaintyOptions["reflection"]>;
  pathMm?: number;
};

/** Says on stderr when the noise was estimated, with the figure used. */
function reportEstimate(u: ColorUncertainty | undefined, file: string, sample: string): void {
  if (u?.sources.noiseSource !== "estimated") return;
  log(
    `crystint: ${file}: ${sample}: noise σ estimated from the high-frequency residual: ${
      u.sources.noiseSd.toPrecision(3)
    } (median; give --noise-sd to set it)`,
  );
}

/**
 * Colour rows of one spectrum with their uncertainties merged in (same order as
 * `spectrumColor`): LSd, aSd, bSd, CSd, hSd, labCovariance and the stated sources.
 */
export function withColorUncertainty<T extends object>(
  rows: T[],
  spectrum: Spectrum,
  settings: UncertaintySettings,
  options: RowOptions,
  file: string,
): (T & Record<string, unknown>)[] {
  const common = { ...options, sources: settings.sources };
  const list = settings.mode === "mc"
    ? spectrumColorMonteCarlo(spectrum, { ...common, draws: settings.draws, seed: settings.seed })
    : spectrumColorUncertainty(spectrum, common);
  reportEstimate(list[0], file, spectrum.meta.sample);
  return rows.map((row, i) => {
    const u = list[i]!;
    return {
      ...row,
      LSd: u.LSd,
      aSd: u.aSd,
      bSd: u.bSd,
      CSd: u.CSd,
      hSd: u.hSd,
      labCovariance: u.labCovariance,
      uncertaintyMode: u.mode,
      noiseSd: u.sources.noiseSd,
      noiseSource: u.sources.noiseSource,
      uncertainty: {
        mode: u.mode,
        sources: u.sources,
        notes: u.notes,
        ...(u.budget ? { budget: u.budget } : {}),
        ...(u.draws === undefined ? {} : { draws: u.draws, seed: u.seed }),
        ...(u.interval95 ? { labMean: u.labMean, interval95: u.interval95 } : {}),
      },
    };
  });
}

/** σ of the ΔE00 colour change of one spectrum, for a `change` row. */
export function changeUncertainty(
  spectrum: Spectrum,
  from: string | Illuminant,
  to: string | Illuminant,
  observer: string,
  settings: UncertaintySettings,
  options: Omit<ColorChangeUncertaintyOptions, "mode" | "draws" | "seed" | "sources">,
): Record<string, unknown> {
  const u = colorChangeUncertainty(spectrum, from, to, observer, {
    ...options,
    mode: settings.mode,
    draws: settings.draws,
    seed: settings.seed,
    sources: settings.sources,
  });
  return {
    dE00Sd: u.dE00Sd,
    uncertaintyMode: u.mode,
    noiseSd: u.sources.noiseSd,
    noiseSource: u.sources.noiseSource,
    uncertainty: {
      mode: u.mode,
      sources: u.sources,
      ...(u.draws === undefined
        ? {}
        : { draws: u.draws, seed: u.seed, dE00Mean: u.dE00Mean, dE00Interval95: u.dE00Interval95 }),
    },
  };
}

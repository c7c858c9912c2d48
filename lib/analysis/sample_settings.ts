/**
 * What the analysis of one sample is configured by, after the sample sheet and the batch
 * settings have been applied (the batch layer builds it; a notebook can write it by hand).
 *
 * @module
 */
import type { ReadOptions } from "../io/read_spectra.ts";
import type { ReflectionSettings } from "../optics/path_transmittance.ts";
import type { Calibration } from "../dopant/linear_calibration.ts";
import type { UncertaintySources } from "../cie/color_uncertainty.ts";

/** A target colour under one illuminant. */
export interface TargetColor {
  /** CIELAB L*. */
  L: number;
  /** CIELAB a*. */
  a: number;
  /** CIELAB b*. */
  b: number;
  /** Illuminant the target colour is meant under, e.g. `"D65"`. */
  illuminant: string;
}

/** A target colour with its tolerance: under one illuminant, or several (e.g. D65 and A). */
export interface TargetSetting extends TargetColor {
  /** Observer of the target colours, `"2"` or `"10"`. */
  observer: string;
  /** Pass when ΔE00 ≤ this under every illuminant (common practice, not a standard). */
  toleranceDE00: number;
  /** The same target under further illuminants. */
  also: TargetColor[];
  /** A reference spectrum the target colours are taken from (resolved before the run). */
  spectrum?: string;
  /** Path for the reference spectrum's colour, mm (default: as measured). */
  spectrumPathMm?: number;
}

/** The colour change to report: from one illuminant to another, for one observer. */
export interface ChangeSetting {
  /** Illuminant of the first colour (usually D65). */
  from: string;
  /** Illuminant of the second colour (usually A). */
  to: string;
  /** Observer, `"2"` or `"10"`. */
  observer: string;
  /** Chromatic adaptation before comparing, or none (each colour under its own white). */
  adapt: "none" | "cat16" | "bradford";
}

/** The thickness series range; `targetL` asks for the path that reaches that L*. */
export interface SeriesSetting {
  /** Shortest path, mm. */
  fromMm: number;
  /** Longest path, mm. */
  toMm: number;
  /** Number of paths (geometric steps). */
  steps: number;
  /** L* whose path is wanted, when set. */
  targetL?: number;
}

/** Settings for one sample. */
export interface SampleSettings {
  /** How to read the file (overrides for what the file does not say). */
  read: ReadOptions;
  /** Thickness used when neither the file nor the sample sheet gives one, mm. */
  fallbackThicknessMm?: number;
  /** Path of the finished stone, mm (default: as measured). */
  pathMm?: number;
  /** How the surfaces are treated when the path is rescaled. */
  reflection: ReflectionSettings;
  /** Illuminants of the colour rows. */
  illuminants: string[];
  /** Observers of the colour rows, `"2"` and/or `"10"`. */
  observers: string[];
  /** The colour change to compute. */
  change: ChangeSetting;
  /** The thickness series to compute. */
  series: SeriesSetting;
  /** The target to check against, with its name. */
  target?: TargetSetting & { name: string };
  /** |Δh| from which a change is called marked, degrees (common practice). */
  changeHueThresholdDeg: number;
  /** Smallest C*ab under both lights for a change to be called marked (common practice). */
  changeMinChroma: number;
  /** Free notes carried into the results. */
  notes?: string;
  /** Further sample-sheet columns carried into the results. */
  extra: Record<string, string>;
  /** Sample name from the sample sheet (used when the file holds one spectrum). */
  sampleName?: string;
  /** Polarisation from the sample sheet (used when the file does not say). */
  polarisation?: string;
  /** Calibration to estimate the dopant level with, and its name. */
  calibration?: Calibration & { name: string };
  /** Uncertainty sources; omitted: no uncertainties are computed. */
  uncertainty?: UncertaintySetting;
}

/** What the uncertainty step is configured by. */
export interface UncertaintySetting {
  /** The sources; photometric noise is estimated from the spectrum when not given. */
  sources: UncertaintySources;
  /** Smallest pass probability that is a pass (default 0.95). */
  passAt?: number;
  /** Largest pass probability that is a fail (default 0.05). */
  failAt?: number;
}

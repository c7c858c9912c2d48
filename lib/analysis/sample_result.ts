/**
 * The results contract: everything computed for one spectrum, as plain JSON. The batch writes
 * it to results.json and the report is rendered from it alone.
 *
 * @module
 */
import type { StoredAxis, StoredCurve } from "./chart_curves.ts";
import type { ColorRow } from "../cie/spectrum_color.ts";
import type { ColorChange } from "../cie/color_change.ts";
import type { ThicknessSeries } from "../cie/thickness_series.ts";
import type { TargetCheck } from "../dopant/target.ts";
import type { BandFit } from "../bands/fit_bands.ts";
import type { BandAssignment } from "../bands/assign_bands.ts";
import type { BandAnalysis } from "../bands/analyse_bands.ts";
import type { TargetVerdict } from "../dopant/target_probability.ts";
import type { Provenance } from "./provenance_step.ts";
import type { ResolvedUncertaintySources } from "../cie/color_uncertainty.ts";

/** The colour change of a sample, with the swatches of both colors. */
export interface ChangeResult extends ColorChange {
  /** sRGB swatch under the first illuminant. */
  swatchFrom: string;
  /** sRGB swatch under the second illuminant. */
  swatchTo: string;
  /** Whether the change is large enough to be called marked (see the settings' thresholds). */
  marked: boolean;
}

/** One target check under one illuminant. */
export interface TargetConditionCheck extends TargetCheck {
  /** Illuminant of this check. */
  illuminant: string;
  /** Target L*. */
  L: number;
  /** Target a*. */
  a: number;
  /** Target b*. */
  b: number;
  /** The sample's colour under this illuminant. */
  measured: { L: number; a: number; b: number };
  /** Probability that the true colour is within tolerance (with uncertainties on). */
  passProbability?: number;
  /** Verdict with guard bands (with uncertainties on). */
  verdict?: TargetVerdict;
}

/** The target verdict over all its illuminants (pass and dE00 cover all of them). */
export interface TargetResult extends TargetConditionCheck {
  /** Target name (from the settings). */
  name: string;
  /** Observer of the target. */
  observer: string;
  /** One check per illuminant of the target. */
  checks: TargetConditionCheck[];
  /** The decision rule of the verdict, in words (with uncertainties on). */
  rule?: string;
}

/** The dopant level from a calibration. */
export interface DopantResult {
  /** Calibration name. */
  calibration: string;
  /** Response metric of the calibration. */
  metric: string;
  /** The sample's response. */
  response: number;
  /** Estimated concentration. */
  concentration: number;
  /** Standard uncertainty of the concentration. */
  sigma: number;
  /** Half-width of the 95 % interval. */
  halfWidth95: number;
  /** Concentration unit of the calibration. */
  unit: string;
  /** Whether the response lies outside the calibrated range. */
  outsideRange: boolean;
}

/** A curve for the charts: x in nm, y values, both at storage precision. */
export interface Curve {
  /** Wavelengths, nm. */
  nm: number[];
  /** Values at those wavelengths. */
  y: number[];
}

/** The fitted bands of the measured absorbance (or α), with assignment hints. */
export interface BandsResult {
  /** What the fitted ordinate was. */
  ordinate: BandFit["ordinate"];
  /** Fitted bands. */
  bands: BandFit["bands"];
  /** Fitted baseline. */
  baseline: BandFit["baseline"];
  /** RMS residual of the fit. */
  residualRms: number;
  /** Photometric noise σ of the ordinate, from the residual of a smooth fit (null: unknown). */
  noiseSigma: number | null;
  /** χ² per degree of freedom of the final fit (null when the noise is unknown). */
  reducedChi2: number | null;
  /** Whether the fit converged. */
  converged: boolean;
  /** Assignment hints (catalogue matches). */
  assignments: BandAssignment[];
  /** Stretches left out of detection and fitting (saturation, photometric floor, edge). */
  excluded: BandAnalysis["excluded"];
  /** What the fit wants the reader to know (unresolved structure, held parameters…). */
  warnings: string[];
  /** Parameters held at a bound (left out of the covariance). */
  held: BandAnalysis["held"];
  /** The bands as α (cm⁻¹), when the thickness is known. */
  bandsAlpha?: BandFit["bands"];
  /** Base of `bandsAlpha`: natural logarithm (A = α·d / ln 10). */
  alphaBase?: "natural";
  /** The fitted data and model, for the charts. */
  /** Data and model against wavelength; the axis as `chart_curves.ts` stores it. */
  curve: { nm: StoredAxis; data: StoredCurve; model: StoredCurve };
}

/** The result for one spectrum. */
export interface SampleResult {
  /** Sample name. */
  sample: string;
  /** File the spectrum was read from. */
  file: string;
  /** Measured quantity (transmittance, absorbance, alpha…). */
  quantity: string;
  /** Measured thickness, mm. */
  thicknessMm: number | null;
  /** Path the colours are computed for, mm. */
  pathMm: number | null;
  /** Polarisation of the measurement. */
  polarisation: string | null;
  /** Host crystal, when known. */
  host: string | null;
  /** Notes from the sample sheet. */
  notes: string;
  /** Further sample-sheet columns. */
  extra: Record<string, string>;
  /** What the analysis wants the reader to know. */
  warnings: string[];
  /** Colour rows, one per illuminant and observer. */
  color: ColorRow[];
  /** The colour change. */
  change: ChangeResult;
  /** Colour against path length, when the thickness is known. */
  series: ThicknessSeries | null;
  /** Target verdict, when a target applies. */
  target: TargetResult | null;
  /** Transmittance at the reporting path, for the charts. */
  /** Transmittance against wavelength; the axis as `chart_curves.ts` stores it. */
  plot: { nm: StoredAxis; t: StoredCurve };
  /** Dopant level from the calibration, when one applies. */
  dopant: DopantResult | null;
  /** Fitted bands, or null when the fit was not possible. */
  bands: BandsResult | null;
  /** Standard uncertainties (k = 1), when the settings ask for them. */
  uncertainty: UncertaintyResult | null;
  /** Where thickness, path, host, polarisation, ordinate and axis came from. */
  provenance: Provenance;
}

/** The uncertainty of one colour row. */
export interface ColorRowUncertainty {
  /** Illuminant of the row. */
  illuminant: string;
  /** Observer of the row. */
  observer: string;
  /** σ of L*. */
  LSd: number;
  /** σ of a*. */
  aSd: number;
  /** σ of b*. */
  bSd: number;
  /** σ of C*ab. */
  CSd: number;
  /** σ of h_ab in degrees; null where the hue is undefined (C* = 0). */
  hSd: number | null;
  /** Covariance of (L*, a*, b*), 3×3. */
  labCovariance: number[][];
}

/** The uncertainties of a sample, with the sources they come from. */
export interface UncertaintyResult {
  /** One per colour row. */
  rows: ColorRowUncertainty[];
  /** σ of the colour change's ΔE00 (the two colours correlated). */
  changeDE00Sd: number | null;
  /** The sources used (noise given or estimated, and said so). */
  sources: ResolvedUncertaintySources;
  /** What the numbers leave out or could not include. */
  notes: string[];
}

/**
 * crystint — colour, bands and dopant levels of doped oxide crystals from their spectra.
 *
 * The curated face of the library, for notebooks and other Deno programs: read an export into
 * spectra, compute CIE colour at any path length, colour differences and change, fit bands,
 * calibrate and predict dopant levels, aim a doping at a target colour, or run the whole
 * analysis of one sample. Everything here is pure computation except `readSpectrumFile`, which
 * reads one file (needs `--allow-read`). The batch runner and the report writer live in the
 * CLI's layers (`lib/batch`, `lib/report`), not here; each area's own `mod.ts` has the rest.
 *
 * @example Colour of a stone at its finished path, from an export's bytes
 * ```ts
 * import { readSpectraFromBytes, spectrumColor } from "./mod.ts";
 * const rows = ["wavelength_nm,T"];
 * for (let nm = 360; nm <= 830; nm += 5) rows.push(`${nm},${nm > 600 ? 0.8 : 0.3}`);
 * const [stone] = readSpectraFromBytes(new TextEncoder().encode(rows.join("\n")), "red.csv", {
 *   thicknessMm: 2,
 * });
 * const [day] = spectrumColor(stone!, { illuminants: ["D65"], observers: ["2"], pathMm: 6 });
 * if (!(day!.a > 0 && day!.L < 80)) throw new Error("a red stone should have a* > 0");
 * ```
 *
 * @example Reading a batch's results.json: unpack it first (shared tables, step-text curves)
 * ```ts
 * import { curveValues, unpackResults } from "./mod.ts";
 * // in a notebook: const text = await Deno.readTextFile("out/results.json");
 * const text = `{"samples": [{"sample": "S1", "file": "S1.csv",
 *     "color": {"shape": 0, "rows": [["D65", "2", 90.146]]},
 *     "plot": {"nm": {"from": 360, "step": 2, "count": 3}, "t": {"q": 1000, "order": 1, "text": "Cy8et"}}}],
 *   "errors": [], "shared": {"shapes": [["illuminant", "observer", "L"]], "catalogue": []}}`;
 * const doc = unpackResults(JSON.parse(text));
 * const first = doc.samples[0]!;
 * if (first.color[0]!.sample !== "S1" || first.color[0]!.L !== 90.146) throw new Error("row");
 * if (curveValues(first.plot.t).join() !== "0.8,0.799,0.8") throw new Error("curve");
 * ```
 *
 * @example Colour difference of two CIELAB colours (Sharma, Wu & Dalal 2005, pair 1)
 * ```ts
 * import { deltaE2000 } from "./mod.ts";
 * const dE = deltaE2000({ L: 50, a: 2.6772, b: -79.7751 }, { L: 50, a: 0, b: -82.7485 });
 * if (Math.abs(dE - 2.0425) > 1e-4) throw new Error(String(dE));
 * ```

 * @example Path rescaling with both Fresnel surfaces (incoherent slab, closed form)
 * ```ts
 * import { readSpectraFromBytes, transmittanceForPath } from "./mod.ts";
 * const rows = ["wavelength_nm,T"];
 * for (let nm = 360; nm <= 830; nm += 10) rows.push(`${nm},0.6`);
 * const [slab] = readSpectraFromBytes(new TextEncoder().encode(rows.join("\n")), "s.csv", {
 *   thicknessMm: 2,
 * });
 * const n = 1.76, R = ((n - 1) / (n + 1)) ** 2;
 * const t4 = transmittanceForPath(slab!, 4, { reflection: "host", n }).values[0]!;
 * // internal transmittance x from T = (1−R)²x / (1 − R²x²), then x doubles its exponent
 * const x2 = (-((1 - R) ** 2) + Math.sqrt((1 - R) ** 4 + 4 * R * R * 0.36)) / (2 * R * R * 0.6);
 * const x4 = x2 * x2;
 * const expected = ((1 - R) ** 2 * x4) / (1 - R * R * x4 * x4);
 * if (Math.abs(t4 - expected) > 1e-9) throw new Error(`${t4} vs ${expected}`);
 * ```
 *
 * @example Colour change D65 → A: a neutral grey does not change (each under its own white)
 * ```ts
 * import { colorChange } from "./mod.ts";
 * const nm = Array.from({ length: 48 }, (_, i) => 360 + 10 * i);
 * const grey = colorChange(nm, nm.map(() => 0.4), "D65", "A", "2");
 * if (grey.dE00 > 1e-6) throw new Error(String(grey.dE00));
 * const red = colorChange(nm, nm.map((w) => (w > 620 ? 0.9 : 0.05)), "D65", "A", "2");
 * if (!(red.dE00 > 1)) throw new Error("a red filter changes visibly between D65 and A");
 * ```
 *
 * @example Band fit in wavenumber: a Gaussian band's centre, width and area come back
 * ```ts
 * import { fitBandsCm1 } from "./mod.ts";
 * const K = 2 * Math.sqrt(2 * Math.LN2); // FWHM = K·σ of a Gaussian
 * const x = Array.from({ length: 600 }, (_, i) => 12000 + 20 * i);
 * const y = x.map((v) => 0.02 + 0.8 * Math.exp(-0.5 * ((v - 18000) / (2000 / K)) ** 2));
 * const fit = fitBandsCm1(x, y, {
 *   candidates: [{ centerCm1: 17800, fwhmCm1: 2200, height: 0.7, significance: 10 }],
 * });
 * const band = fit.bands[0]!;
 * if (Math.abs(band.centerCm1 - 18000) > 5) throw new Error(String(band.centerCm1));
 * // area of a Gaussian: height · FWHM · √(π / (4 ln 2))
 * const area = 0.8 * 2000 * Math.sqrt(Math.PI / (4 * Math.LN2));
 * if (Math.abs(band.area / area - 1) > 0.01) throw new Error(String(band.area));
 * ```
 *
 * @example Calibration and inverse prediction (Miller & Miller's worked example: x0 = 6.21)
 * ```ts
 * import { fitCalibration, predictConcentration } from "./mod.ts";
 * const x = [0, 2, 4, 6, 8, 10, 12], y = [2.1, 5.0, 9.0, 12.6, 17.3, 21.0, 24.7];
 * const cal = fitCalibration(x.map((xi, i) => ({ x: xi, y: y[i]! })), "ols", "pg/ml");
 * if (Math.abs(cal.slope - 1.93) > 0.005) throw new Error(String(cal.slope));
 * const p = predictConcentration(cal, 13.5);
 * if (Math.abs(p.x - 6.21) > 0.01 || Math.abs(p.sigma - 0.24) > 0.01) throw new Error(String(p.x));
 * ```
 *
 * @example Aim: the level that gives a target colour is found again from that colour
 * ```ts
 * import { aimDoping, type AimProblem, predictLab } from "./mod.ts";
 * const nm = Float64Array.from({ length: 95 }, (_, i) => 360 + 5 * i);
 * // an invented green-absorbing dopant: α per unit level peaks at 550 nm
 * const perUnit = nm.map((w) => 2 * Math.exp(-0.5 * ((w - 550) / 40) ** 2));
 * const problem: AimProblem = {
 *   wavelengthNm: nm,
 *   dopants: [{ name: "X", alphaPerUnit: perUnit }],
 *   path: 5,
 *   targets: [],
 * };
 * const [lab] = predictLab({ ...problem, targets: [{ lab: { L: 0, a: 0, b: 0 }, illuminant: "D65", observer: "2" }] }, [0.7], 5);
 * const result = aimDoping({ ...problem, targets: [{ lab: lab!, illuminant: "D65", observer: "2" }] });
 * if (Math.abs(result.levels.X! - 0.7) > 0.01 || !result.reachable) throw new Error(result.message);
 * ```
 *
 * @module
 */
export type { Polarisation, Quantity, Spectrum, SpectrumMeta } from "./spectrum/spectrum.ts";
export { type NeededValue, NeedsValueError } from "./spectrum/needs_value_error.ts";
export { InputError } from "./io/input_error.ts";
export { type ReadOptions, readSpectraFromBytes } from "./io/read_spectra.ts";
export { readSpectrumFile } from "./io/read_file.ts";
export { type JcampWriteOptions, writeJcamp } from "./io/write_jcamp.ts";

export { type ColorOptions, type ColorRow, spectrumColor } from "./cie/spectrum_color.ts";
export type { Lab } from "./cie/spaces.ts";
export { deltaE2000, deltaE94 } from "./cie/delta_e.ts";
export { type ColorChange, colorChange } from "./cie/color_change.ts";
export { getIlluminant, type Illuminant } from "./cie/illuminants.ts";
export {
  type ColorUncertainty,
  spectrumColorUncertainty,
  type UncertaintySources,
} from "./cie/color_uncertainty.ts";

export { type ReflectionSettings, transmittanceForPath } from "./optics/path_transmittance.ts";

export { type BandFit, fitBandsCm1, type FitOptions, type FittedBand } from "./bands/fit_bands.ts";
export { analyseBands, type BandAnalysis } from "./bands/analyse_bands.ts";

export {
  type Calibration,
  fitCalibration,
  predictConcentration,
} from "./dopant/linear_calibration.ts";
export { spectrumResponse } from "./dopant/response_metric.ts";
export { aimDoping, type AimProblem, type AimResult, predictLab } from "./dopant/aim_doping.ts";
export { targetPassProbability, type TargetProbability } from "./dopant/target_probability.ts";

export { analyseFile, analyseSample } from "./analysis/analyse_sample.ts";
export type { SampleSettings } from "./analysis/sample_settings.ts";
export type { SampleResult } from "./analysis/sample_result.ts";
export {
  axisValues,
  curveValues,
  type PackedCurve,
  type StoredAxis,
  type StoredCurve,
  type TextCurve,
  type UniformAxis,
} from "./analysis/chart_curves.ts";
export {
  type SharedTables,
  type StoredCatalogueEntry,
  unpackResults,
  unpackSample,
} from "./analysis/results_packing.ts";
export type { ResultsDocument } from "./analysis/results_document.ts";
export { type ConvertOptions, convertSpectrum } from "./analysis/convert_spectrum.ts";
export { VERSION } from "./version.ts";

// Types the functions above take and return (documented where they are defined).
export type { ConvertedSpectrum, SpectralGrid } from "./analysis/convert_spectrum.ts";
export type { Provenance } from "./analysis/provenance_step.ts";
export type { ResultsError, ResultsHeader } from "./analysis/results_document.ts";
export type {
  BandsResult,
  ChangeResult,
  DopantResult,
  TargetResult,
  UncertaintyResult,
} from "./analysis/sample_result.ts";
export type {
  ChangeSetting,
  SeriesSetting,
  SheetValues,
  TargetSetting,
  UncertaintySetting,
} from "./analysis/sample_settings.ts";
export type { BandAnalysisOptions, EdgeReport, HeldParameter } from "./bands/analyse_bands.ts";
export type { BandAssignment } from "./bands/assign_bands.ts";
export type { BandShape } from "./bands/band_model.ts";
export type { BandCandidate } from "./bands/detect_bands.ts";
export type { BaselineTerm, FittedBaseline, ModelTried } from "./bands/fit_bands.ts";
export type { ExcludedRange } from "./bands/usable_range.ts";
export type { AdaptationMethod } from "./cie/adaptation.ts";
export type {
  ColorUncertaintyOptions,
  LabSd,
  ResolvedUncertaintySources,
  SourceName,
} from "./cie/color_uncertainty.ts";
export type { DeltaE2000Options, DeltaE94Options } from "./cie/delta_e.ts";
export type { InterpolationMethod } from "./cie/interpolate.ts";
export type { ThicknessSeries } from "./cie/thickness_series.ts";
export type { AimTarget, DopantSpectrum } from "./dopant/aim_doping.ts";
export type { CalibrationMode, CalibrationPoint, Prediction } from "./dopant/linear_calibration.ts";
export type { MetricOptions, Response, ResponseMetric } from "./dopant/response_metric.ts";
export type { TargetProbabilityOptions, TargetVerdict } from "./dopant/target_probability.ts";
export type { InputHint, InputProblem } from "./io/input_error.ts";
export type { ReadLimits } from "./io/read_limits.ts";
export type { ColumnOptions } from "./io/spectrum_columns.ts";
export type { Dispersion, HostEntry } from "./optics/refractive_index.ts";
export type { AxisUnit } from "./spectrum/axis.ts";
export type { FileValues, OrdinateKind, ReadWarning, ValueSource } from "./spectrum/spectrum.ts";
export type { SourcedValue } from "./analysis/provenance_step.ts";
export type { CalibrationSummary, ReportHeader } from "./analysis/results_document.ts";
export type { ColorRowUncertainty, TargetConditionCheck } from "./analysis/sample_result.ts";
export type { TargetColor } from "./analysis/sample_settings.ts";
export type { CatalogueBand } from "./bands/data/band_catalogue.ts";
export type { SpectrumFitOptions } from "./bands/fit_bands.ts";
export type { ExclusionReason } from "./bands/usable_range.ts";
export type { ThicknessPoint } from "./cie/thickness_series.ts";
export type { AlphaBase } from "./io/spectrum_columns.ts";
export type { FileValue } from "./spectrum/spectrum.ts";
export type { UsableRangeOptions } from "./bands/usable_range.ts";
export type { TargetCheck } from "./dopant/target.ts";

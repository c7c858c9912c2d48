/**
 * crystint — colour, bands and dopant levels of doped oxide crystals from their spectra.
 *
 * The curated face of the library, for notebooks and other Deno programs: read an export into
 * spectra, compute CIE colour at any path length, colour differences and change, fit bands,
 * calibrate and predict dopant levels, aim a doping at a target colour, or run the whole
 * analysis of one sample. Everything here is pure computation except `readSpectrumFile`, which
 * reads one file (needs `--allow-read`). The batch runner and the report writer live in the
 * CLI's layers (`lib/batch`, `lib/report`), not here.
 *
 * @example Colour of a stone at its finished path, from an export's bytes
 * ```ts
 * import { readSpectraFromBytes, spectrumColour } from "./mod.ts";
 * const rows = ["wavelength_nm,T"];
 * for (let nm = 360; nm <= 830; nm += 5) rows.push(`${nm},${nm > 600 ? 0.8 : 0.3}`);
 * const [stone] = readSpectraFromBytes(new TextEncoder().encode(rows.join("\n")), "red.csv", {
 *   thicknessMm: 2,
 * });
 * const [day] = spectrumColour(stone!, { illuminants: ["D65"], observers: ["2"], pathMm: 6 });
 * if (!(day!.a > 0 && day!.L < 80)) throw new Error("a red stone should have a* > 0");
 * ```
 *
 * @example Colour difference of two CIELAB colours (Sharma, Wu & Dalal 2005, pair 1)
 * ```ts
 * import { deltaE2000 } from "./mod.ts";
 * const dE = deltaE2000({ L: 50, a: 2.6772, b: -79.7751 }, { L: 50, a: 0, b: -82.7485 });
 * if (Math.abs(dE - 2.0425) > 1e-4) throw new Error(String(dE));
 * ```
 *
 * @module
 */
export type { Polarisation, Quantity, Spectrum, SpectrumMeta } from "./spectrum/spectrum.ts";
export { type NeededValue, NeedsValueError } from "./spectrum/needs_value_error.ts";
export { InputError } from "./io/input_error.ts";
export { type ReadOptions, readSpectraFromBytes } from "./io/read_spectra.ts";
export { readSpectrumFile } from "./io/read_file.ts";

export { type ColourOptions, type ColourRow, spectrumColour } from "./cie/spectrum_colour.ts";
export { type Lab, labToLch, type Lch, xyzToLab } from "./cie/spaces.ts";
export { deltaE2000, deltaE76, deltaE94, deltaECmc } from "./cie/delta_e.ts";
export { type ColourChange, colourChange } from "./cie/colour_change.ts";
export { type ThicknessSeries, thicknessSeries } from "./cie/thickness_series.ts";
export { getIlluminant, type Illuminant, ILLUMINANT_NAMES } from "./cie/illuminants.ts";

export { type ReflectionSettings, transmittanceForPath } from "./optics/path_transmittance.ts";
export { getHost, parseSellmeier } from "./optics/refractive_index.ts";

export {
  type BandFit,
  fitBandsCm1,
  type FitOptions,
  fitSpectrumBands,
  type FittedBand,
} from "./bands/fit_bands.ts";
export { assignBands, type BandAssignment } from "./bands/assign_bands.ts";

export {
  type Calibration,
  fitCalibration,
  predictConcentration,
} from "./dopant/linear_calibration.ts";
export { spectrumResponse } from "./dopant/response_metric.ts";
export { aimDoping, type AimProblem, type AimResult } from "./dopant/aim_doping.ts";
export { checkTarget, type TargetCheck } from "./dopant/target.ts";
export { fitScheil } from "./dopant/scheil.ts";
export { smakulaDexter } from "./dopant/smakula_dexter.ts";

export { analyseFile, analyseSample } from "./analysis/analyse_sample.ts";
export type { SampleSettings } from "./analysis/sample_settings.ts";
export type { SampleResult } from "./analysis/sample_result.ts";
export type { ResultsDocument } from "./analysis/results_document.ts";
export { VERSION } from "./version.ts";

/**
 * The analysis of one sample, in named steps: provenance (which source states each input) →
 * optics → colour rows → change → series →
 * target → bands → dopant → uncertainty (when asked for). Pure: no file system, so it runs in a worker or a notebook.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { readSpectraFromBytes } from "../io/read_spectra.ts";
import { InputError } from "../io/input_error.ts";
import type { SampleSettings } from "./sample_settings.ts";
import type { SampleResult } from "./sample_result.ts";
import { colorRowsFor, pathTransmittance } from "./color_step.ts";
import { changeStep } from "./change_step.ts";
import { seriesStep } from "./series_step.ts";
import { targetStep } from "./target_step.ts";
import { bandsStep } from "./bands_step.ts";
import { dopantStep } from "./dopant_step.ts";
import { thinTransmittance } from "./chart_curves.ts";
import { uncertaintyStep } from "./uncertainty_step.ts";
import { provenanceStep } from "./provenance_step.ts";

/** The host's name from the reflection settings, when one is set. */
function hostName(s: SampleSettings): string | undefined {
  const h = s.reflection.host;
  return typeof h === "string" ? h : h?.name;
}

/**
 * Analyses one measured spectrum.
 *
 * @param measured The spectrum as read.
 * @param file The file it came from (carried into the result).
 * @param given The sample's settings.
 * @param single Whether the file holds only this spectrum (then the sheet's name applies).
 * @throws {InputError} When the spectrum cannot give a colour (outside 360–830 nm, or a
 *   rescaling that needs a thickness nobody states).
 */
export function analyseSample(
  measured: Spectrum,
  file: string,
  given: SampleSettings,
  single = true,
): SampleResult {
  const warnings = [
    ...(measured.meta.fileWarnings ?? []).map((w) => w.message),
    ...(measured.meta.warnings ?? []),
  ];
  const { spectrum, settings: s, provenance } = provenanceStep(measured, given, warnings);
  let t: Float64Array, color;
  try {
    const optics = pathTransmittance(spectrum, s);
    t = optics.t;
    warnings.push(...optics.warnings);
    color = colorRowsFor(spectrum, t, s.illuminants, s.observers, s.pathMm);
  } catch (e) {
    // a spectrum that cannot give a colour (outside the visible range, no thickness for a
    // rescaling) is a problem of this input, reported as such
    if (e instanceof RangeError) {
      throw new InputError(
        "out-of-range",
        file,
        undefined,
        `${spectrum.meta.sample}: ${e.message}`,
      );
    }
    throw e;
  }
  const change = changeStep(spectrum, t, color, s);
  const series = seriesStep(spectrum, s, warnings);
  const target = targetStep(spectrum, t, color, s);
  const host = hostName(s);
  const bands = bandsStep(spectrum, host, warnings);
  const dopant = dopantStep(spectrum, bands.fit, s, warnings);
  const uncertainty = uncertaintyStep(spectrum, s, change, target, warnings);
  return {
    sample: single && s.sampleName ? s.sampleName : spectrum.meta.sample,
    file,
    quantity: spectrum.quantity,
    thicknessMm: spectrum.thicknessMm ?? null,
    pathMm: s.pathMm ?? spectrum.thicknessMm ?? null,
    polarisation: provenance.polarisation.value,
    host: host ?? null,
    notes: s.notes ?? "",
    extra: s.extra,
    warnings,
    color,
    change,
    series,
    target,
    plot: thinTransmittance(spectrum.wavelengthNm, t),
    dopant,
    bands: bands.result,
    uncertainty,
    provenance,
  };
}

/**
 * Reads the spectra in one file's bytes and analyses each.
 *
 * @throws {InputError} For unreadable content; {RangeError} for settings that do not fit it.
 */
export function analyseFile(bytes: Uint8Array, file: string, s: SampleSettings): SampleResult[] {
  const spectra = readSpectraFromBytes(bytes, file, s.read);
  return spectra.map((spectrum) => analyseSample(spectrum, file, s, spectra.length === 1));
}

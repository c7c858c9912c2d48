/**
 * Spectral responses a calibration can use, all on an α scale (cm⁻¹) so they do not depend on
 * the slab thickness: the fitted area or height of the band nearest a given centre, or α at a
 * wavelength above a straight baseline through a band-free window.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { spectrumAbsorbance } from "../spectrum/ordinate.ts";
import type { FittedBand } from "../bands/fit_bands.ts";
import { analyseBands } from "../bands/analyse_bands.ts";
import { nmToWavenumber } from "../spectrum/axis.ts";
import { valueAt } from "../spectrum/linear_resample.ts";
import { NeedsValueError } from "../spectrum/needs_value_error.ts";

/** The metrics. */
export type ResponseMetric = "band-area" | "band-height" | "alpha-at";

/** The metrics a spectrum can be measured by. */
export const RESPONSE_METRICS: readonly ResponseMetric[] = ["band-area", "band-height", "alpha-at"];

/**
 * Checks that a calibration's metric can be measured on a spectrum.
 *
 * @throws {RangeError} For a calibration made from ready response values of an unnamed metric.
 */
export function spectrumMetric(metric: string): ResponseMetric {
  if ((RESPONSE_METRICS as readonly string[]).includes(metric)) return metric as ResponseMetric;
  throw new RangeError(
    `The calibration's response is "${metric}", which cannot be measured on a spectrum: it needs ` +
      `one of ${RESPONSE_METRICS.join(", ")} (name it in the standards table's header, e.g. ` +
      `"band height (cm-1) @ 555 nm", or compute the responses from spectra)`,
  );
}

/** Options of a metric. */
export interface MetricOptions {
  /** Band centre to pick, nm (band metrics; default 555). */
  bandNm?: number;
  /** Wavelength to read, nm (alpha-at; default 555). */
  atNm?: number;
  /** Baseline window, nm (alpha-at; default 720–760). */
  windowNm?: [number, number];
}

/** A response with its standard error. */
export interface Response {
  /** The response. */
  value: number;
  /** Its standard error. */
  sigma: number;
}

/** α in cm⁻¹ of a spectrum (from T or A this needs the thickness). */
export function alphaOf(spectrum: Spectrum): Float64Array<ArrayBuffer> {
  if (spectrum.quantity === "alpha") return spectrum.values.slice();
  const d = spectrum.thicknessMm;
  if (d === undefined) {
    throw new NeedsValueError(
      `Cannot compute α of "${spectrum.meta.sample}": the thickness is not known`,
      "thickness",
    );
  }
  return spectrumAbsorbance(spectrum).map((a) => (a * Math.LN10) / (d / 10));
}

/**
 * The response of a spectrum for a metric.
 *
 * @throws {RangeError} When the thickness is unknown, no band is found, or a wavelength is outside the data.
 */
export function spectrumResponse(
  spectrum: Spectrum,
  metric: ResponseMetric,
  options: MetricOptions = {},
): Response {
  spectrumMetric(metric);
  const alpha = alphaOf(spectrum);
  const nm = spectrum.wavelengthNm;
  if (metric === "alpha-at") {
    const at = options.atNm ?? 555;
    const [w0, w1] = options.windowNm ?? [720, 760];
    const inWindow = [...nm].map((v, i) => (v >= w0 && v <= w1 ? alpha[i]! : NaN)).filter(
      Number.isFinite,
    );
    if (inWindow.length < 2) {
      throw new RangeError(`Cannot take a baseline: fewer than 2 points in ${w0}–${w1} nm`);
    }
    const base = inWindow.reduce((a, b) => a + b, 0) / inWindow.length;
    const sd = Math.sqrt(inWindow.reduce((s, v) => s + (v - base) ** 2, 0) / (inWindow.length - 1));
    return {
      value: valueAt(nm, alpha, at) - base,
      sigma: sd * Math.sqrt(1 + 1 / inWindow.length),
    };
  }
  // the same band analysis the batch runs (usable range, model selection), as α
  const fit = analyseBands({ ...spectrum, values: alpha, quantity: "alpha" });
  return responseFromBands(fit.bands, 1, metric, options, spectrum.meta.sample);
}

/**
 * The band response from bands already fitted: the band nearest the metric's centre, its
 * height or area scaled to α (cm⁻¹) by `toAlpha` (1 for a fit of α; ln 10 / d[cm] for a fit of
 * decadic absorbance at thickness d, by Beer–Lambert).
 *
 * @throws {RangeError} When no band lies near the metric's centre.
 */
export function responseFromBands(
  bands: FittedBand[],
  toAlpha: number,
  metric: Exclude<ResponseMetric, "alpha-at">,
  options: MetricOptions = {},
  sample = "",
): Response {
  const want = nmToWavenumber(options.bandNm ?? 555);
  const band =
    bands.slice().sort((a, b) => Math.abs(a.centerCm1 - want) - Math.abs(b.centerCm1 - want))[0];
  if (!band || Math.abs(band.centerCm1 - want) > Math.max(1500, band.fwhmCm1)) {
    throw new RangeError(`No band found near ${options.bandNm ?? 555} nm in "${sample}"`);
  }
  return metric === "band-area"
    ? { value: band.area * toAlpha, sigma: band.areaSigma * toAlpha }
    : { value: band.height * toAlpha, sigma: band.heightSigma * toAlpha };
}

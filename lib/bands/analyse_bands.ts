/**
 * Band and edge analysis of one spectrum, each step once: usable range, noise, band fit with
 * model selection (see fit_bands.ts), assignment hints, bands as α when the thickness is
 * known (natural: α = A·ln 10/d, Beer–Lambert), and, when asked, the Tauc gap and Urbach
 * energy of the absorption edge (see absorption_edge.ts).
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import { HC_EV_NM, nmToEv } from "../spectrum/axis.ts";
import {
  type BandFit,
  fitSpectrumBands,
  type FittedBand,
  type ModelTried,
  type SpectrumFitOptions,
  spectrumNoise,
} from "./fit_bands.ts";
import { assignBands, type BandAssignment } from "./assign_bands.ts";
import type { ExcludedRange } from "./usable_range.ts";
import { taucGap, urbachEnergy } from "./absorption_edge.ts";

/** Options of {@linkcode analyseBands}. */
export interface BandAnalysisOptions extends SpectrumFitOptions {
  /** Host for the assignment hints (catalogue name); all hosts when omitted. */
  host?: string;
  /** Tauc analysis of the absorption edge for this transition type; none when omitted. */
  tauc?: "direct" | "indirect";
}

/** The absorption edge of a spectrum. */
export interface EdgeReport {
  /** Tauc exponent used: direct (r = 1/2) or indirect (r = 2) transitions. */
  exponent: "direct" | "indirect";
  /** Tauc gap, eV, or null with `message` when there is none to give. */
  gapEv: number | null;
  /** Standard uncertainty of the gap, eV. */
  gapEvSigma: number | null;
  /** The Tauc window, eV. */
  fromEv: number | null;
  /** Upper end of the Tauc window, eV. */
  toEv: number | null;
  /** Urbach energy, eV, or null when no exponential tail was found. */
  urbachEv: number | null;
  /** Standard uncertainty of the Urbach energy, eV. */
  urbachEvSigma: number | null;
  /** Lower end of the Urbach window, eV. */
  urbachFromEv: number | null;
  /** Upper end of the Urbach window, eV. */
  urbachToEv: number | null;
  /** Why a value is missing, in words. */
  message?: string;
}

/** A parameter held at a bound. */
export interface HeldParameter {
  /** Index of the band in `bands`. */
  band: number;
  /** Which parameter is held. */
  parameter: "centerCm1" | "fwhmCm1";
  /** The bound it is held at. */
  value: number;
}

/** Result of {@linkcode analyseBands}. */
export interface BandAnalysis {
  /** Sample name. */
  sample: string;
  /** What was fitted: absorbance (decadic) or α (cm⁻¹). */
  ordinate: BandFit["ordinate"];
  /** Fitted bands. */
  bands: FittedBand[];
  /** Fitted baseline (with the edge term when kept). */
  baseline: BandFit["baseline"];
  /** RMS of the residual. */
  residualRms: number;
  /** Noise σ of the ordinate, from the residual of a smooth fit on the measured grid. */
  noiseSigma: number;
  /** χ² per degree of freedom of the final fit. */
  reducedChi2: number;
  /** Whether the fit converged. */
  converged: boolean;
  /** Assignment hints from the catalogue. */
  assignments: BandAssignment[];
  /** Stretches left out of detection and fitting. */
  excluded: ExcludedRange[];
  /** What the analysis wants the reader to know. */
  warnings: string[];
  /** The information criterion the model was chosen by. */
  criterion: BandFit["criterion"];
  /** Every model tried, with its criterion values. */
  models: ModelTried[];
  /** Parameters held at a bound (left out of the covariance). */
  held: HeldParameter[];
  /** The bands as α, cm⁻¹ (natural), when the thickness is known and the ordinate is absorbance. */
  bandsAlpha?: FittedBand[];
  /** How α is defined in `bandsAlpha`. */
  alphaBase?: "natural";
  /** The absorption edge, when a Tauc analysis was asked for. */
  edge?: EdgeReport;
  /** Data, model and σ on the fitted wavenumber grid. */
  curve: BandFit["curve"];
}

function scaleBand(b: FittedBand, k: number): FittedBand {
  return {
    ...b,
    height: b.height * k,
    heightSigma: b.heightSigma * k,
    area: b.area * k,
    areaSigma: b.areaSigma * k,
  };
}

/** The edge of a spectrum from its α (or A·ln 10 when no thickness is known: the gap and Eu do not depend on the scale). */
function edgeOf(
  spectrum: Spectrum,
  exponent: "direct" | "indirect",
  noise: ReturnType<typeof spectrumNoise>,
  warnings: string[],
): EdgeReport {
  const d = spectrum.thicknessMm;
  const isAlpha = spectrum.quantity === "alpha";
  const scale = isAlpha ? 1 : d !== undefined && d > 0 ? Math.LN10 / (d / 10) : Math.LN10;
  if (!isAlpha && !(d !== undefined && d > 0)) {
    warnings.push(
      "edge from absorbance: thickness not known (the gap and Urbach energy do not depend on it)",
    );
  }
  const ev = Array.from(spectrum.wavelengthNm, nmToEv);
  const alpha = Array.from(noise.values, (v) => v * scale);
  const sigma = Array.from(noise.sigma, (v) => v * scale);
  const opts = { usable: noise.usable.usable, alphaSigma: sigma };
  const report: EdgeReport = {
    exponent,
    gapEv: null,
    gapEvSigma: null,
    fromEv: null,
    toEv: null,
    urbachEv: null,
    urbachEvSigma: null,
    urbachFromEv: null,
    urbachToEv: null,
  };
  const t = taucGap(ev, alpha, exponent, opts);
  let below = Infinity;
  if ("gapEv" in t) {
    report.gapEv = t.gapEv;
    report.gapEvSigma = t.gapEvSigma;
    report.fromEv = t.region.fromEv;
    report.toEv = t.region.toEv;
    below = t.region.fromEv;
  } else {
    report.message = t.message;
    if (/outside the data/.test(t.message)) return report;
    // a top cut off by the photometric floor is an edge inside the data, but saturated
    const cut = noise.usable.excluded.find((e) =>
      e.fromNm <= spectrum.wavelengthNm[0]! && e.reason !== "clipped"
    );
    if (cut) {
      report.message = `edge saturated below ${
        cut.toNm.toFixed(0)
      } nm (${cut.reason}): ${t.message}`;
    }
  }
  const u = urbachEnergy(ev, alpha, below, opts);
  if (u) {
    report.urbachEv = u.urbachEv;
    report.urbachEvSigma = u.urbachEvSigma;
    report.urbachFromEv = u.region.fromEv;
    report.urbachToEv = u.region.toEv;
  }
  return report;
}

/**
 * Analyses the bands (and, when asked, the edge) of a spectrum.
 *
 * @throws {RangeError} When too few usable points remain to fit, or the spectrum holds reflectance.
 */
export function analyseBands(spectrum: Spectrum, options: BandAnalysisOptions = {}): BandAnalysis {
  const noise = spectrumNoise(spectrum, options);
  const early: string[] = [];
  // the edge first: above the start of its Tauc region the spectrum is the edge itself, which
  // no sum of bands and exponential tail describes, so it is left out of the band fit
  const edge = edgeOf(spectrum, options.tauc ?? "direct", noise, early);
  if (edge.fromEv !== null) {
    const fromNm = HC_EV_NM / edge.toEv!, toNm = HC_EV_NM / edge.fromEv;
    const usable = noise.usable.usable.slice();
    spectrum.wavelengthNm.forEach((w, i) => {
      if (w <= toNm) usable[i] = 0;
    });
    noise.usable = {
      ...noise.usable,
      usable,
      excluded: [
        ...noise.usable.excluded.filter((e) => e.fromNm > toNm),
        {
          fromNm: Math.min(fromNm, spectrum.wavelengthNm[0]!),
          toNm,
          reason: "absorption edge" as const,
        },
      ].sort((a, b) => a.fromNm - b.fromNm),
    };
  }
  const fit = fitSpectrumBands(spectrum, options, noise);
  const warnings = [...fit.warnings];
  for (const e of noise.usable.excluded) {
    warnings.push(
      `${e.fromNm.toFixed(0)}–${e.toNm.toFixed(0)} nm left out (${e.reason})`,
    );
  }
  const held: HeldParameter[] = [];
  fit.bands.forEach((b, band) => {
    for (const parameter of b.held ?? []) held.push({ band, parameter, value: b[parameter] });
  });
  const result: BandAnalysis = {
    sample: spectrum.meta.sample,
    ordinate: fit.ordinate,
    bands: fit.bands,
    baseline: fit.baseline,
    residualRms: fit.residualRms,
    noiseSigma: fit.noiseSigma,
    reducedChi2: fit.reducedChi2,
    converged: fit.converged,
    assignments: assignBands(fit.bands, options.host, 3, spectrum.polarisation),
    excluded: noise.usable.excluded,
    warnings,
    criterion: fit.criterion,
    models: fit.models,
    held,
    curve: fit.curve,
  };
  const d = spectrum.thicknessMm;
  if (fit.ordinate === "absorbance" && d !== undefined && d > 0) {
    const k = Math.LN10 / (d / 10);
    result.bandsAlpha = fit.bands.map((b) => scaleBand(b, k));
    result.alphaBase = "natural";
  } else if (fit.ordinate === "alpha") {
    result.bandsAlpha = fit.bands;
    result.alphaBase = "natural";
  }
  if (options.tauc) {
    result.edge = edge;
    warnings.push(...early);
  }
  return result;
}

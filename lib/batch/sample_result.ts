/**
 * Everything the batch computes for one input file: read → optics → colour → change →
 * thickness series → target. Pure apart from its input bytes, so it runs in a worker.
 *
 * @module
 */
import { readSpectraFromBytes } from "../io/read_spectra.ts";
import type { ReadOptions } from "../io/read_spectra.ts";
import { axisFromText, ordinateFromText } from "../io/header_units.ts";
import type { Spectrum } from "../spectrum/spectrum.ts";
import { type ReflectionSettings, transmittanceForPath } from "../optics/path_transmittance.ts";
import { parseSellmeier } from "../optics/refractive_index.ts";
import { type ColourRow, spectrumColour } from "../cie/spectrum_colour.ts";
import { type ColourChange, colourChange } from "../cie/colour_change.ts";
import { type ThicknessSeries, thicknessSeries } from "../cie/thickness_series.ts";
import { checkTarget, type TargetCheck } from "../dopant/target.ts";
import type { BatchSettings, TargetSetting } from "./settings.ts";
import { type BandFit, fitSpectrumBands } from "../bands/fit_bands.ts";
import { assignBands, type BandAssignment } from "../bands/assign_bands.ts";
import { type Calibration, predictConcentration } from "../dopant/linear_calibration.ts";
import {
  type MetricOptions,
  type ResponseMetric,
  spectrumResponse,
} from "../dopant/response_metric.ts";
import type { ManifestRow } from "./manifest.ts";

/** Settings for one file after the manifest row is applied. */
export interface SampleSettings {
  read: ReadOptions;
  /** Thickness used when neither the file nor the manifest gives one. */
  fallbackThicknessMm?: number;
  pathMm?: number;
  reflection: ReflectionSettings;
  illuminants: string[];
  observers: string[];
  change: BatchSettings["change"];
  series: BatchSettings["series"];
  target?: TargetSetting & { name: string };
  changeHueThresholdDeg: number;
  changeMinChroma: number;
  notes?: string;
  extra: Record<string, string>;
  sampleName?: string;
  /** Polarisation as written in the sample sheet (used when the file does not say). */
  polarisation?: string;
  /** Calibration to estimate the dopant level with, and its name. */
  calibration?: Calibration & { name: string };
}

/** The result for one spectrum. */
export interface SampleResult {
  sample: string;
  file: string;
  quantity: string;
  thicknessMm: number | null;
  pathMm: number | null;
  polarisation: string | null;
  host: string | null;
  notes: string;
  extra: Record<string, string>;
  warnings: string[];
  colour: ColourRow[];
  change: ColourChange & { swatchFrom: string; swatchTo: string; marked: boolean };
  series: ThicknessSeries | null;
  target:
    | (TargetCheck & {
      name: string;
      illuminant: string;
      observer: string;
      L: number;
      a: number;
      b: number;
      /** One check per illuminant of the target; pass and dE00 above cover all of them. */
      checks: (TargetCheck & {
        illuminant: string;
        L: number;
        a: number;
        b: number;
        measured: { L: number; a: number; b: number };
      })[];
    })
    | null;
  /** Transmittance at the reporting path, thinned to at most 300 points, for the charts. */
  plot: { nm: number[]; t: number[] };
  /** Fitted bands of the measured absorbance (or α), with assignment hints; null if not fitted. */
  /** Dopant level from the calibration, when one applies. */
  dopant: {
    calibration: string;
    metric: string;
    response: number;
    concentration: number;
    sigma: number;
    halfWidth95: number;
    unit: string;
    outsideRange: boolean;
  } | null;
  bands: {
    ordinate: BandFit["ordinate"];
    bands: BandFit["bands"];
    baseline: BandFit["baseline"];
    residualRms: number;
    assignments: BandAssignment[];
    curve: { nm: number[]; data: number[]; model: number[] };
  } | null;
}

/** Applies a manifest row on top of the batch settings. */
export function sampleSettings(
  settings: BatchSettings,
  row: ManifestRow | undefined,
  calibrations: Record<string, Calibration> = {},
): SampleSettings {
  const read: ReadOptions = {};
  const ordinate = settings.ordinate ? ordinateFromText(settings.ordinate) : undefined;
  const axis = settings.axis ? axisFromText(settings.axis) : undefined;
  if (ordinate) read.ordinate = ordinate;
  if (axis) read.axis = axis;
  if (row?.thicknessMm !== undefined) read.thicknessMm = row.thicknessMm;
  const host = row?.host ?? settings.host;
  const reflection: ReflectionSettings = { reflection: settings.reflection };
  if (host !== undefined) reflection.host = host;
  if (settings.n !== undefined) reflection.n = settings.n;
  if (settings.sellmeier !== undefined) reflection.dispersion = parseSellmeier(settings.sellmeier);
  const out: SampleSettings = {
    read,
    reflection,
    illuminants: settings.illuminants,
    observers: settings.observers,
    change: settings.change,
    series: settings.series,
    changeHueThresholdDeg: settings.changeHueThresholdDeg,
    changeMinChroma: settings.changeMinChroma,
    extra: row?.extra ?? {},
  };
  const pathMm = row?.pathMm ?? settings.pathMm;
  if (pathMm !== undefined) out.pathMm = pathMm;
  if (settings.thicknessMm !== undefined) out.fallbackThicknessMm = settings.thicknessMm;
  const targetName = row?.target;
  const target = targetName ? settings.targets[targetName] : settings.target;
  if (targetName && !target) {
    throw new RangeError(`Manifest names target "${targetName}", which the settings do not define`);
  }
  if (target) out.target = { ...target, name: targetName ?? "target" };
  const calName = row?.calibration ?? (settings.calibration ? "default" : undefined);
  if (calName) {
    const cal = calibrations[calName];
    if (!cal) {
      throw new RangeError(
        `Manifest names calibration "${calName}", which the settings do not define`,
      );
    }
    out.calibration = { ...cal, name: calName };
  }
  if (row?.notes) out.notes = row.notes;
  if (row?.sample) out.sampleName = row.sample;
  if (row?.polarisation) out.polarisation = row.polarisation;
  return out;
}

function thin(nm: Float64Array, t: Float64Array, max = 300): { nm: number[]; t: number[] } {
  const step = Math.max(1, Math.ceil(nm.length / max));
  const outNm: number[] = [], outT: number[] = [];
  for (let i = 0; i < nm.length; i += step) {
    outNm.push(Number(nm[i]!.toFixed(2)));
    outT.push(Number(t[i]!.toFixed(5)));
  }
  return { nm: outNm, t: outT };
}

function resultFor(
  measured: Spectrum,
  file: string,
  s: SampleSettings,
  single: boolean,
): SampleResult {
  const spectrum = measured.thicknessMm === undefined && s.fallbackThicknessMm !== undefined
    ? { ...measured, thicknessMm: s.fallbackThicknessMm }
    : measured;
  const warnings = [
    ...(spectrum.meta.fileWarnings ?? []).map((w) => w.message),
    ...(spectrum.meta.warnings ?? []),
  ];
  const { values: t, warnings: opticsWarnings } = transmittanceForPath(
    spectrum,
    s.pathMm,
    s.reflection,
  );
  warnings.push(...opticsWarnings);
  const colour = spectrumColour(spectrum, {
    illuminants: s.illuminants,
    observers: s.observers,
    transmittance: t,
    ...(s.pathMm === undefined ? {} : { pathMm: s.pathMm }),
  });
  const change = colourChange(
    spectrum.wavelengthNm,
    t,
    s.change.from,
    s.change.to,
    s.change.observer,
    s.change.adapt,
  );
  // the swatches of the change: from the colour rows when they hold that pair already
  const swatch = (illuminant: string) => {
    const row =
      colour.find((r) => r.illuminant === illuminant && r.observer === s.change.observer) ??
        spectrumColour(spectrum, {
          illuminants: [illuminant],
          observers: [s.change.observer],
          transmittance: t,
        })[0]!;
    return row.srgb;
  };
  let series: ThicknessSeries | null = null;
  if (spectrum.thicknessMm !== undefined || spectrum.quantity === "alpha") {
    series = thicknessSeries(spectrum, {
      ...s.series,
      illuminant: s.change.from,
      observer: s.change.observer,
      reflection: s.reflection,
    });
  } else {
    warnings.push("no thickness known: thickness series skipped");
  }
  let target: SampleResult["target"] = null;
  if (s.target) {
    const goal = s.target;
    const checks = [goal, ...goal.also].map((c) => {
      const row = spectrumColour(spectrum, {
        illuminants: [c.illuminant],
        observers: [goal.observer],
        transmittance: t,
      })[0]!;
      const measured = { L: row.L, a: row.a, b: row.b };
      return {
        ...checkTarget(measured, c, goal.toleranceDE00),
        illuminant: row.illuminant,
        L: c.L,
        a: c.a,
        b: c.b,
        measured,
      };
    });
    const worst = checks.reduce((w, c) => (c.dE00 > w.dE00 ? c : w), checks[0]!);
    target = {
      ...checks[0]!,
      pass: checks.every((c) => c.pass),
      dE00: worst.dE00,
      words: checks.length > 1
        ? checks.map((c) => `${c.illuminant}: ${c.words}`).join("; ")
        : checks[0]!.words,
      name: goal.name,
      observer: goal.observer,
      checks,
    };
  }
  let bands: SampleResult["bands"] = null;
  try {
    const fit = fitSpectrumBands(spectrum);
    const step = Math.max(1, Math.ceil(fit.curve.cm1.length / 300));
    const pick = (a: Float64Array) => [...a].filter((_, i) => i % step === 0);
    bands = {
      ordinate: fit.ordinate,
      bands: fit.bands,
      baseline: fit.baseline,
      residualRms: fit.residualRms,
      assignments: assignBands(
        fit.bands,
        typeof s.reflection.host === "string" ? s.reflection.host : s.reflection.host?.name,
      ),
      curve: {
        nm: pick(fit.curve.cm1).map((v) => Number((1e7 / v).toFixed(2))),
        data: pick(fit.curve.data).map((v) => Number(v.toFixed(5))),
        model: pick(fit.curve.model).map((v) => Number(v.toFixed(5))),
      },
    };
  } catch (e) {
    warnings.push(`band fit skipped: ${(e as Error).message}`);
  }
  let dopant: SampleResult["dopant"] = null;
  if (s.calibration) {
    try {
      const r = spectrumResponse(
        spectrum,
        s.calibration.metric as ResponseMetric,
        s.calibration.metricOptions as MetricOptions,
      );
      const p = predictConcentration(s.calibration, r.value, r.sigma);
      dopant = {
        calibration: s.calibration.name,
        metric: s.calibration.metric,
        response: r.value,
        concentration: p.x,
        sigma: p.sigma,
        halfWidth95: p.halfWidth95,
        unit: s.calibration.unit,
        outsideRange: p.outsideRange,
      };
    } catch (e) {
      warnings.push(`dopant estimate skipped: ${(e as Error).message}`);
    }
  }
  return {
    dopant,
    bands,
    sample: single && s.sampleName ? s.sampleName : spectrum.meta.sample,
    file,
    quantity: spectrum.quantity,
    thicknessMm: spectrum.thicknessMm ?? null,
    pathMm: s.pathMm ?? spectrum.thicknessMm ?? null,
    polarisation: spectrum.polarisation ?? s.polarisation ?? null,
    host: typeof s.reflection.host === "string"
      ? s.reflection.host
      : s.reflection.host?.name ?? null,
    notes: s.notes ?? "",
    extra: s.extra,
    warnings,
    colour,
    change: {
      ...change,
      swatchFrom: swatch(s.change.from),
      swatchTo: swatch(s.change.to),
      // a hue angle means little for a nearly grey colour, so both chromas must reach the floor
      marked: Math.abs(change.dh) >= s.changeHueThresholdDeg &&
        Math.min(change.chromaFrom, change.chromaTo) >= s.changeMinChroma,
    },
    series,
    target,
    plot: thin(spectrum.wavelengthNm, t),
  };
}

/**
 * Computes the results for the spectra in one file's bytes.
 *
 * @throws {InputError} For unreadable content; {RangeError} for settings that do not fit it.
 */
export function processFile(bytes: Uint8Array, file: string, s: SampleSettings): SampleResult[] {
  const spectra = readSpectraFromBytes(bytes, file, s.read);
  return spectra.map((spectrum) => resultFor(spectrum, file, s, spectra.length === 1));
}

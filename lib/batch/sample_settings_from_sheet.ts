/**
 * One sample's settings: the batch settings with its sample-sheet row applied on top.
 *
 * @module
 */
import type { ReadOptions } from "../io/read_spectra.ts";
import { axisFromText, ordinateFromText } from "../io/header_units.ts";
import type { ReflectionSettings } from "../optics/path_transmittance.ts";
import { parseSellmeier } from "../optics/refractive_index.ts";
import type { UncertaintySources } from "../cie/color_uncertainty.ts";
import type { Calibration } from "../dopant/linear_calibration.ts";
import type { SampleSettings, SheetValues } from "../analysis/sample_settings.ts";
import type { BatchSettings } from "./settings_schema.ts";
import type { ManifestRow } from "./manifest.ts";

/**
 * Applies a sample-sheet row on top of the batch settings.
 *
 * @throws {RangeError} When the row names a target or calibration the settings do not define.
 */
export function settingsForSample(
  settings: BatchSettings,
  row: ManifestRow | undefined,
  calibrations: Record<string, Calibration> = {},
): SampleSettings {
  const read: ReadOptions = {};
  const ordinate = settings.ordinate ? ordinateFromText(settings.ordinate) : undefined;
  const axis = settings.axis ? axisFromText(settings.axis) : undefined;
  if (ordinate) read.ordinate = ordinate;
  if (axis) read.axis = axis;
  const alphaBase = row?.alphaBase ?? settings.alphaBase;
  if (alphaBase === "10") read.alphaBase = "10";
  // as on the command line: a host named by the settings or the sheet turns Fresnel surfaces on
  // unless the settings say otherwise (a host in a file's preamble is free text and does not)
  const hostKnown = settings.host !== undefined || settings.n !== undefined ||
    settings.sellmeier !== undefined || row?.host !== undefined;
  const reflection: ReflectionSettings = {
    reflection: settings.reflection ?? (hostKnown ? "host" : "none"),
  };
  if (settings.host !== undefined) reflection.host = settings.host;
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
  if (settings.pathMm !== undefined) out.pathMm = settings.pathMm;
  // what the sheet states outranks the file, and the file the settings (see lib/analysis)
  const sheet: SheetValues = {};
  if (row?.thicknessMm !== undefined) sheet.thicknessMm = row.thicknessMm;
  if (row?.pathMm !== undefined) sheet.pathMm = row.pathMm;
  if (row?.host !== undefined) sheet.host = row.host;
  if (row?.polarisation) sheet.polarisation = row.polarisation;
  if (Object.keys(sheet).length) out.sheet = sheet;
  if (ordinate || axis) out.readSource = "settings";
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
  const u = settings.uncertainty;
  if (u) {
    const sources: UncertaintySources = {
      offsetSd: u.offsetSd,
      wavelengthSdNm: u.wavelengthSdNm,
      thicknessSdMm: row?.thicknessSdMm ?? u.thicknessSdMm,
      pathSdMm: row?.pathSdMm ?? u.pathSdMm,
    };
    if (u.noiseSd !== undefined) sources.noiseSd = u.noiseSd;
    out.uncertainty = { sources, passAt: u.passAt, failAt: u.failAt };
  }
  if (row?.notes) out.notes = row.notes;
  if (row?.sample) out.sampleName = row.sample;
  return out;
}

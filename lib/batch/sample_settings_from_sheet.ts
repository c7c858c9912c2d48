/**
 * One sample's settings: the batch settings with its sample-sheet row applied on top.
 *
 * @module
 */
import type { ReadOptions } from "../io/read_spectra.ts";
import { axisFromText, ordinateFromText } from "../io/header_units.ts";
import type { ReflectionSettings } from "../optics/path_transmittance.ts";
import { parseSellmeier } from "../optics/refractive_index.ts";
import type { Calibration } from "../dopant/linear_calibration.ts";
import type { SampleSettings } from "../analysis/sample_settings.ts";
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

/**
 * Loads the calibration files a batch's settings name.
 *
 * @module
 */
import type { Calibration } from "../dopant/linear_calibration.ts";
import type { CalibrationSummary } from "../analysis/results_document.ts";
import { type BatchSettings, SettingsError } from "./settings_schema.ts";

/**
 * Reads every calibration the settings name (`calibration` is called "default").
 *
 * @throws {SettingsError} When a file cannot be read or is not a crystint calibration.
 */
export async function loadCalibrations(
  settings: BatchSettings,
): Promise<Record<string, Calibration>> {
  const calibrations: Record<string, Calibration> = {};
  const named = {
    ...settings.calibrations,
    ...(settings.calibration ? { default: settings.calibration } : {}),
  };
  for (const [name, path] of Object.entries(named)) {
    try {
      const parsed = JSON.parse(await Deno.readTextFile(path));
      if (parsed.kind !== "crystint-calibration") {
        throw new Error("not a crystint calibration file");
      }
      calibrations[name] = parsed;
    } catch (e) {
      throw new SettingsError(
        `Cannot read calibration "${name}" (${path}): ${(e as Error).message}`,
      );
    }
  }
  return calibrations;
}

/** The calibrations as the results header records them. */
export function calibrationSummaries(
  calibrations: Record<string, Calibration>,
): CalibrationSummary[] {
  return Object.entries(calibrations).map(([name, c]) => ({
    name,
    unit: c.unit,
    metric: c.metric,
    slope: c.slope,
    intercept: c.intercept,
    r2: c.r2,
    lod: c.lod,
    standards: c.points.map((p) => ({ sample: p.sample ?? "", x: p.x, y: p.y })),
  }));
}

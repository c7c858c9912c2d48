/**
 * Loads the calibration files a batch's settings name.
 *
 * @module
 */
import type { Calibration } from "../dopant/linear_calibration.ts";
import type { CalibrationSummary } from "../analysis/results_document.ts";
import { type BatchSettings, SettingsError } from "./settings_schema.ts";
import { batchLimits } from "./batch_limits.ts";
import { readTextLimited } from "./read_limited.ts";
import { parseFailure } from "./read_settings.ts";

/**
 * Reads every calibration the settings name (`calibration` is called "default").
 *
 * Messages name the file and the cause, never its contents.
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
  const { maxFileBytes } = batchLimits(settings);
  for (const [name, path] of Object.entries(named)) {
    const fail = (why: string) =>
      new SettingsError(`Cannot read calibration "${name}" (${path}): ${why}`);
    let text: string;
    try {
      text = await readTextLimited(path, maxFileBytes);
    } catch (e) {
      throw new SettingsError(`Cannot read calibration "${name}": ${(e as Error).message}`);
    }
    let parsed: Calibration & { kind?: unknown };
    try {
      parsed = JSON.parse(text);
    } catch (e) {
      throw fail(`${parseFailure(e, text)}; not a crystint calibration file`);
    }
    if (!parsed || typeof parsed !== "object" || parsed.kind !== "crystint-calibration") {
      throw fail("not a crystint calibration file");
    }
    if (
      !Number.isFinite(parsed.slope) || !Number.isFinite(parsed.intercept) ||
      !Array.isArray(parsed.points)
    ) {
      throw fail("slope, intercept or points missing or not finite");
    }
    calibrations[name] = parsed;
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

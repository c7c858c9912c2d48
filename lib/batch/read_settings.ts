/**
 * Reads a batch settings file (JSON or YAML) and resolves its relative paths.
 *
 * @module
 */
import { parse as parseYaml } from "yaml";
import { type BatchSettings, resolveSettings, SettingsError } from "./settings_schema.ts";

/**
 * Reads a settings file (`.json`, `.yaml` or `.yml`).
 *
 * @throws {SettingsError} When the file cannot be read or parsed, or a value is wrong.
 */
export async function readSettingsFile(path: string): Promise<BatchSettings> {
  let text: string;
  try {
    text = await Deno.readTextFile(path);
  } catch (e) {
    throw new SettingsError(`Cannot read settings file ${path}: ${(e as Error).message}`);
  }
  let raw: unknown;
  try {
    raw = /\.json$/i.test(path) ? JSON.parse(text) : parseYaml(text);
  } catch (e) {
    throw new SettingsError(`Cannot parse settings file ${path}: ${(e as Error).message}`);
  }
  let settings: BatchSettings;
  try {
    settings = resolveSettings(raw);
  } catch (e) {
    throw new SettingsError(`${path}: ${(e as Error).message}`);
  }
  // calibration paths are relative to the settings file
  const dir = path.replace(/[^/\\]*$/, "");
  const rel = (p: string) => (/^([a-zA-Z]:)?[\\/]/.test(p) ? p : `${dir}${p}`);
  if (settings.calibration) settings.calibration = rel(settings.calibration);
  for (
    const t of [...(settings.target ? [settings.target] : []), ...Object.values(settings.targets)]
  ) {
    if (t.spectrum) t.spectrum = rel(t.spectrum);
  }
  for (const k of Object.keys(settings.calibrations)) {
    settings.calibrations[k] = rel(settings.calibrations[k]!);
  }
  return settings;
}

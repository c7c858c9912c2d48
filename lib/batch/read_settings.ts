/**
 * Reads a batch settings file (JSON or YAML) and resolves its relative paths.
 *
 * @module
 */
import { parse as parseYaml, YAMLError } from "yaml";
import { type BatchSettings, resolveSettings, SettingsError } from "./settings_schema.ts";
import { DEFAULT_MAX_FILE_BYTES, readTextLimited } from "./read_limited.ts";

/** Settings files larger than this are refused (a real one is a few kilobytes). */
export const MAX_SETTINGS_BYTES = 1024 * 1024;

/** Where a JSON or YAML parse failed, without quoting the text (it may not be settings at all). */
export function parseFailure(e: unknown, text: string): string {
  if (e instanceof YAMLError) {
    const at = e.linePos?.[0];
    return `${e.code.toLowerCase().replace(/_/g, " ")}${at ? ` at line ${at.line}` : ""}`;
  }
  if (!(e instanceof SyntaxError)) return `cannot parse (${(e as Error)?.name ?? "error"})`;
  const m = /position (\d+)/.exec(e.message);
  if (m) return `not valid JSON at line ${text.slice(0, Number(m[1])).split("\n").length}`;
  return "not valid JSON";
}

/**
 * Reads a settings file (`.json`, `.yaml` or `.yml`).
 *
 * @param warn Receives warnings (unknown keys).
 * @throws {SettingsError} When the file cannot be read or parsed, or a value is wrong.
 */
export async function readSettingsFile(
  path: string,
  warn: (message: string) => void = () => {},
): Promise<BatchSettings> {
  let text: string;
  try {
    text = await readTextLimited(path, Math.min(MAX_SETTINGS_BYTES, DEFAULT_MAX_FILE_BYTES));
  } catch (e) {
    throw new SettingsError(`Cannot read settings file ${(e as Error).message}`);
  }
  let raw: unknown;
  try {
    raw = /\.json$/i.test(path) ? JSON.parse(text) : parseYaml(text, { maxAliasCount: 100 });
  } catch (e) {
    throw new SettingsError(`Cannot parse settings file ${path}: ${parseFailure(e, text)}`);
  }
  let settings: BatchSettings;
  try {
    settings = resolveSettings(raw, (w) => warn(`${path}: ${w}`));
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

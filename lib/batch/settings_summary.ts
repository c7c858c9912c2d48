/**
 * The settings line of the report, written into the results header.
 *
 * @module
 */
import type { BatchSettings } from "./settings_schema.ts";

/** Illuminants, observers, change and surfaces in words. */
export function settingsSummary(settings: BatchSettings): Record<string, string> {
  const c = settings.change;
  return {
    illuminants: settings.illuminants.join(", "),
    observers: settings.observers.map((o) => `${o}°`).join(", "),
    change: `${c.from} → ${c.to}, ${c.observer}°${c.adapt === "none" ? "" : `, ${c.adapt}`}`,
    surfaces: settings.reflection === "host"
      ? `Fresnel (${settings.host ?? (settings.n ? `n ${settings.n}` : "per sample")})`
      : "Beer–Lambert only",
  };
}

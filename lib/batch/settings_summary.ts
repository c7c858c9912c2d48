/**
 * The settings line of the report, written into the results header.
 *
 * @module
 */
import type { BatchSettings } from "./settings_schema.ts";

/** Illuminants, observers, change and surfaces in words. */
export function settingsSummary(settings: BatchSettings): Record<string, string> {
  const c = settings.change, u = settings.uncertainty;
  return {
    illuminants: settings.illuminants.join(", "),
    observers: settings.observers.map((o) => `${o}°`).join(", "),
    change: `${c.from} → ${c.to}, ${c.observer}°${c.adapt === "none" ? "" : `, ${c.adapt}`}`,
    surfaces: settings.reflection === "host"
      ? `Fresnel (${settings.host ?? (settings.n ? `n ${settings.n}` : "per sample")})`
      : settings.reflection === "none"
      ? "Beer–Lambert only"
      : settings.host !== undefined || settings.n !== undefined || settings.sellmeier
      ? `Fresnel (${settings.host ?? (settings.n ? `n ${settings.n}` : "own Sellmeier")})`
      : "Fresnel where the sheet names a host, else Beer–Lambert",
    ...(settings.alphaBase === "10" ? { "α inputs": "decadic (× ln 10)" } : {}),
    ...(u
      ? {
        uncertainty: `noise ${
          u.noiseSd === undefined ? "estimated per spectrum" : `σ ${u.noiseSd}`
        }, level σ ${u.offsetSd}, wavelength σ ${u.wavelengthSdNm} nm, thickness σ ${u.thicknessSdMm} mm, path σ ${u.pathSdMm} mm (the sheet's thickness_sd, path_sd outrank them); pass at ≥ ${
          100 * u.passAt
        } %, fail at ≤ ${100 * u.failAt} %`,
      }
      : {}),
  };
}

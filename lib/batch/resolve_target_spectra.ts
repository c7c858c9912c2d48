/**
 * Targets given as a reference spectrum: reads it and fills in its colors.
 *
 * @module
 */
import { readSpectraFromBytes } from "../io/read_spectra.ts";
import { batchLimits } from "./batch_limits.ts";
import { readFileLimited } from "./read_limited.ts";
import { transmittanceForPath } from "../optics/path_transmittance.ts";
import { spectrumColor } from "../cie/spectrum_color.ts";
import { type BatchSettings, SettingsError } from "./settings_schema.ts";

/**
 * Fills in the target colours of targets given as a reference spectrum (in place).
 *
 * @throws {SettingsError} When the reference spectrum cannot be read.
 */
export async function resolveTargetSpectra(settings: BatchSettings): Promise<void> {
  const all = [...(settings.target ? [settings.target] : []), ...Object.values(settings.targets)];
  for (const t of all) {
    if (!t.spectrum) continue;
    let spectrum;
    try {
      const bytes = await readFileLimited(t.spectrum, batchLimits(settings).maxFileBytes);
      [spectrum] = readSpectraFromBytes(bytes, t.spectrum);
    } catch (e) {
      throw new SettingsError(
        `Cannot read the target's reference spectrum: ${(e as Error).message}`,
      );
    }
    const values = transmittanceForPath(spectrum!, t.spectrumPathMm).values;
    const rows = spectrumColor(spectrum!, {
      illuminants: [t.illuminant, ...t.also.map((c) => c.illuminant)],
      observers: [t.observer],
      transmittance: values,
    });
    [t, ...t.also].forEach((c, i) =>
      Object.assign(c, { L: rows[i]!.L, a: rows[i]!.a, b: rows[i]!.b })
    );
  }
}

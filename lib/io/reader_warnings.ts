/**
 * The reader's notes on one file, each said once: the file's own notes, then the per-spectrum
 * ones, grouped when many spectra share the same kind of note.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";

/** Per-spectrum notes are listed one by one up to this many spectra, then grouped. */
const LISTED = 3;

/**
 * Lines to show for the spectra read from one file: file notes once (not once per spectrum),
 * per-spectrum notes prefixed with the sample, or grouped as "N of M spectra: …".
 */
export function readerWarnings(spectra: readonly Spectrum[]): string[] {
  const out: string[] = [];
  const seen = new Set<unknown>();
  for (const s of spectra) {
    const notes = s.meta.fileWarnings;
    if (!notes || seen.has(notes)) continue;
    seen.add(notes);
    for (const w of notes) if (!out.includes(w.message)) out.push(w.message);
  }
  const noted = spectra.filter((s) => (s.meta.warnings?.length ?? 0) > 0);
  if (noted.length <= LISTED) {
    for (const s of noted) for (const w of s.meta.warnings!) out.push(`${s.meta.sample}: ${w}`);
    return out;
  }
  const groups = new Map<string, number>();
  for (const s of noted) {
    for (const w of s.meta.warnings!) {
      const kind = w.replace(/^\d+\s+/, ""); // "2 value(s) …" and "5 value(s) …" are one kind
      groups.set(kind, (groups.get(kind) ?? 0) + 1);
    }
  }
  for (const [kind, count] of groups) out.push(`${count} of ${spectra.length} spectra: ${kind}`);
  return out;
}

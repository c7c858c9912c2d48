/**
 * Analysis step: where each input value comes from. Thickness, path, host and polarisation can
 * be stated by an option, the sample sheet, the file itself, the batch settings or a default;
 * the first that states a value wins (option > sheet > file > settings > default), and every
 * lower source that disagrees beyond rounding is said out loud.
 *
 * @module
 */
import type { Polarisation, Spectrum, ValueSource } from "../spectrum/spectrum.ts";
import { getHost } from "../optics/refractive_index.ts";
import type { SampleSettings } from "./sample_settings.ts";

function knownHost(name: string): boolean {
  try {
    getHost(name);
    return true;
  } catch {
    return false;
  }
}

/** The precedence of sources, highest first. */
export const SOURCE_PRECEDENCE: readonly ValueSource[] = [
  "option",
  "sheet",
  "file",
  "settings",
  "default",
];

/** A value and the source it was taken from. */
export interface SourcedValue<T> {
  /** The value used, or null when no source states one. */
  value: T | null;
  /** Where it came from, or null when no source states one. */
  source: ValueSource | null;
}

/** Where each input value of a result came from. */
export interface Provenance {
  /** Measured thickness, mm. */
  thicknessMm: SourcedValue<number>;
  /** Path the colours are computed for, mm. */
  pathMm: SourcedValue<number>;
  /** Host crystal. */
  host: SourcedValue<string>;
  /** Polarisation of the measurement. */
  polarisation: SourcedValue<string>;
  /** What the values are (as the reader took them). */
  ordinate: SourcedValue<string>;
  /** The x axis unit (as the reader took it). */
  axis: SourcedValue<string>;
}

/** A candidate value from one source. */
export type Candidate<T> = [source: ValueSource, value: T | undefined];

/** Two numbers agree when within 0.005 (mm) or 0.5 %, the rounding of a stated thickness. */
function sameNumber(a: number, b: number): boolean {
  return Math.abs(a - b) <= Math.max(0.005, 0.005 * Math.max(Math.abs(a), Math.abs(b)));
}

/**
 * The value of the highest source that states one, and a warning for each lower source that
 * disagrees with it.
 *
 * @param what The quantity in words, for the warnings (e.g. `thickness`).
 * @param show How a value is written in a warning (e.g. `(v) => v + " mm"`).
 */
export function reconcile<T extends number | string>(
  what: string,
  candidates: Candidate<T>[],
  show: (v: T) => string,
  warnings: string[],
): SourcedValue<T> {
  const stated = candidates
    .filter((c): c is [ValueSource, T] => c[1] !== undefined)
    .sort((a, b) => SOURCE_PRECEDENCE.indexOf(a[0]) - SOURCE_PRECEDENCE.indexOf(b[0]));
  const first = stated[0];
  if (!first) return { value: null, source: null };
  const same = (a: T, b: T) =>
    typeof a === "number" && typeof b === "number"
      ? sameNumber(a, b)
      : String(a).toLowerCase() === String(b).toLowerCase();
  for (const [source, value] of stated.slice(1)) {
    if (!same(first[1], value)) {
      warnings.push(
        `${what}: the ${first[0]} says ${show(first[1])}, the ${source} says ${show(value)}; ` +
          `using the ${first[0]}'s (precedence ${SOURCE_PRECEDENCE.join(" > ")})`,
      );
    }
  }
  return { value: first[1], source: first[0] };
}

/** The reader's source for a value the options may have overridden. */
function readerSource(
  s: SampleSettings,
  reported: ValueSource | undefined,
): ValueSource | undefined {
  return reported === "option" ? (s.readSource ?? "option") : reported;
}

/**
 * Reconciles the sample's inputs: the spectrum with the thickness and polarisation used, the
 * settings with the path and host used, and where each came from.
 */
export function provenanceStep(
  measured: Spectrum,
  s: SampleSettings,
  warnings: string[],
): { spectrum: Spectrum; settings: SampleSettings; provenance: Provenance } {
  const meta = measured.meta;
  const file = meta.fileValues ?? {};
  const mm = (v: number) => `${v} mm`;
  const thickness = reconcile<number>(
    "thickness",
    [
      ["option", s.read.thicknessMm],
      ["sheet", s.sheet?.thicknessMm],
      ["file", file.thicknessMm?.value],
      ["settings", s.fallbackThicknessMm],
    ],
    mm,
    warnings,
  );
  const polarisation = reconcile<string>(
    "polarisation",
    [
      ["sheet", s.sheet?.polarisation],
      ["file", file.polarisation?.value ?? measured.polarisation],
    ],
    String,
    warnings,
  );
  const settingsHost = typeof s.reflection.host === "string"
    ? s.reflection.host
    : s.reflection.host?.name;
  const host = reconcile<string>(
    "host",
    [
      ["sheet", s.sheet?.host],
      ["file", file.host?.value ?? meta.host],
      ["settings", settingsHost],
    ],
    String,
    warnings,
  );
  const path = reconcile<number>(
    "path",
    [
      ["sheet", s.sheet?.pathMm],
      ["settings", s.pathMm],
      ["default", thickness.value ?? undefined],
    ],
    mm,
    warnings,
  );
  if (path.source === "default") path.value = null; // the measured path: no rescaling
  const spectrum: Spectrum = { ...measured };
  if (thickness.value !== null) spectrum.thicknessMm = thickness.value;
  if (polarisation.value !== null && ["o", "e", "unpolarised"].includes(polarisation.value)) {
    spectrum.polarisation = polarisation.value as Polarisation;
  }
  const settings: SampleSettings = { ...s, reflection: { ...s.reflection } };
  if (path.value !== null) settings.pathMm = path.value;
  // a host read from a file is free text: it is used only if the optics know it
  if (host.value !== null && host.source === "file" && !knownHost(host.value)) {
    warnings.push(`host "${host.value}" named by the file is not a host crystint knows; ignored`);
    host.value = settingsHost ?? null;
    host.source = settingsHost ? "settings" : null;
  }
  if (host.value !== null && host.source !== "settings") settings.reflection.host = host.value;
  const provenance: Provenance = {
    thicknessMm: thickness,
    pathMm: path.value === null
      ? { value: thickness.value, source: thickness.value === null ? null : "default" }
      : path,
    host,
    polarisation,
    ordinate: {
      value: measured.quantity,
      source: readerSource(s, meta.sources?.ordinate) ?? null,
    },
    axis: {
      value: meta.fileValues?.axis?.value ?? (s.read.axis ?? null),
      source: readerSource(s, meta.sources?.axis) ?? null,
    },
  };
  return { spectrum, settings, provenance };
}

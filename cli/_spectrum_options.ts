/**
 * Options shared by the commands that read spectrum files: how to read them, which path to
 * compute for, and how to treat the surfaces.
 *
 * @module
 */
import { axisFromText, ordinateFromText } from "../lib/io/header_units.ts";
import type { ReadOptions } from "../lib/io/read_spectra.ts";
import { readSpectrumFile } from "../lib/io/read_file.ts";
import { readerWarnings } from "../lib/io/reader_warnings.ts";
import type { Spectrum } from "../lib/spectrum/spectrum.ts";
import { getHost, parseSellmeier } from "../lib/optics/refractive_index.ts";
import type { ReflectionSettings } from "../lib/optics/path_transmittance.ts";
import { customIlluminant, getIlluminant, type Illuminant } from "../lib/cie/illuminants.ts";
import { getObserver } from "../lib/cie/observers.ts";
import { log, positiveNumber, reportFailure, UsageError } from "./_shared.ts";

/** parseArgs definitions of the shared options. */
export const SPECTRUM_OPTIONS = {
  ordinate: { type: "string" },
  axis: { type: "string" },
  thickness: { type: "string" },
  path: { type: "string" },
  reflection: { type: "string" },
  host: { type: "string" },
  n: { type: "string" },
  sellmeier: { type: "string" },
  json: { type: "boolean" },
  csv: { type: "boolean" },
  help: { type: "boolean", short: "h" },
} as const;

/** Help text for the shared options. */
export const SPECTRUM_OPTIONS_HELP =
  `  --ordinate KIND     what the values are: transmittance | percent | absorbance | alpha
                      (default: read from the header or preamble)
  --axis UNIT         x axis unit: nm | um | cm-1 | ev (default: read from the header)
  --thickness MM      thickness of the measured slab, mm (overrides the file's metadata)
  --path MM           path length to compute for, mm
  --reflection MODE   none (Beer–Lambert on the measured absorbance, default) or host
                      (remove and restore the two Fresnel surfaces using n(λ))
  --host NAME         host crystal for n(λ): corundum (default with --reflection host), yag,
                      spinel, chrysoberyl, quartz, beryl
  --n VALUE           constant refractive index instead of a host
  --sellmeier COEFFS  your own Sellmeier fit: B1,B2,B3:C1,C2,C3 (C in µm) or A;B…:C… (C in µm²)
  --json | --csv      machine-readable output on stdout`;

interface SharedValues {
  ordinate?: string | undefined;
  axis?: string | undefined;
  thickness?: string | undefined;
  path?: string | undefined;
  reflection?: string | undefined;
  host?: string | undefined;
  n?: string | undefined;
  sellmeier?: string | undefined;
}

/** Reading options from the shared flags. */
export function readOptionsFrom(values: SharedValues): ReadOptions {
  const options: ReadOptions = {};
  if (values.ordinate !== undefined) {
    const kind = ordinateFromText(values.ordinate);
    if (!kind) {
      throw new UsageError(
        `Unknown --ordinate "${values.ordinate}": use transmittance, percent, absorbance or alpha`,
      );
    }
    options.ordinate = kind;
  }
  if (values.axis !== undefined) {
    const axis = axisFromText(values.axis);
    if (!axis) throw new UsageError(`Unknown --axis "${values.axis}": use nm, um, cm-1 or ev`);
    options.axis = axis;
  }
  const thickness = positiveNumber(values.thickness, "thickness");
  if (thickness !== undefined) options.thicknessMm = thickness;
  return options;
}

/** Reflection settings from the shared flags. */
export function reflectionFrom(values: SharedValues): ReflectionSettings {
  const mode = values.reflection ??
    (values.host !== undefined || values.n !== undefined ? "host" : "none");
  if (mode !== "none" && mode !== "host") {
    throw new UsageError(`Unknown --reflection "${mode}": use none or host`);
  }
  const settings: ReflectionSettings = { reflection: mode };
  if (values.host !== undefined) {
    try {
      settings.host = getHost(values.host);
    } catch (e) {
      throw new UsageError((e as Error).message);
    }
  }
  const n = positiveNumber(values.n, "n");
  if (n !== undefined) settings.n = n;
  if (values.sellmeier !== undefined) {
    try {
      settings.dispersion = parseSellmeier(values.sellmeier);
    } catch (e) {
      throw new UsageError((e as Error).message);
    }
  }
  if (
    mode === "host" && settings.host === undefined && settings.n === undefined &&
    !settings.dispersion
  ) {
    // the host most users of this tool measure; said on stderr, so it is never a silent choice
    settings.host = getHost("corundum");
    log(
      "crystint: --reflection host without --host, --n or --sellmeier: using corundum indices (give --host to choose)",
    );
  }
  return settings;
}

/** Resolves illuminant names or SPD files. */
export async function resolveIlluminants(names: string[]): Promise<Illuminant[]> {
  const out: Illuminant[] = [];
  for (const name of names) {
    if (/[\\/]|\.(csv|txt|tsv|dat|spd|jdx)$/i.test(name)) {
      // An SPD is relative power, not a transmittance: read the raw values without the 0..1
      // checks (the absorbance reading applies none) and use them as they are.
      const [spd] = await readSpectrumFile(name, { ordinate: "absorbance" }).catch((e) => {
        throw new UsageError(`Cannot read illuminant SPD: ${(e as Error).message}`);
      });
      out.push(customIlluminant(name, spd!.wavelengthNm, spd!.values));
      continue;
    }
    try {
      out.push(getIlluminant(name));
    } catch (e) {
      throw new UsageError((e as Error).message);
    }
  }
  return out;
}

/** Checks observer names, as a usage error. */
export function checkObservers(names: string[]): string[] {
  for (const o of names) {
    try {
      getObserver(o);
    } catch (e) {
      throw new UsageError((e as Error).message);
    }
  }
  return names;
}

/**
 * Reads each file, hands its spectra to `each`, reports failures; returns the failure count.
 * One bad file never stops the others.
 */
export async function forEachFile(
  files: string[],
  options: ReadOptions,
  each: (spectra: Spectrum[], file: string) => void,
): Promise<number> {
  let failed = 0;
  for (const file of files) {
    try {
      const spectra = await readSpectrumFile(file, options);
      for (const w of readerWarnings(spectra)) log(`crystint: ${file}: ${w}`);
      each(spectra, file);
    } catch (e) {
      failed++;
      reportFailure(e, file);
    }
  }
  if (failed > 0) log(`crystint: ${failed} of ${files.length} file(s) failed`);
  return failed;
}

/**
 * Options shared by the commands that read spectrum files: how to read them, which path to
 * compute for, and how to treat the surfaces.
 *
 * @module
 */
import { axisFromText, ordinateFromText, type OrdinateKind } from "../lib/io/header_units.ts";
import type { AxisUnit } from "../lib/spectrum/axis.ts";
import type { ReadOptions } from "../lib/io/read_spectra.ts";
import { readSpectrumFile } from "../lib/io/read_file.ts";
import { readerWarnings } from "../lib/io/reader_warnings.ts";
import { reconcile } from "../lib/analysis/provenance_step.ts";
import type { Spectrum } from "../lib/spectrum/spectrum.ts";
import { getHost, hostIndex, parseSellmeier } from "../lib/optics/refractive_index.ts";
import { fresnelReflectance } from "../lib/optics/slab.ts";
import {
  photometricFloorWarning,
  type ReflectionSettings,
} from "../lib/optics/path_transmittance.ts";
import { customIlluminant, getIlluminant, type Illuminant } from "../lib/cie/illuminants.ts";
import { getObserver } from "../lib/cie/observers.ts";
import { log, positiveNumber, reportFailure, UsageError } from "./_shared.ts";
import type { ParsedArgs } from "./_command.ts";

/** Logarithm base of α values. */
export type AlphaBase = "e" | "10";

/** The `--ordinate` choice, checked. */
export function ordinateFrom(args: ParsedArgs): OrdinateKind | undefined {
  const text = args.string("ordinate");
  if (text === undefined) return undefined;
  const kind = ordinateFromText(text);
  if (!kind) {
    throw new UsageError(
      `Unknown --ordinate "${text}": use transmittance, percent, absorbance or alpha`,
    );
  }
  return kind;
}

/** The `--axis` choice, checked. */
export function axisFrom(args: ParsedArgs): AxisUnit | undefined {
  const text = args.string("axis");
  if (text === undefined) return undefined;
  const axis = axisFromText(text);
  if (!axis) throw new UsageError(`Unknown --axis "${text}": use nm, um, cm-1 or ev`);
  return axis;
}

/** Reading options from the shared flags. */
export function readOptionsFrom(args: ParsedArgs): ReadOptions {
  const options: ReadOptions = {};
  const ordinate = ordinateFrom(args), axis = axisFrom(args);
  if (ordinate !== undefined) options.ordinate = ordinate;
  if (axis !== undefined) options.axis = axis;
  const thickness = positiveNumber(args.string("thickness"), "thickness");
  if (thickness !== undefined) options.thicknessMm = thickness;
  return options;
}

/** The `--alpha-base` choice (default e). */
export function alphaBaseFrom(args: ParsedArgs): AlphaBase {
  const base = (args.string("alpha-base") ?? "e").trim().toLowerCase();
  if (base === "e" || base === "ln" || base === "natural") return "e";
  if (base === "10" || base === "decadic" || base === "log10") return "10";
  throw new UsageError(`Unknown --alpha-base "${base}": use e (natural) or 10 (decadic)`);
}

/**
 * An α spectrum in the natural-log convention the library uses: decadic α (A = α·d) times
 * ln 10 is natural α (T = exp(−α·d)). Other quantities are returned as they are.
 */
export function naturalAlpha(spectrum: Spectrum, base: AlphaBase): Spectrum {
  if (base === "e" || spectrum.quantity !== "alpha") return spectrum;
  return { ...spectrum, values: spectrum.values.map((v) => v * Math.LN10) };
}

/** Reads one file with the shared flags: reading options, then α converted to base e. */
export async function readWithOptions(file: string, args: ParsedArgs): Promise<Spectrum[]> {
  const base = alphaBaseFrom(args);
  const spectra = await readSpectrumFile(file, readOptionsFrom(args));
  return spectra.map((s) => naturalAlpha(s, base));
}

/** Reflection settings from the shared flags (`host` by default once a host or index is given). */
export function reflectionFrom(args: ParsedArgs): ReflectionSettings {
  const hostName = args.string("host"), nText = args.string("n");
  const sellmeier = args.string("sellmeier");
  const mode = args.string("reflection") ??
    (hostName !== undefined || nText !== undefined || sellmeier !== undefined ? "host" : "none");
  if (mode !== "none" && mode !== "host") {
    throw new UsageError(`Unknown --reflection "${mode}": use none or host`);
  }
  const settings: ReflectionSettings = { reflection: mode };
  if (hostName !== undefined) {
    try {
      settings.host = getHost(hostName);
    } catch (e) {
      throw new UsageError((e as Error).message);
    }
  }
  const n = positiveNumber(nText, "n");
  if (n !== undefined) settings.n = n;
  if (sellmeier !== undefined) {
    try {
      settings.dispersion = parseSellmeier(sellmeier);
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

/** Wavelength at which the surface-loss note quotes R (the sodium D line, as indices are quoted). */
const NOTE_NM = 589;

/**
 * A function that says once on stderr, the first time a measured slab (T, %T or A) is rescaled
 * to another path with `--reflection none`, that its surface losses are scaled with the path,
 * and by how much: Beer–Lambert on the measured absorbance raises the two-surface factor
 * (1 − R)² to the power path/thickness, so T at the new path is off by (1 − R)^(2(p/d − 1)),
 * R = ((n − 1)/(n + 1))² at normal incidence (Fresnel).
 */
export function surfaceLossNote(
  reflection: ReflectionSettings,
  args: ParsedArgs,
): (spectrum: Spectrum, pathMm: number | undefined) => void {
  let said = false;
  const floorSaid = new Set<string>();
  return (spectrum, pathMm) => {
    const file = spectrum.meta.sourceFile ?? spectrum.meta.sample;
    if (!floorSaid.has(file)) {
      const floor = photometricFloorWarning(spectrum, pathMm);
      if (floor.length) floorSaid.add(file);
      for (const w of floor) log(`crystint: ${file}: ${spectrum.meta.sample}: ${w}`);
    }
    if (said || reflection.reflection !== "none" || spectrum.quantity === "alpha") return;
    const d = spectrum.thicknessMm;
    if (pathMm === undefined || d === undefined || !(d > 0) || Math.abs(pathMm - d) < 1e-9) return;
    said = true;
    const hostName = args.string("host");
    const nGiven = positiveNumber(args.string("n"), "n");
    let n: number, what: string;
    if (nGiven !== undefined) [n, what] = [nGiven, `n = ${nGiven}`];
    else {
      const host = getHost(hostName ?? "corundum");
      n = hostIndex(host, NOTE_NM).n;
      what = `${hostName === undefined ? "e.g. " : ""}${host.name}, n = ${
        n.toFixed(3)
      } at ${NOTE_NM} nm`;
    }
    const r = fresnelReflectance(n);
    const pair = (1 - r) ** 2;
    const off = pair ** (pathMm / d - 1);
    log(
      `crystint: --reflection none rescales the measured slab (${d} mm → ${pathMm} mm) with its ` +
        `surface losses: the two-surface factor (1−R)² = ${pair.toFixed(3)} (${what}) is raised ` +
        `to the power path/thickness, so T comes out ×${off.toFixed(3)} of the slab-with-two-` +
        `surfaces value; give --reflection host --host NAME to remove and restore the surfaces`,
    );
  };
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
 * What a command made of a file read a stretch of rows at a time: the spectra without their
 * values (`forEachFile` says their notes) and the command's own result.
 */
export interface StreamedFile<T> {
  spectra: Spectrum[];
  result: T;
}

/**
 * Reads each file with the shared flags, hands its spectra to `each`, reports failures (with
 * flag wording for what a library error says is missing); returns the failure count. One bad
 * file never stops the others. With `streamed`, each file is first offered to it: what it
 * returns goes to `each` as its third argument (the spectra then carry no values); undefined
 * (it declines, or failed) reads the file whole as without it.
 */
export async function forEachFile<T = never>(
  files: string[],
  args: ParsedArgs,
  each: (spectra: Spectrum[], file: string, streamed?: T) => void,
  streamed?: (
    file: string,
    options: ReadOptions,
    base: AlphaBase,
  ) => Promise<StreamedFile<T> | undefined>,
): Promise<number> {
  const options = readOptionsFrom(args);
  const base = alphaBaseFrom(args);
  let failed = 0;
  for (const file of files) {
    try {
      const quick = await streamed?.(file, options, base);
      const spectra = quick?.spectra ??
        (await readSpectrumFile(file, options)).map((s) => naturalAlpha(s, base));
      for (const w of readerWarnings(spectra)) log(`crystint: ${file}: ${w}`);
      // an option outranks the file's own statement, but a disagreement is said once
      const stated = spectra[0]?.meta.fileValues?.thicknessMm?.value;
      if (options.thicknessMm !== undefined && stated !== undefined) {
        const notes: string[] = [];
        reconcile<number>(
          "thickness",
          [
            ["option", options.thicknessMm],
            ["file", stated],
          ],
          (v) => `${v} mm`,
          notes,
        );
        for (const n of notes) log(`crystint: ${file}: ${n}`);
      }
      each(spectra, file, quick?.result);
    } catch (e) {
      failed++;
      reportFailure(e, file);
    }
  }
  if (failed > 0) log(`crystint: ${failed} of ${files.length} file(s) failed`);
  return failed;
}

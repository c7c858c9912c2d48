/**
 * Refractive index of host crystals from their dispersion formulas (see data/hosts.ts).
 *
 * @module
 */
import { type Dispersion, type HostEntry, HOSTS } from "./data/hosts.ts";

export type { Dispersion, HostEntry };

/** n at a wavelength in nm for one dispersion formula. */
export function dispersionIndex(d: Dispersion, wavelengthNm: number): number {
  const l2 = (wavelengthNm / 1000) ** 2;
  switch (d.form) {
    case "constant":
      return d.n;
    case "sellmeier-c":
      return Math.sqrt(1 + d.b.reduce((s, b, i) => s + (b * l2) / (l2 - d.c[i]! ** 2), 0));
    case "sellmeier-a":
      return Math.sqrt(d.a + d.b.reduce((s, b, i) => s + (b * l2) / (l2 - d.c[i]!), 0));
    case "sellmeier-d":
      return Math.sqrt(d.a + (d.b * l2) / (l2 - d.c) - d.d * l2);
  }
}

/**
 * Reads Sellmeier coefficients written as `B1,B2,…:C1,C2,…` (form n² − 1 = Σ Bλ²/(λ² − C²),
 * C in µm), or `A;B1,B2,…:C1,C2,…` (form n² = A + Σ Bλ²/(λ² − C), C in µm²).
 *
 * @throws {SyntaxError} For text that is not of either form.
 */
export function parseSellmeier(text: string): Dispersion {
  const m = /^\s*(?:([-+\d.eE]+)\s*;)?\s*([-+\d.eE,\s]+):([-+\d.eE,\s]+)$/.exec(text);
  const nums = (s: string) => s.split(",").map((v) => Number(v.trim()));
  if (!m) {
    throw new SyntaxError(
      `Cannot read Sellmeier coefficients "${text}": use B1,B2,B3:C1,C2,C3 or A;B…:C…`,
    );
  }
  const b = nums(m[2]!), c = nums(m[3]!);
  if (b.length !== c.length || [...b, ...c].some((v) => !Number.isFinite(v))) {
    throw new SyntaxError(
      `Cannot read Sellmeier coefficients "${text}": as many B as C, all numbers`,
    );
  }
  if (m[1] !== undefined) {
    const a = Number(m[1]);
    if (!Number.isFinite(a)) {
      throw new SyntaxError(`Cannot read Sellmeier coefficients "${text}": A is not a number`);
    }
    return { form: "sellmeier-a", a, b, c };
  }
  return { form: "sellmeier-c", b, c };
}

/**
 * Looks a host up by name or alias (case-insensitive).
 *
 * @throws {RangeError} For an unknown host, listing the known ones.
 */
export function getHost(name: string): HostEntry {
  const key = name.trim().toLowerCase();
  const host = HOSTS.find((h) => h.name === key || h.aliases.includes(key));
  if (!host) {
    throw new RangeError(
      `Unknown host "${name}": use one of ${HOSTS.map((h) => h.name).join(", ")}`,
    );
  }
  return host;
}

/** Result of an index look-up, with a warning when outside the fit's range. */
export interface IndexReading {
  /** Refractive index. */
  n: number;
  /** Why the value is uncertain, when it is (e.g. outside the fit's range). */
  warning?: string;
}

/**
 * Refractive index of a host along a principal direction at a wavelength in nm.
 *
 * @param axis `o`/`e` (uniaxial), `a`/`b`/`c` (biaxial) or `n`; default the first axis.
 * @throws {RangeError} For an axis the host does not have.
 */
export function hostIndex(host: HostEntry, wavelengthNm: number, axis?: string): IndexReading {
  const key = axis ?? Object.keys(host.axes)[0]!;
  const d = host.axes[key];
  if (!d) {
    throw new RangeError(
      `Host ${host.name} has no axis "${key}": use ${Object.keys(host.axes).join(", ")}`,
    );
  }
  const n = dispersionIndex(d, wavelengthNm);
  const um = wavelengthNm / 1000;
  const reading: IndexReading = { n };
  if (um < host.validUm[0] || um > host.validUm[1]) {
    reading.warning = `${host.name}: ${wavelengthNm} nm is outside the fit's ${host.validUm[0]}–${
      host.validUm[1]
    } µm`;
  }
  return reading;
}

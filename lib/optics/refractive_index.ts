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
  n: number;
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

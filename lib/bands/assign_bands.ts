/**
 * Assigns fitted bands to catalogue transitions: a score from the position difference
 * (relative to a tolerance that grows with band width) and the width ratio, with the reason
 * spelled out. A hint, never a certainty: several candidates are listed when they fit alike.
 * Catalogue entries whose position is from memory never make a hint on their own: they are
 * listed only when a published entry of the same ion in the same host matches a band of the
 * same spectrum; a component entry (a shoulder) only beside the band it belongs to. Entries
 * for one polarisation are used only for spectra of that polarisation (or of unknown one).
 *
 * @module
 */
import { BAND_CATALOGUE, type CatalogueBand } from "./data/band_catalogue.ts";
import type { FittedBand } from "./fit_bands.ts";
import type { Polarisation } from "../spectrum/spectrum.ts";

/** A candidate assignment of one fitted band. */
export interface BandAssignment {
  /** Index of the fitted band. */
  bandIndex: number;
  /** Ion, e.g. Cr3+. */
  ion: string;
  /** Host of the catalogue entry. */
  host: string;
  /** Transition or band name. */
  transition: string;
  /** 0..1; 1 is an exact match of position and width. */
  score: number;
  /** Why it matches (position and width against the entry). */
  reason: string;
  /** Published source of the entry. */
  source: string;
  /** published, or from memory (never decisive on its own). */
  status: CatalogueBand["status"];
}

/** Scores below this are not listed (our choice). */
const MIN_SCORE = 0.2;

/**
 * Candidate assignments, best first per band (at most `perBand` each, score ≥ 0.2).
 *
 * @param host Restrict to a host (catalogue name); all hosts when omitted.
 * @param polarisation The spectrum's polarisation; entries for the other ray are left out.
 */
export function assignBands(
  bands: FittedBand[],
  host?: string,
  perBand = 3,
  polarisation?: Polarisation,
): BandAssignment[] {
  const entries = BAND_CATALOGUE.filter((e) =>
    (!host || e.host === host.toLowerCase()) &&
    (!e.ray || !polarisation || polarisation === "unpolarised" || e.ray === polarisation)
  );
  const score = (band: FittedBand, e: CatalogueBand) => {
    const tol = Math.max(300, 0.25 * Math.max(e.fwhmCm1, band.fwhmCm1)) +
      2 * (band.centerCm1Sigma ?? 0);
    const widthRatio = Math.max(band.fwhmCm1, e.fwhmCm1) /
      Math.max(1, Math.min(band.fwhmCm1, e.fwhmCm1));
    return Math.exp(-0.5 * ((band.centerCm1 - e.centerCm1) / tol) ** 2) *
      Math.exp(-0.5 * (Math.log(widthRatio) / Math.log(2.5)) ** 2);
  };
  // ions (per host) that a published entry places in this spectrum, and the transitions seen
  const present = new Set<string>(), seen = new Set<string>();
  for (const e of entries) {
    if (e.status === "published" && bands.some((b) => score(b, e) >= MIN_SCORE)) {
      present.add(`${e.ion}|${e.host}`);
      seen.add(`${e.ion}|${e.host}|${e.transition}`);
    }
  }
  const out: BandAssignment[] = [];
  bands.forEach((band, bandIndex) => {
    const scored = entries
      .filter((e) => e.status === "published" || present.has(`${e.ion}|${e.host}`))
      // a component (the shoulder of a band) only beside the band it belongs to
      .filter((e) => !e.requires || seen.has(`${e.ion}|${e.host}|${e.requires}`))
      .map((e) => {
        const reason = assignmentReason(band, e);
        return {
          bandIndex,
          ion: e.ion,
          host: e.host,
          transition: e.transition,
          score: score(band, e),
          reason,
          source: e.source,
          status: e.status,
        };
      })
      .filter((a) => a.score >= MIN_SCORE)
      .sort((a, b) => b.score - a.score)
      .slice(0, perBand);
    out.push(...scored);
  });
  return out;
}

/**
 * Why a band matches a catalogue entry, in words: its centre and FWHM against the entry's, and
 * the caution for an entry from memory. Results files keep the entry once and rebuild this.
 */
export function assignmentReason(
  band: Pick<FittedBand, "centerCm1" | "fwhmCm1">,
  entry: Pick<CatalogueBand, "ion" | "centerCm1" | "fwhmCm1" | "status">,
): string {
  const dPos = band.centerCm1 - entry.centerCm1;
  return `centre ${band.centerCm1.toFixed(0)} cm⁻¹ vs ${entry.centerCm1} (${dPos >= 0 ? "+" : ""}${
    dPos.toFixed(0)
  }), FWHM ${band.fwhmCm1.toFixed(0)} vs ${entry.fwhmCm1} cm⁻¹${
    entry.status === "published"
      ? ""
      : `; catalogue position from memory, unverified, listed because a published ${entry.ion} band matches this spectrum`
  }`;
}

/**
 * Assigns fitted bands to catalogue transitions: a score from the position difference
 * (relative to a tolerance that grows with band width) and the width ratio, with the reason
 * spelled out. A hint, never a certainty: several candidates are listed when they fit alike.
 *
 * @module
 */
import { BAND_CATALOGUE, type CatalogueBand } from "./data/band_catalogue.ts";
import type { FittedBand } from "./fit_bands.ts";

/** A candidate assignment of one fitted band. */
export interface BandAssignment {
  bandIndex: number;
  ion: string;
  host: string;
  transition: string;
  /** 0..1; 1 is an exact match of position and width. */
  score: number;
  reason: string;
  source: string;
  status: CatalogueBand["status"];
}

/**
 * Candidate assignments, best first per band (at most `perBand` each, score ≥ 0.2).
 *
 * @param host Restrict to a host (catalogue name); all hosts when omitted.
 */
export function assignBands(bands: FittedBand[], host?: string, perBand = 3): BandAssignment[] {
  const entries = BAND_CATALOGUE.filter((e) => !host || e.host === host.toLowerCase());
  const out: BandAssignment[] = [];
  bands.forEach((band, bandIndex) => {
    const scored = entries.map((e) => {
      const tol = Math.max(300, 0.25 * Math.max(e.fwhmCm1, band.fwhmCm1)) +
        2 * (band.centerCm1Sigma ?? 0);
      const dPos = band.centerCm1 - e.centerCm1;
      const widthRatio = Math.max(band.fwhmCm1, e.fwhmCm1) /
        Math.max(1, Math.min(band.fwhmCm1, e.fwhmCm1));
      const score = Math.exp(-0.5 * (dPos / tol) ** 2) *
        Math.exp(-0.5 * (Math.log(widthRatio) / Math.log(2.5)) ** 2);
      const reason =
        `centre ${band.centerCm1.toFixed(0)} cm⁻¹ vs ${e.centerCm1} (${dPos >= 0 ? "+" : ""}${
          dPos.toFixed(0)
        }), ` +
        `FWHM ${band.fwhmCm1.toFixed(0)} vs ${e.fwhmCm1} cm⁻¹${
          e.status === "published" ? "" : "; catalogue figure from memory, unverified"
        }`;
      return {
        bandIndex,
        ion: e.ion,
        host: e.host,
        transition: e.transition,
        score,
        reason,
        source: e.source,
        status: e.status,
      };
    }).filter((a) => a.score >= 0.2).sort((a, b) => b.score - a.score).slice(0, perBand);
    out.push(...scored);
  });
  return out;
}

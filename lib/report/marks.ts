/**
 * The marks the report (and the CLI tables) put beside values, with the words that explain
 * them where they appear. One table, so page, legend and tooltips say the same thing.
 *
 * @module
 */

/** A mark and its explanation. */
export interface Mark {
  /** What is printed. */
  symbol: string;
  /** What it means, in one sentence. */
  text: string;
  /** A few words for a hover on each marked row (the sentence is in the key under the table). */
  hint: string;
}

/** The report's marks. */
export const MARKS = {
  outOfGamut: {
    symbol: "◆",
    text:
      "colour outside sRGB: the swatch is shown with reduced CIELAB chroma at the same L* and hue",
    hint: "outside sRGB: swatch at reduced chroma",
  },
  marked: {
    symbol: "marked",
    text:
      "colour change at or above the settings' hue threshold with enough chroma under both lights (common practice, not a standard)",
    hint: "hue change at or above the threshold",
  },
} as const satisfies Record<string, Mark>;

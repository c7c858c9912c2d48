/**
 * Colour throughput: 10,000 spectra of 401 points from one CSV, 2 illuminants × 2 observers.
 * Budget (design notes): well above a C reference doing one illuminant × one observer.
 */
import { readSpectraFromBytes } from "../lib/io/read_spectra.ts";
import { spectrumColour } from "../lib/cie/spectrum_colour.ts";
import { tristimulusWeights, weightedXyz } from "../lib/cie/tristimulus.ts";

const nm = Array.from({ length: 401 }, (_, i) => 380 + i);
const columns = 10000;
// one wide CSV: x column and 10,000 spectra (built once, in memory)
const header = ["nm", ...Array.from({ length: columns }, (_, k) => `s${k} T`)].join(",");
const lines = nm.map((w) =>
  [w, ...Array.from({ length: columns }, (_, k) => (0.5 + 0.4 * Math.sin(w / 40 + k)).toFixed(4))]
    .join(",")
);
const bytes = new TextEncoder().encode(`${header}\n${lines.join("\n")}\n`);

Deno.bench("read one CSV of 10,000 spectra × 401 points", { group: "colour" }, () => {
  readSpectraFromBytes(bytes, "bench.csv");
});

const spectra = readSpectraFromBytes(bytes, "bench.csv");
Deno.bench(
  "colour of 10,000 spectra, D65 + A, 2° + 10°",
  { group: "colour", baseline: true },
  () => {
    for (const s of spectra) {
      spectrumColour(s, {
        illuminants: ["D65", "A"],
        observers: ["2", "10"],
      });
    }
  },
);

const weights = tristimulusWeights(spectra[0]!.wavelengthNm, "D65", "2");
Deno.bench("XYZ only of 10,000 spectra, cached weights, D65 2°", { group: "colour" }, () => {
  for (const s of spectra) weightedXyz(s.values, weights);
});

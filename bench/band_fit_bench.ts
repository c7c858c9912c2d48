/**
 * Band fit speed (budget: a few milliseconds for 3–4 bands on 900 points). The ratio against
 * ml-spectra-fitting is printed only when that package is installed as a dev-only import.
 */
import { fitBandsCm1 } from "../lib/bands/fit_bands.ts";
import { analyseBands } from "../lib/bands/analyse_bands.ts";
import { seededNormal } from "../test/_random.ts";

const K = 2 * Math.sqrt(2 * Math.LN2);
const nm = Array.from({ length: 900 }, (_, i) => 330 + i * 0.6);
const x = nm.map((v) => 1e7 / v);
const normal = seededNormal(1);
const three = [[14400, 900, 0.3], [18000, 2800, 1], [24500, 3200, 1.3]];
const four = [[16000, 900, 0.5], [17000, 900, 0.7], [18000, 900, 0.6], [25500, 2500, 0.4]];
const spectrum = (bands: number[][]) =>
  x.map((nu) =>
    0.05 + 0.02 * (nu - 20000) / 10000 +
    bands.reduce((s, [c, f, h]) => s + h! * Math.exp(-0.5 * ((nu - c!) / (f! / K)) ** 2), 0) +
    0.002 * normal()
  );
const starts = (bands: number[][], off: number) =>
  bands.map(([c, f, h]) => ({
    centerCm1: c! * (1 + off),
    fwhmCm1: f! * (1 - off),
    height: h!,
    significance: 1,
  }));
const y3 = spectrum(three), y4 = spectrum(four);
const sigma = x.map(() => 0.002);
const c3 = starts(three, 0.01), c4 = starts(four, 0.01);

Deno.bench("fit 3 Gaussian bands + default baseline, 900 points (starts 1 % off)", () => {
  fitBandsCm1(x, y3, { candidates: c3, sigma });
});
Deno.bench(
  "fit 4 overlapping Gaussian bands + default baseline, 900 points (starts 1 % off)",
  () => {
    fitBandsCm1(x, y4, { candidates: c4, sigma });
  },
);
Deno.bench("detect, fit and choose the model (BIC), 900 points", () => {
  fitBandsCm1(x, y3);
});
const wavelengthNm = Float64Array.from(nm);
const export3 = {
  wavelengthNm,
  values: Float64Array.from(y3),
  quantity: "absorbance" as const,
  meta: { sample: "bench" },
};
Deno.bench("whole analysis of an absorbance export (usable range, noise, fit, assignment)", () => {
  analyseBands(export3);
});

/**
 * Band fit speed (budget: ≥ 30× ml-spectra-fitting on 4 Gaussians, 900 points, same starts).
 * ml-spectra-fitting (npm, bench-only import; Levenberg–Marquardt, no baseline term) gets the
 * spectrum with its true linear baseline removed, its best case; crystint fits the raw spectrum
 * with its default baseline. Both RMS residuals are printed once at load so the ratio is read
 * at equal residual.
 */
import { optimize } from "ml-spectra-fitting";
import { fitBandsCm1 } from "../lib/mod.ts";
import { analyseBands } from "../lib/bands/analyse_bands.ts";
import { seededNormal } from "../test/_random.ts";

const K = 2 * Math.sqrt(2 * Math.LN2);
const nm = Array.from({ length: 900 }, (_, i) => 330 + i * 0.6);
const x = nm.map((v) => 1e7 / v);
const normal = seededNormal(1);
const three = [[14400, 900, 0.3], [18000, 2800, 1], [24500, 3200, 1.3]];
const four = [[16000, 900, 0.5], [17000, 900, 0.7], [18000, 900, 0.6], [25500, 2500, 0.4]];
const baseline = (nu: number) => 0.05 + 0.02 * (nu - 20000) / 10000;
const spectrum = (bands: number[][]) =>
  x.map((nu) =>
    baseline(nu) +
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

// ml-spectra-fitting wants x ascending: the same points, reversed, baseline removed.
const peerX = x.slice().reverse();
const peerY = y4.map((v, i) => v - baseline(x[i]!)).reverse();
const peerPeaks = c4.map((c) => ({
  x: c.centerCm1,
  y: c.height,
  shape: { kind: "gaussian" as const, fwhm: c.fwhmCm1 },
}));
const peerFit = () => optimize({ x: peerX, y: peerY }, peerPeaks);
{
  const ours = fitBandsCm1(x, y4, { candidates: c4, sigma });
  const peer = peerFit();
  const model = (nu: number) =>
    peer.peaks.reduce(
      (s, p) => s + p.y * Math.exp(-0.5 * ((nu - p.x) / ((p.shape.fwhm ?? 1) / K)) ** 2),
      0,
    );
  const peerRms = Math.sqrt(
    peerY.reduce((s, v, i) => s + (v - model(peerX[i]!)) ** 2, 0) / peerY.length,
  );
  console.log(
    `4 Gaussians, 900 points: RMS residual crystint (default baseline) ${
      ours.residualRms.toExponential(3)
    }, ml-spectra-fitting (true baseline removed) ${peerRms.toExponential(3)}, noise σ 2.000e-3`,
  );
}

Deno.bench("ml-spectra-fitting optimize, 4 Gaussians, 900 points, same starts (peer)", {
  group: "band fit 4 Gaussians",
}, () => {
  peerFit();
});

Deno.bench("fit 3 Gaussian bands + default baseline, 900 points (starts 1 % off)", () => {
  fitBandsCm1(x, y3, { candidates: c3, sigma });
});
Deno.bench(
  "fit 4 overlapping Gaussian bands + default baseline, 900 points (starts 1 % off)",
  { group: "band fit 4 Gaussians", baseline: true },
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

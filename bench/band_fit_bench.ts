/** Band fit speed: three Gaussians + baseline on 900 points (budget: a few milliseconds). */
import { fitBandsCm1 } from "../lib/bands/fit_bands.ts";

const nm = Array.from({ length: 900 }, (_, i) => 330 + i * 0.6);
const x = nm.map((v) => 1e7 / v);
const K = 2 * Math.sqrt(2 * Math.LN2);
const y = x.map((nu, i) =>
  0.05 + [[14400, 900, 0.3], [18000, 2800, 1], [24500, 3200, 1.3]].reduce(
    (s, [c, f, h]) => s + h! * Math.exp(-0.5 * ((nu - c!) / (f! / K)) ** 2),
    0,
  ) + 0.004 * Math.sin(i * 12.9898)
);
const candidates = [[14400, 900, 0.3], [18000, 2800, 1], [24500, 3200, 1.3]].map(([c, f, h]) => ({
  centerCm1: c!,
  fwhmCm1: f!,
  height: h!,
  significance: 1,
}));

Deno.bench("fit 3 Gaussian bands + baseline, 900 points (given starts)", () => {
  fitBandsCm1(x, y, { candidates });
});
Deno.bench("detect and fit, 900 points", () => {
  fitBandsCm1(x, y);
});

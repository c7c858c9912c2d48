/**
 * CIEDE2000 per pair: crystint's `deltaE2000({L,a,b},{L,a,b})` and `deltaE2000Many` against
 * colorjs.io (npm, bench-only import) on the same 10,000 seeded pairs, in the same process.
 * Budget (design notes): ≥ 20× colorjs.io per pair. Deno prints the ratio in each group summary
 * ("× faster than"); the agreement with colorjs.io is printed once at load.
 */
import Color from "colorjs.io";
import { deltaE2000 } from "../lib/mod.ts";
import { deltaE2000Many } from "../lib/cie/delta_e2000_many.ts";

const PAIRS = 10_000;
let seed = 12345;
const rnd = () => {
  seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
  return seed / 4294967296;
};
const labs1: { L: number; a: number; b: number }[] = [];
const labs2: { L: number; a: number; b: number }[] = [];
const packed1 = new Float64Array(3 * PAIRS), packed2 = new Float64Array(3 * PAIRS);
for (let i = 0; i < PAIRS; i++) {
  const p = { L: 100 * rnd(), a: 160 * rnd() - 80, b: 160 * rnd() - 80 };
  // sample near the reference, as in tolerancing: ΔE up to ~10
  const q = { L: p.L + 8 * rnd() - 4, a: p.a + 12 * rnd() - 6, b: p.b + 12 * rnd() - 6 };
  labs1.push(p);
  labs2.push(q);
  packed1.set([p.L, p.a, p.b], 3 * i);
  packed2.set([q.L, q.a, q.b], 3 * i);
}
const colors1 = labs1.map((p) => new Color("lab", [p.L, p.a, p.b]));
const colors2 = labs2.map((p) => new Color("lab", [p.L, p.a, p.b]));
const out = new Float64Array(PAIRS);

let worst = 0;
for (let i = 0; i < PAIRS; i++) {
  worst = Math.max(
    worst,
    Math.abs(deltaE2000(labs1[i]!, labs2[i]!) - colors1[i]!.deltaE2000(colors2[i]!)),
  );
}
console.log(
  `ΔE00 crystint vs colorjs.io on ${PAIRS} pairs: largest difference ${worst.toExponential(2)}`,
);

let sink = 0;
const colorjsRun = () => {
  for (let i = 0; i < PAIRS; i++) sink += colors1[i]!.deltaE2000(colors2[i]!);
};
const objectRun = () => {
  for (let i = 0; i < PAIRS; i++) sink += deltaE2000(labs1[i]!, labs2[i]!);
};
const packedRun = () => {
  deltaE2000Many(packed1, packed2, out);
  sink += out[0]!;
};

/**
 * Interleaved rounds of peer and ours: the ratio of the best times (the usual estimator on a
 * shared machine, where load only ever adds time) and the median of the per-round ratios.
 */
function ratios(peer: () => void, ours: () => void, rounds = 41): { best: number; median: number } {
  const time = (f: () => void) => {
    const t0 = performance.now();
    f();
    return performance.now() - t0;
  };
  for (let i = 0; i < 5; i++) time(peer), time(ours);
  const each: number[] = [];
  let bestPeer = Infinity, bestOurs = Infinity;
  for (let r = 0; r < rounds; r++) {
    const p = time(peer), o = time(ours);
    bestPeer = Math.min(bestPeer, p);
    bestOurs = Math.min(bestOurs, o);
    each.push(p / o);
  }
  each.sort((x, y) => x - y);
  return { best: bestPeer / bestOurs, median: each[rounds >> 1]! };
}
const objectRatio = ratios(colorjsRun, objectRun), packedRatio = ratios(colorjsRun, packedRun);
console.log(
  `ΔE00 ratio colorjs.io / crystint per pair (41 interleaved rounds of ${PAIRS}, best / median): ` +
    `deltaE2000 ${objectRatio.best.toFixed(1)}× / ${objectRatio.median.toFixed(1)}×, ` +
    `deltaE2000Many ${packedRatio.best.toFixed(1)}× / ${packedRatio.median.toFixed(1)}×`,
);

Deno.bench("colorjs.io Color#deltaE2000, 10,000 pairs", { group: "ΔE00", baseline: true }, () => {
  colorjsRun();
});
Deno.bench("crystint deltaE2000({L,a,b},{L,a,b}), 10,000 pairs", { group: "ΔE00" }, () => {
  objectRun();
});
Deno.bench("crystint deltaE2000Many(Float64Array…), 10,000 pairs", { group: "ΔE00" }, () => {
  packedRun();
});
globalThis.addEventListener("unload", () => {
  if (Number.isNaN(sink)) console.log("unexpected NaN");
});

/**
 * Colour throughput: 10,000 spectra of 401 points from one CSV, 2 illuminants × 2 observers.
 * Budget (design notes): well above a C reference doing one illuminant × one observer. When
 * Debian's argyll is installed, its `spec2cie` runs on the same 10,000 spectra (D65, 1931 2°)
 * and the ratios are printed at load; without it the peer is skipped with a message. Also: the
 * colour of one 200,000-point export (weights built from scratch), which must stay well under
 * a second now that the weights are linear in the number of points.
 */
import { readSpectraFromBytes } from "../lib/io/read_spectra.ts";
import { spectrumColor } from "../lib/cie/spectrum_color.ts";
import { tristimulusWeights, weightedXyz } from "../lib/cie/tristimulus.ts";
import { conditionsOf, spectraColorRows, spectraToXyz } from "../lib/cie/spectra_color_many.ts";
import { transmittanceToXyz } from "../lib/cie/tristimulus.ts";

const nm = Array.from({ length: 401 }, (_, i) => 380 + i);
const columns = 10000;
const cell = (w: number, k: number) => (0.5 + 0.4 * Math.sin(w / 40 + k)).toFixed(4);
// one wide CSV: x column and 10,000 spectra (built once, in memory)
const header = ["nm", ...Array.from({ length: columns }, (_, k) => `s${k} T`)].join(",");
const lines = nm.map((w) =>
  [w, ...Array.from({ length: columns }, (_, k) => cell(w, k))].join(",")
);
const bytes = new TextEncoder().encode(`${header}\n${lines.join("\n")}\n`);

Deno.bench("read one CSV of 10,000 spectra × 401 points", { group: "colour" }, () => {
  readSpectraFromBytes(bytes, "bench.csv");
});

const spectra = readSpectraFromBytes(bytes, "bench.csv");
Deno.bench(
  "colour of 10,000 spectra, D65 + A, 2° + 10°, spectrumColor one by one",
  { group: "colour", baseline: true },
  () => {
    for (const s of spectra) {
      spectrumColor(s, {
        illuminants: ["D65", "A"],
        observers: ["2", "10"],
      });
    }
  },
);

const grid = spectra[0]!.wavelengthNm;
const onGrid = { wavelengthNm: grid, values: spectra.map((s) => s.values) };
const samples = spectra.map((s) => s.meta.sample);
const twoByTwo = conditionsOf(["D65", "A"], ["2", "10"]);
const oneByOne = conditionsOf(["D65"], ["2"]);
Deno.bench(
  "colour of 10,000 spectra, D65 + A, 2° + 10°, full rows in one pass (spectraColorRows)",
  { group: "colour" },
  () => {
    spectraColorRows(onGrid, twoByTwo, { samples, file: "bench.csv" });
  },
);
Deno.bench("XYZ of 10,000 spectra, D65 + A, 2° + 10°, one pass (spectraToXyz)", {
  group: "colour",
}, () => {
  spectraToXyz(onGrid, twoByTwo);
});

const weights = tristimulusWeights(grid, "D65", "2");
Deno.bench("XYZ only of 10,000 spectra, cached weights, D65 2°", { group: "colour" }, () => {
  for (const s of spectra) weightedXyz(s.values, weights);
});

// One 200,000-point export: a fresh grid each time, so the weights are built, not cached.
const big = 200_000;
let shift = 0;
const bigValues = Float64Array.from({ length: big }, (_, i) => 0.5 + 0.4 * Math.sin(i / 9000));
Deno.bench("colour of one 200,000-point export, weights built from scratch", {
  group: "large export",
}, () => {
  shift += 1e-7;
  const axis = Float64Array.from({ length: big }, (_, i) => 350 + shift + i * 0.0025);
  transmittanceToXyz(axis, bigValues, "D65", "2");
});

Deno.bench("colour of one 200,000-point irregular export (PCHIP, resampled per spectrum)", {
  group: "large export",
}, () => {
  shift += 1e-7;
  const axis = Float64Array.from(
    { length: big },
    (_, i) => 350 + shift + i * 0.0025 + 2e-4 * Math.sin(i),
  );
  transmittanceToXyz(axis, bigValues, "A", "10");
});

/** Wall time of the best of `runs` calls, ms. */
function best(runs: number, f: () => void): number {
  let t = Infinity;
  for (let r = 0; r < runs; r++) {
    const t0 = performance.now();
    f();
    t = Math.min(t, performance.now() - t0);
  }
  return t;
}

/** The same 10,000 spectra as a CGATS .ti3 file for spec2cie (its SPECTRAL_* keywords). */
function cgats(): string {
  const names = nm.map((w) => `SPEC_${w}`).join(" ");
  const fields = nm.length + 1;
  const rows: string[] = [];
  for (let k = 0; k < columns; k++) rows.push(`${k + 1} ${nm.map((w) => cell(w, k)).join(" ")}`);
  return `CTI3\n\nDESCRIPTOR "bench"\nORIGINATOR "crystint bench"\n` +
    `KEYWORD "DEVICE_CLASS"\nDEVICE_CLASS "OUTPUT"\n` +
    `KEYWORD "MEAS_TYPE"\nMEAS_TYPE "TRANSMISSIVE"\n` +
    `KEYWORD "SPECTRAL_BANDS"\nSPECTRAL_BANDS "${nm.length}"\n` +
    `KEYWORD "SPECTRAL_START_NM"\nSPECTRAL_START_NM "380.000000"\n` +
    `KEYWORD "SPECTRAL_END_NM"\nSPECTRAL_END_NM "780.000000"\n` +
    `KEYWORD "SPECTRAL_NORM"\nSPECTRAL_NORM "1.0"\n` +
    `NUMBER_OF_FIELDS ${fields}\nBEGIN_DATA_FORMAT\nSAMPLE_ID ${names}\nEND_DATA_FORMAT\n\n` +
    `NUMBER_OF_SETS ${columns}\nBEGIN_DATA\n${rows.join("\n")}\nEND_DATA\n`;
}

async function comparePeer(): Promise<void> {
  const ours1 = best(5, () => spectraColorRows(onGrid, oneByOne, { samples }));
  const ours4 = best(5, () => spectraColorRows(onGrid, twoByTwo, { samples }));
  const xyz4 = best(5, () => spectraToXyz(onGrid, twoByTwo));
  const withRead4 = best(3, () => {
    const s = readSpectraFromBytes(bytes, "bench.csv");
    spectraColorRows(
      { wavelengthNm: s[0]!.wavelengthNm, values: s.map((x) => x.values) },
      twoByTwo,
      { samples },
    );
  });
  console.log(
    `crystint, 10,000 spectra × 401 points: full rows 1×1 ${ours1.toFixed(0)} ms, ` +
      `2×2 ${ours4.toFixed(0)} ms, XYZ only 2×2 ${xyz4.toFixed(1)} ms, ` +
      `CSV read + full rows 2×2 ${withRead4.toFixed(0)} ms`,
  );
  let peer: string | undefined;
  for (const dir of (Deno.env.get("PATH") ?? "/usr/bin").split(":")) {
    try {
      if (Deno.statSync(`${dir}/spec2cie`).isFile) peer = `${dir}/spec2cie`;
    } catch { /* not here */ }
    if (peer) break;
  }
  if (!peer) {
    console.log("spec2cie not installed (Debian argyll): peer comparison skipped");
    return;
  }
  const dir = Deno.makeTempDirSync({ prefix: "crystint-bench-" });
  try {
    Deno.writeTextFileSync(`${dir}/in.ti3`, cgats());
    let peerMs = Infinity;
    for (let r = 0; r < 2; r++) {
      const t0 = performance.now();
      const out = await new Deno.Command(peer, {
        args: ["-n", "-i", "D65", "-o", "1931_2", `${dir}/in.ti3`, `${dir}/out.ti3`],
        stdout: "null",
        stderr: "piped",
      }).output();
      peerMs = Math.min(peerMs, performance.now() - t0);
      if (!out.success) {
        console.log(`spec2cie failed: ${new TextDecoder().decode(out.stderr).trim()}`);
        return;
      }
    }
    console.log(
      `spec2cie (argyll) D65 1931 2°, 10,000 spectra from its file: ${peerMs.toFixed(0)} ms; ` +
        `ratios spec2cie / crystint: full rows 1×1 ${(peerMs / ours1).toFixed(1)}×, ` +
        `full rows 2×2 ${(peerMs / ours4).toFixed(1)}×, CSV read + full rows 2×2 ` +
        `${(peerMs / withRead4).toFixed(1)}×`,
    );
  } finally {
    Deno.removeSync(dir, { recursive: true });
  }
}
await comparePeer();

/**
 * End to end, as a user runs it: `crystint color` on one CSV of 10,000 spectra × 401 points,
 * 2 illuminants × 2 observers, CSV to stdout, against Argyll's `spec2cie` (Debian package
 * argyll) doing 1 illuminant × 1 observer on the same spectra. The peer is skipped when it is
 * not installed. `deno bench` prints the ratio of the group ("× faster than").
 */
const SPECTRA = 10_000, FROM = 380, POINTS = 401;
const dir = await Deno.makeTempDir({ prefix: "crystint-bench-" });
const csv = `${dir}/lot.csv`, ti3 = `${dir}/lot.ti3`;
// 56 MB of inputs: removed when the bench process ends.
globalThis.addEventListener("unload", () => Deno.removeSync(dir, { recursive: true }));

/** A smooth, different transmittance per spectrum (invented; speed only). */
const t = (k: number, i: number) => 0.5 + 0.4 * Math.sin((FROM + i) / 40 + k);

{
  const header = ["wavelength_nm", ...Array.from({ length: SPECTRA }, (_, k) => `s${k}`)];
  const lines = [header.join(",")];
  for (let i = 0; i < POINTS; i++) {
    const row = [String(FROM + i)];
    for (let k = 0; k < SPECTRA; k++) row.push(t(k, i).toFixed(4));
    lines.push(row.join(","));
  }
  await Deno.writeTextFile(csv, lines.join("\n") + "\n");
  const fields = Array.from({ length: POINTS }, (_, i) => `SPEC_${FROM + i}`);
  const sets = Array.from(
    { length: SPECTRA },
    (_, k) =>
      [String(k + 1), ...Array.from({ length: POINTS }, (_, i) => t(k, i).toFixed(4))].join(" "),
  );
  await Deno.writeTextFile(
    ti3,
    `CTI3\nDESCRIPTOR "bench"\nORIGINATOR "crystint bench"\n` +
      `KEYWORD "DEVICE_CLASS"\nDEVICE_CLASS "OUTPUT"\nKEYWORD "MEAS_TYPE"\nMEAS_TYPE "TRANSMISSIVE"\n` +
      `KEYWORD "SPECTRAL_BANDS"\n` +
      `SPECTRAL_BANDS "${POINTS}"\nKEYWORD "SPECTRAL_START_NM"\nSPECTRAL_START_NM "${FROM}.0"\n` +
      `KEYWORD "SPECTRAL_END_NM"\nSPECTRAL_END_NM "${FROM + POINTS - 1}.0"\n` +
      `KEYWORD "SPECTRAL_NORM"\nSPECTRAL_NORM "1.0"\nNUMBER_OF_FIELDS ${POINTS + 1}\n` +
      `BEGIN_DATA_FORMAT\nSAMPLE_ID ${fields.join(" ")}\nEND_DATA_FORMAT\n` +
      `NUMBER_OF_SETS ${SPECTRA}\nBEGIN_DATA\n${sets.join("\n")}\nEND_DATA\n`,
  );
}

const main = new URL("../cli/main.ts", import.meta.url).pathname;
const run = async (cmd: string, args: string[]) => {
  const out = await new Deno.Command(cmd, { args, stdout: "null", stderr: "piped" }).output();
  if (out.code !== 0) {
    const tail = new TextDecoder().decode(out.stderr).slice(-600);
    throw new Error(`${cmd} exited ${out.code}: ${tail}`);
  }
};
/** Whether Argyll's spec2cie can be started (spawning a missing program throws at once). */
async function peerInstalled(): Promise<boolean> {
  try {
    await new Deno.Command("spec2cie", { args: ["-?"], stdout: "null", stderr: "null" }).output();
    return true;
  } catch {
    return false;
  }
}
const havePeer = await peerInstalled();
if (!havePeer) console.log("spec2cie not installed (Debian argyll): end-to-end peer skipped");

const colorArgs = [
  "run",
  // as `deno task crystint` runs it: young generations of 1 MB (V8 otherwise grows them to
  // tens of MB while the rows stream through), a full collection at 20 % heap growth
  "--v8-flags=--max-semi-space-size=1,--heap-growing-percent=20",
  "--allow-read",
  main,
  "color",
  csv,
  "--illuminant",
  "D65,A",
  "--observer",
  "2,10",
  "--ordinate",
  "transmittance",
  "--csv",
];

// Once at load: peak RSS of one `crystint color` run against the input size (budget ≤ 3×),
// and how many lines it wrote to stderr (warnings should come once per file).
try {
  const out = await new Deno.Command("/usr/bin/time", {
    args: ["-v", Deno.execPath(), ...colorArgs],
    stdout: "null",
    stderr: "piped",
  }).output();
  const text = new TextDecoder().decode(out.stderr);
  const rssKb = Number(/Maximum resident set size \(kbytes\): (\d+)/.exec(text)?.[1] ?? NaN);
  const wall = /Elapsed \(wall clock\)[^\n]*: ([\d:.]+)/.exec(text)?.[1];
  const size = (await Deno.stat(csv)).size;
  const timeAt = text.indexOf("\tCommand being timed");
  const stderrLines = text.slice(0, timeAt < 0 ? text.length : timeAt).split("\n")
    .filter((l) => l.trim() !== "").length;
  console.log(
    `crystint color, one run: ${wall} wall, peak RSS ${(rssKb / 1024).toFixed(0)} MB for a ` +
      `${(size / 1e6).toFixed(1)} MB input (${(rssKb * 1024 / size).toFixed(2)}× the input), ` +
      `${stderrLines} stderr line(s), exit ${out.code}`,
  );
} catch {
  console.log("peak RSS not measured: /usr/bin/time is missing (Debian package time)");
}

Deno.bench("crystint color, 10,000 spectra, D65+A × 2°+10°, CSV out", {
  group: "color end to end",
  baseline: true,
  n: 3,
  warmup: 1,
}, async () => {
  await run(Deno.execPath(), colorArgs);
});

Deno.bench({
  name: "Argyll spec2cie, same spectra, D65 × 2° (peer)",
  group: "color end to end",
  ignore: !havePeer,
  n: 3,
  warmup: 1,
  async fn() {
    await run("spec2cie", ["-i", "D65", "-o", "1931_2", ti3, `${dir}/out.ti3`]);
  },
});

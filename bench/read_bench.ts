/**
 * Reader throughput: one CSV of 10,000 spectra × 401 points written to a temporary folder and
 * read from disk (issue 13's colour file), by the automatic reader (fast numeric body) and by
 * the general reader alone. Budget: well under 0.5 s per read on the 2-core machine.
 */
import { readSpectrumFile } from "../lib/io/read_file.ts";

const SPECTRA = 10_000;
const POINTS = 401;

/**
 * Writes the invented benchmark export (x column in nm, 10,000 T columns) and returns its path:
 * one fixed name in the system's temporary folder, overwritten by each run (deno bench gives no
 * hook after the last benchmark to remove it).
 */
function writeBenchFile(): string {
  const probe = Deno.makeTempDirSync({ prefix: "crystint-read-bench-" });
  Deno.removeSync(probe);
  const path = `${probe.replace(/[\\/][^\\/]+$/, "")}/crystint-read-bench-10000x401.csv`;
  const header = ["wavelength_nm"];
  for (let k = 0; k < SPECTRA; k++) header.push(`s${k} T`);
  const lines = [header.join(",")];
  for (let i = 0; i < POINTS; i++) {
    const w = 380 + i;
    const cells = [String(w)];
    for (let k = 0; k < SPECTRA; k++) cells.push((0.5 + 0.4 * Math.sin(w / 40 + k)).toFixed(4));
    lines.push(cells.join(","));
  }
  Deno.writeTextFileSync(path, lines.join("\n") + "\n");
  return path;
}

/** Peak resident memory of this process in bytes (Linux `VmHWM`), or undefined elsewhere. */
function peakRss(): number | undefined {
  try {
    const kb = /VmHWM:\s+(\d+) kB/.exec(Deno.readTextFileSync("/proc/self/status"))?.[1];
    return kb ? Number(kb) * 1024 : undefined;
  } catch {
    return undefined;
  }
}

if (Deno.args[0] === "--child") {
  // child process: one read of the file, then its time and peak memory as JSON on stdout
  const t0 = performance.now();
  const spectra = await readSpectrumFile(Deno.args[1]!);
  console.log(JSON.stringify({ ms: performance.now() - t0, n: spectra.length, peak: peakRss() }));
  Deno.exit(0);
}

const path = writeBenchFile();
{
  // one read in a fresh process, to report peak memory beside the input size
  // (issue 13's goal: peak RSS ≤ 3× the input size for the whole colour run)
  const out = await new Deno.Command(Deno.execPath(), {
    // Deno grants /proc/self/status (for the peak) only with all permissions
    args: ["run", "--allow-all", new URL(import.meta.url).pathname, "--child", path],
    stdout: "piped",
    stderr: "inherit",
  }).output();
  const r = JSON.parse(new TextDecoder().decode(out.stdout));
  const mb = (n: number) => (n / 1048576).toFixed(0);
  console.log(
    `fresh process: read ${r.n} spectra in ${r.ms.toFixed(0)} ms; file ${
      mb(Deno.statSync(path).size)
    } MB, peak RSS ${r.peak ? `${mb(r.peak)} MB` : "not measurable here"}`,
  );
}

Deno.bench("read 10,000 × 401 CSV from disk, automatic reader", {
  group: "read",
  baseline: true,
}, async () => {
  const spectra = await readSpectrumFile(path);
  if (spectra.length !== SPECTRA) throw new Error(`read ${spectra.length} spectra`);
});

Deno.bench("read 10,000 × 401 CSV from disk, general reader only", { group: "read" }, async () => {
  const spectra = await readSpectrumFile(path, { tableReader: "general" });
  if (spectra.length !== SPECTRA) throw new Error(`read ${spectra.length} spectra`);
});

/**
 * Reader throughput: one CSV of 10,000 spectra × 401 points written to a temporary folder and
 * read from disk (issue 13's colour file), by the automatic reader (fast numeric body) and by
 * the general reader alone. Budget: well under 0.5 s per read on the 2-core machine.
 */
import { readSpectrumFile } from "../lib/io/read_file.ts";

const SPECTRA = 10_000;
const POINTS = 401;

/** Writes the invented benchmark export (x column in nm, 10,000 T columns) and returns its path. */
function writeBenchFile(): string {
  const dir = Deno.makeTempDirSync({ prefix: "crystint-read-bench-" });
  const path = `${dir}/spectra_10000x401.csv`;
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

const path = writeBenchFile();
addEventListener(
  "unload",
  () => Deno.removeSync(path.replace(/\/[^/]+$/, ""), { recursive: true }),
);

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

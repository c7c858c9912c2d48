/** Runs the crystint CLI in a subprocess for tests. */
export const ROOT = decodeURIComponent(new URL("../", import.meta.url).pathname);

export interface CliResult {
  code: number;
  stdout: string;
  stderr: string;
}

/** Runs `crystint …` and waits for it. */
export async function runCli(...args: string[]): Promise<CliResult> {
  const out = await new Deno.Command(Deno.execPath(), {
    args: [
      "run",
      "--allow-read",
      "--allow-write",
      "--allow-env",
      "--allow-sys=cpus,osRelease",
      `${ROOT}cli/main.ts`,
      ...args,
    ],
    stdout: "piped",
    stderr: "piped",
    env: { NO_COLOR: "1" },
  }).output();
  const dec = new TextDecoder();
  return { code: out.code, stdout: dec.decode(out.stdout), stderr: dec.decode(out.stderr) };
}

/** SHA-256 of every file below a folder, by relative path. */
export async function hashTree(dir: string): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  async function walk(d: string) {
    for await (const e of Deno.readDir(d)) {
      const p = `${d}/${e.name}`;
      if (e.isDirectory) await walk(p);
      else {
        const digest = await crypto.subtle.digest("SHA-256", await Deno.readFile(p));
        out[p.slice(dir.length)] = [...new Uint8Array(digest)].map((b) =>
          b.toString(16).padStart(2, "0")
        ).join("");
      }
    }
  }
  await walk(dir);
  return out;
}

/** A folder of copies of fixture spectra, each made unique by a tiny change. */
export async function makeLot(count: number, withBad = true): Promise<string> {
  const dir = await Deno.makeTempDir({ prefix: "crystint-lot-" });
  const base = await Deno.readTextFile(`${ROOT}test/fixtures/colour/cr_corundum_5nm.csv`);
  const lines = base.trim().split("\n");
  for (let i = 0; i < count; i++) {
    const copy = lines.map((l, k) => {
      if (k !== 40) return l;
      const [nm, t] = l.split(",");
      return `${nm},${(Number(t) * (1 - 0.001 * (i % 50))).toFixed(8)}`;
    });
    const sub = i % 3 === 0 ? `${dir}/sub` : dir;
    await Deno.mkdir(sub, { recursive: true });
    await Deno.writeTextFile(
      `${sub}/stone-${String(i).padStart(3, "0")}.csv`,
      copy.join("\n") + "\n",
    );
  }
  if (withBad) {
    await Deno.copyFile(
      `${ROOT}test/fixtures/exports/bad/non_numeric_cell.csv`,
      `${dir}/broken.csv`,
    );
  }
  return dir;
}

/**
 * Runs the demo batch into `out` as `deno task demo` does (calibration first, into
 * reports/demo where the demo settings look for it); returns the batch's result.
 */
export async function runDemoBatch(out: string): Promise<CliResult> {
  await Deno.mkdir(`${ROOT}reports/demo`, { recursive: true });
  const cal = await runCli(
    "calibrate",
    `${ROOT}spectra/standards/standards.csv`,
    "--out",
    `${ROOT}reports/demo/cr-calibration.json`,
  );
  if (cal.code !== 0) throw new Error(`demo calibration failed: ${cal.stderr}`);
  return await runCli(
    "batch",
    `${ROOT}spectra/demo`,
    "--manifest",
    `${ROOT}spectra/demo/manifest.csv`,
    "--settings",
    `${ROOT}spectra/demo/settings.yaml`,
    "--out",
    out,
    "--quiet",
  );
}

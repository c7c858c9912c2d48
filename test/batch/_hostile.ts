/** Helpers for the hostile-input tests: a child crystint with its peak memory measured. */
import { ROOT } from "../_run_cli.ts";

/** What a measured run gave. */
export interface MeasuredRun {
  code: number;
  stderr: string;
  /** Peak resident set (VmHWM from /proc), bytes; undefined where /proc is not available. */
  peakRss: number | undefined;
  ms: number;
}

/** Runs crystint with the given permissions and arguments, sampling its peak RSS. */
export async function runMeasured(permissions: string[], args: string[]): Promise<MeasuredRun> {
  const started = Date.now();
  const child = new Deno.Command(Deno.execPath(), {
    args: ["run", ...permissions, `${ROOT}cli/main.ts`, ...args],
    stdout: "null",
    stderr: "piped",
    env: { NO_COLOR: "1" },
  }).spawn();
  let peak: number | undefined;
  let running = true;
  const sampler = (async () => {
    while (running) {
      try {
        const status = await Deno.readTextFile(`/proc/${child.pid}/status`);
        const m = /VmHWM:\s+(\d+) kB/.exec(status);
        if (m) peak = Math.max(peak ?? 0, Number(m[1]) * 1024);
      } catch { /* gone or no /proc */ }
      await new Promise((r) => setTimeout(r, 50));
    }
  })();
  const [status, stderrBytes] = await Promise.all([
    child.status,
    new Response(child.stderr).arrayBuffer(),
  ]);
  running = false;
  await sampler;
  return {
    code: status.code,
    stderr: new TextDecoder().decode(stderrBytes),
    peakRss: peak,
    ms: Date.now() - started,
  };
}

/** A copy of a fixture export made unique by a tiny change in one value. */
export function variant(text: string, i: number): string {
  return text.trim().split("\n").map((l, k) => {
    if (k !== 40) return l;
    const [nm, t] = l.split(",");
    return `${nm},${(Number(t) * (1 - 0.002 * (i + 1))).toFixed(8)}`;
  }).join("\n") + "\n";
}

/** A wide export: one wavelength column and `columns` transmittance columns. */
export function wideExport(base: string, columns: number): string {
  const rows = base.trim().split("\n").slice(1).map((l) => l.split(","));
  const head = ["wavelength_nm", ...Array.from({ length: columns }, (_, i) => `T${i}`)].join(",");
  const body = rows.map(([nm, t]) =>
    [
      nm,
      ...Array.from({ length: columns }, (_, i) => (Number(t) * (1 - 1e-4 * (i % 97))).toFixed(6)),
    ]
      .join(",")
  );
  return [head, ...body].join("\n") + "\n";
}

/** Creates a FIFO with mkfifo(1); false when that is not possible here. */
export async function mkfifo(path: string): Promise<boolean> {
  try {
    const r = await new Deno.Command("mkfifo", { args: [path] }).output();
    return r.success;
  } catch {
    return false;
  }
}

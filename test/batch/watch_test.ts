import { axisValues } from "../../lib/analysis/chart_curves.ts";
import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT } from "../_run_cli.ts";

const FIXTURE = `${ROOT}test/fixtures/colour/cr_corundum_5nm.csv`;

function variant(text: string, i: number): string {
  // a tiny change per copy so each export is a distinct sample
  return text.trim().split("\n").map((l, k) => {
    if (k !== 40) return l;
    const [nm, t] = l.split(",");
    return `${nm},${(Number(t) * (1 - 0.002 * (i + 1))).toFixed(8)}`;
  }).join("\n") + "\n";
}

async function waitFor(check: () => Promise<boolean>, ms: number): Promise<boolean> {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    if (await check()) return true;
    await new Promise((r) => setTimeout(r, 100));
  }
  return false;
}

function tempLeftovers(dir: string): string[] {
  const out: string[] = [];
  const walk = (d: string) => {
    for (const e of Deno.readDirSync(d)) {
      if (e.name.startsWith(".crystint-tmp-")) {
        out.push(`${d}/${e.name}`);
      }
      if (e.isDirectory) walk(`${d}/${e.name}`);
    }
  };
  walk(dir);
  return out;
}

describe("crystint watch", () => {
  it("three exports dropped (one written slowly in two halves), one malformed: each good sample once, the malformed in errors; SIGTERM → exit 0, no temporaries", async () => {
    const dir = await Deno.makeTempDir({ prefix: "crystint-watch-in-" });
    const out = await Deno.makeTempDir({ prefix: "crystint-watch-out-" });
    const base = await Deno.readTextFile(FIXTURE);
    await Deno.writeTextFile(`${dir}/first.csv`, variant(base, 0));
    const child = new Deno.Command(Deno.execPath(), {
      args: [
        "run",
        "-R",
        "-W",
        "--allow-env=LOG_TOKENS,LOG_STREAM",
        "--allow-sys=cpus,osRelease",
        `${ROOT}cli/main.ts`,
        "watch",
        dir,
        "--out",
        out,
        "--poll",
        "0.2",
        "--settle",
        "0.6",
        "--workers",
        "1",
      ],
      stdout: "null",
      stderr: "piped",
      env: { NO_COLOR: "1" },
    }).spawn();
    const results = async () =>
      JSON.parse(await Deno.readTextFile(`${out}/results.json`).catch(() => '{"samples":[]}'));
    expect(await waitFor(async () => (await results()).samples.length === 1, 20000)).toBe(true);

    // the slow one: first half, a pause of several polls and longer than the settle time, rest
    const slow = variant(base, 1);
    const half = Math.floor(slow.length / 2);
    await Deno.writeTextFile(`${dir}/slow.csv`, slow.slice(0, half));
    await Deno.writeTextFile(`${dir}/third.csv`, variant(base, 2));
    await Deno.copyFile(
      `${ROOT}test/fixtures/exports/bad/non_numeric_cell.csv`,
      `${dir}/malformed.csv`,
    );
    await new Promise((r) => setTimeout(r, 450));
    await Deno.writeTextFile(`${dir}/slow.csv`, slow.slice(half), { append: true });

    expect(
      await waitFor(async () => {
        const r = await results();
        return r.samples.length === 3 && r.errors.length === 1 &&
          r.samples.some((s: { file: string }) => s.file.endsWith("slow.csv"));
      }, 20000),
    ).toBe(true);
    // one more poll cycle: nothing is added twice
    await new Promise((r) => setTimeout(r, 1500));
    const r = await results();
    const files = r.samples.map((s: { file: string }) => s.file.split("/").pop()).sort();
    expect(files).toEqual(["first.csv", "slow.csv", "third.csv"]);
    expect(r.errors.map((e: { file: string }) => e.file.split("/").pop())).toEqual([
      "malformed.csv",
    ]);
    // the slow file's sample is the complete spectrum, not its first half
    const slowSample = r.samples.find((s: { file: string }) => s.file.endsWith("slow.csv"));
    const firstSample = r.samples.find((s: { file: string }) => s.file.endsWith("first.csv"));
    expect(axisValues(slowSample.plot.nm).length).toBeGreaterThan(10);
    expect(slowSample.plot.nm).toEqual(firstSample.plot.nm);

    const t0 = Date.now();
    child.kill("SIGTERM");
    const status = await child.status;
    const elapsed = Date.now() - t0;
    const stderr = new TextDecoder().decode(
      await new Response(child.stderr).arrayBuffer().catch(() => new ArrayBuffer(0)),
    );
    expect(status.code).toBe(0);
    expect(elapsed).toBeLessThan(5000);
    expect(tempLeftovers(out)).toEqual([]);
    expect(await Deno.readTextFile(`${out}/.crystint-lock`)).toBe(""); // released
    // a line per processed file, the malformed one named with its line
    for (const name of ["first.csv", "slow.csv", "third.csv"]) {
      expect(stderr.split("\n").filter((l) => l.includes(`${name}: `)).length).toBe(1);
    }
    expect(stderr).toMatch(/malformed\.csv:5: Cell "abc" is not a number/);
    expect(await Deno.readTextFile(`${out}/index.html`)).toContain("slow");
  });
});

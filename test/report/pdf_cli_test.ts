import { describe, it } from "node:test";
import { expect } from "expect";
import { makeLot, ROOT, runCli } from "../_run_cli.ts";
import { findChromium } from "../../lib/batch/print_pdf.ts";

const CHROMIUM = findChromium();

/** `crystint report …` allowed to start the browser (what a task granting --allow-run does). */
async function reportWithRun(...args: string[]) {
  const out = await new Deno.Command(Deno.execPath(), {
    args: [
      "run",
      "--allow-read",
      "--allow-write",
      "--allow-env",
      "--allow-sys=cpus,osRelease",
      `--allow-run=${CHROMIUM}`,
      `${ROOT}cli/main.ts`,
      "report",
      ...args,
    ],
    stdout: "piped",
    stderr: "piped",
    env: { NO_COLOR: "1" },
  }).output();
  return { code: out.code, stderr: new TextDecoder().decode(out.stderr) };
}

describe("crystint report --pdf", () => {
  it("findChromium() gives null when none of the places holds a browser", () => {
    expect(findChromium(["/nonexistent/chromium", "/nonexistent/chrome"])).toBe(null);
  });

  it("prints the page: a cover and one page per stone", { skip: !CHROMIUM }, async () => {
    const lot = await makeLot(4, false);
    const out = await Deno.makeTempDir();
    expect((await runCli("batch", lot, "--out", `${out}/batch`, "--quiet")).code).toBe(0);
    const r = await reportWithRun(
      `${out}/batch/results.json`,
      "--out",
      `${out}/again`,
      "--pdf",
      `${out}/lot.pdf`,
    );
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const pdf = await Deno.readFile(`${out}/lot.pdf`);
    const text = new TextDecoder("latin1").decode(pdf);
    expect(text.startsWith("%PDF-")).toBe(true);
    // page objects (ISO 32000-1 §7.7.3.3): at least the cover and the four stones
    expect((text.match(/\/Type\s*\/Page(?![s\w])/g) ?? []).length).toBeGreaterThanOrEqual(5);
    // no temporary file left beside it
    const names = [...Deno.readDirSync(out)].map((e) => e.name).sort();
    expect(names).toEqual(["again", "batch", "lot.pdf"]);
  });

  it("says what is missing: the permission to start the browser, or the browser", async () => {
    const lot = await makeLot(1, false);
    const out = await Deno.makeTempDir();
    expect((await runCli("batch", lot, "--out", out, "--quiet")).code).toBe(0);
    const denied = await runCli(
      "report",
      `${out}/results.json`,
      "--out",
      out,
      "--pdf",
      `${out}/a.pdf`,
    );
    expect(denied.code).toBe(1);
    if (CHROMIUM) expect(denied.stderr).toContain(`--allow-run=${CHROMIUM}`);
    else expect(denied.stderr).toContain("No Chromium found");
    const missing = await runCli(
      "report",
      `${out}/results.json`,
      "--out",
      out,
      "--pdf",
      `${out}/a.pdf`,
      "--chromium",
      "/nonexistent/chromium",
    );
    expect(missing.code).toBe(1);
    expect(missing.stderr).not.toMatch(/at file:|Uncaught/);
    expect(missing.stderr).toContain("No Chromium at /nonexistent/chromium");
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { runCli, runDemoBatch } from "../_run_cli.ts";

describe("crystint report reproduces the batch page", () => {
  it("byte for byte, header, calibrations, totals and errors included (demo lot)", async () => {
    const out = await Deno.makeTempDir(), again = await Deno.makeTempDir();
    const batch = await runDemoBatch(out);
    expect(batch.code).toBe(2); // the demo holds deliberately damaged files
    const r = await runCli("report", `${out}/results.json`, "--out", again);
    expect(r.code).toBe(0);
    const page = await Deno.readTextFile(`${out}/index.html`);
    const rendered = await Deno.readTextFile(`${again}/index.html`);
    expect(page).toContain("illuminants:"); // the settings line
    expect(page).toMatch(/"calibrations":\[\{"name":"cr-corundum"/); // the calibration plot's data
    expect(page).toMatch(/target met by \d+ of \d+/); // totals
    expect(rendered === page).toBe(true);
  });

  it("refuses a file that is not a results document, and one whose samples are malformed", async () => {
    const dir = await Deno.makeTempDir();
    await Deno.writeTextFile(`${dir}/a.json`, `{"samples": 3}`);
    await Deno.writeTextFile(`${dir}/b.json`, `{"samples": [{"sample": 1}], "errors": []}`);
    for (const f of ["a.json", "b.json"]) {
      const r = await runCli("report", `${dir}/${f}`, "--out", `${dir}/out`);
      expect(r.code).toBe(1);
      expect(r.stderr).not.toMatch(/TypeError|at file:/);
    }
  });
});

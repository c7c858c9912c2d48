import { describe, it } from "node:test";
import { expect } from "expect";
import { runCli, runDemoBatch } from "../_run_cli.ts";
import { readResultsJson } from "../_results_json.ts";
import { curveValues } from "../../lib/analysis/chart_curves.ts";

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
    // the same results written plainly, as before packing (no shared block, lists of records,
    // curves as lists and as {q, d} steps): the same page
    const doc = await readResultsJson(`${out}/results.json`);
    expect(JSON.stringify(doc)).not.toContain('"shared"');
    for (const s of doc.samples) {
      s.plot.t = curveValues(s.plot.t);
      if (s.bands) {
        const steps = (v: number[]) =>
          v.map((x, i) => Math.round(1e5 * x) - (i ? Math.round(1e5 * v[i - 1]!) : 0));
        s.bands.curve.data = { q: 1e5, d: steps(curveValues(s.bands.curve.data)) };
      }
    }
    await Deno.writeTextFile(`${again}/plain.json`, JSON.stringify(doc));
    const plain = await Deno.makeTempDir();
    expect((await runCli("report", `${again}/plain.json`, "--out", plain)).code).toBe(0);
    expect(await Deno.readTextFile(`${plain}/index.html`) === page).toBe(true);
  });

  it("names a packed file whose shared block is damaged (exit 1, no stack)", async () => {
    const out = await Deno.makeTempDir(), dir = await Deno.makeTempDir();
    expect((await runDemoBatch(out)).code).toBe(2);
    const doc = JSON.parse(await Deno.readTextFile(`${out}/results.json`));
    doc.shared.shapes = [];
    await Deno.writeTextFile(`${dir}/r.json`, JSON.stringify(doc));
    const r = await runCli("report", `${dir}/r.json`, "--out", `${dir}/out`);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/holds results the report cannot show: .*no shape 0/);
    expect(r.stderr).not.toMatch(/at file:/);
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

import { describe, it } from "node:test";
import { expect } from "expect";
import { makeLot, runCli } from "../_run_cli.ts";

describe("the report block travels in results.json", () => {
  it("is recorded (date defaulting to the run's) and re-rendered byte for byte", async () => {
    const lot = await makeLot(2, false);
    const dir = await Deno.makeTempDir();
    await Deno.writeTextFile(
      `${dir}/settings.yaml`,
      `report:\n  title: "Lot 9 — colour statement"\n  client: "Ö & Co <gems>"\n  audience: client\n`,
    );
    const before = new Date().toISOString().slice(0, 10);
    const r = await runCli("batch", lot, "--settings", `${dir}/settings.yaml`, "--out", `${dir}/a`);
    const after = new Date().toISOString().slice(0, 10);
    expect(r.code).toBe(0);
    const doc = JSON.parse(await Deno.readTextFile(`${dir}/a/results.json`));
    expect(doc.report.title).toBe("Lot 9 — colour statement");
    expect(doc.report.audience).toBe("client");
    expect([before, after]).toContain(doc.report.date);
    expect((await runCli("report", `${dir}/a/results.json`, "--out", `${dir}/b`)).code).toBe(0);
    const page = await Deno.readTextFile(`${dir}/a/index.html`);
    expect(page).toContain("Ö &amp; Co &lt;gems&gt;");
    expect(await Deno.readTextFile(`${dir}/b/index.html`) === page).toBe(true);
  });

  it("a results file without it (older runs) still renders, with the full cautions", async () => {
    const lot = await makeLot(1, false);
    const dir = await Deno.makeTempDir();
    expect((await runCli("batch", lot, "--out", `${dir}/a`, "--quiet")).code).toBe(0);
    const doc = JSON.parse(await Deno.readTextFile(`${dir}/a/results.json`));
    delete doc.report;
    await Deno.writeTextFile(`${dir}/old.json`, JSON.stringify(doc));
    expect((await runCli("report", `${dir}/old.json`, "--out", `${dir}/b`)).code).toBe(0);
    const page = await Deno.readTextFile(`${dir}/b/index.html`);
    expect(page).toContain("<h1>Colour report</h1>");
    expect(page).toContain("HF above all");
  });
});

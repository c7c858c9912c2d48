import { describe, it } from "node:test";
import { expect } from "expect";
import { hashTree, makeLot, ROOT, runCli } from "../_run_cli.ts";
import { parseManifest, planInputs, resolveSettings, SettingsError } from "../../lib/batch/mod.ts";

describe("crystint batch (machine contract)", () => {
  it("exit 2 with one bad file; results.json has samples and errors {file, message}; inputs unchanged", async () => {
    const lot = await makeLot(6);
    const out = await Deno.makeTempDir();
    const before = await hashTree(lot);
    const r = await runCli("batch", lot, "--out", out, "--quiet");
    expect(r.code).toBe(2);
    expect(await hashTree(lot)).toEqual(before);
    const results = JSON.parse(await Deno.readTextFile(`${out}/results.json`));
    expect(results.samples.length).toBe(6);
    expect(results.errors.length).toBe(1);
    expect(results.errors[0].file).toBe(`${lot}/broken.csv`);
    expect(results.errors[0].message).toMatch(/broken\.csv:5: Cell "abc" is not a number/);
    expect(results).toHaveProperty("settings");
    expect(results).toHaveProperty("version");
    const csv = (await Deno.readTextFile(`${out}/results.csv`)).trim().split("\n");
    expect(csv[0]).toMatch(/^sample,file,illuminant,observer,path \(mm\)/);
    expect(csv.length).toBe(1 + 6 * 2 * 2);
    const html = await Deno.readTextFile(`${out}/index.html`);
    expect(html).toContain('<table class="summary"');
    expect(html).not.toMatch(/<script[^>]+src=/);
  });

  it("exit 0 when every input is done; 1 for a usage or settings error", async () => {
    const lot = await makeLot(2, false);
    const out = await Deno.makeTempDir();
    expect((await runCli("batch", lot, "--out", out, "--quiet")).code).toBe(0);
    expect((await runCli("batch", lot)).code).toBe(1);
    const bad = `${out}/bad.yaml`;
    await Deno.writeTextFile(bad, "illuminants: [Q7]\n");
    const r = await runCli("batch", lot, "--out", out, "--settings", bad);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/bad\.yaml: Setting illuminants: Unknown illuminant "Q7"/);
  });

  it("a rerun takes everything from the cache and writes identical results; new files are added", async () => {
    const lot = await makeLot(5);
    const out = await Deno.makeTempDir();
    await runCli("batch", lot, "--out", out, "--quiet");
    const first = await Deno.readTextFile(`${out}/results.json`);
    const again = await runCli("batch", lot, "--out", out);
    expect(again.stderr).toMatch(/\(5 from cache\)/);
    expect(await Deno.readTextFile(`${out}/results.json`)).toBe(first);
    await Deno.copyFile(`${ROOT}test/fixtures/colour/ramp_2nm.csv`, `${lot}/ramp.csv`);
    const more = await runCli("batch", lot, "--out", out);
    expect(more.stderr).toMatch(/6 sample\(s\).*\(5 from cache\)/);
  });

  it("killed with SIGKILL mid-run: no partial outputs, and the rerun equals an uninterrupted run", async () => {
    const lot = await makeLot(200, false);
    const out = await Deno.makeTempDir(), reference = await Deno.makeTempDir();
    const child = new Deno.Command(Deno.execPath(), {
      args: [
        "run",
        "-R",
        "-W",
        "-E",
        "--allow-sys=cpus,osRelease",
        `${ROOT}cli/main.ts`,
        "batch",
        lot,
        "--out",
        out,
        "--quiet",
        "--workers",
        "1",
      ],
      stdout: "null",
      stderr: "null",
    }).spawn();
    const deadline = Date.now() + 30000;
    let cached = 0;
    while (Date.now() < deadline) {
      await new Promise((r) => setTimeout(r, 50));
      try {
        cached = [...Deno.readDirSync(`${out}/.cache`)].filter((e) =>
          e.name.endsWith(".json")
        ).length;
      } catch { /* not created yet */ }
      if (cached >= 10) break;
    }
    child.kill("SIGKILL");
    await child.status;
    expect(cached).toBeGreaterThanOrEqual(10);
    // the run really was cut short: not every input had been computed, no results.json yet
    const cachedAtKill =
      [...Deno.readDirSync(`${out}/.cache`)].filter((e) => e.name.endsWith(".json")).length;
    expect(cachedAtKill).toBeLessThan(200);
    expect(await Deno.stat(`${out}/results.json`).then(() => true, () => false)).toBe(false);
    for (const name of ["results.json", "results.csv", "index.html"]) {
      const text = await Deno.readTextFile(`${out}/${name}`).catch(() => undefined);
      if (text !== undefined && name === "results.json") {
        expect(() => JSON.parse(text)).not.toThrow();
      }
    }
    for (const e of Deno.readDirSync(`${out}/.cache`)) {
      if (e.name.endsWith(".json")) {
        expect(() => JSON.parse(Deno.readTextFileSync(`${out}/.cache/${e.name}`))).not.toThrow();
      }
    }
    const rerun = await runCli("batch", lot, "--out", out, "--quiet");
    expect(rerun.stderr).toBe("");
    expect(rerun.code).toBe(0);
    expect((await runCli("batch", lot, "--out", reference, "--quiet")).code).toBe(0);
    expect(await Deno.readTextFile(`${out}/results.json`)).toBe(
      await Deno.readTextFile(`${reference}/results.json`),
    );
    const leftovers = [...Deno.readDirSync(out), ...Deno.readDirSync(`${out}/.cache`)].filter((e) =>
      e.name.startsWith(".crystint-tmp-")
    );
    expect(leftovers).toEqual([]);
  });

  it("a sample sheet: unknown columns carried along, rows without files and files without rows reported", async () => {
    const lot = await makeLot(3, false);
    const out = await Deno.makeTempDir();
    const sheet = `${out}/sheet.csv`;
    await Deno.writeTextFile(
      sheet,
      "sample,file,thickness_mm,path_mm,host,cut,notes\nA-1,stone-001.csv,2,6,corundum,oval,first\nA-9,stone-999.csv,2,6,corundum,cushion,missing\n",
    );
    const r = await runCli("batch", lot, "--out", out, "--manifest", sheet);
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/stone-000\.csv: not listed in the sample sheet/);
    expect(r.stderr).toMatch(/sample sheet line 3 \(A-9\): no matching file "stone-999.csv"/);
    const results = JSON.parse(await Deno.readTextFile(`${out}/results.json`));
    const a1 = results.samples.find((s: { sample: string }) => s.sample === "A-1");
    expect(a1.extra).toEqual({ cut: "oval" });
    expect(a1.pathMm).toBe(6);
    expect(a1.thicknessMm).toBe(2);
    expect(a1.notes).toBe("first");
    expect(await Deno.readTextFile(`${out}/results.csv`)).toMatch(/,cut\n/);
  });
});

describe("batch building blocks", () => {
  it("planInputs expands folders recursively and glob patterns, and reports what matched nothing", async () => {
    const lot = await makeLot(6, false);
    const all = await planInputs([lot]);
    expect(all.files.length).toBe(6);
    const glob = await planInputs([`${lot}/sub/*.csv`, `${lot}/nothing-*.csv`]);
    expect(glob.files.length).toBe(2);
    expect(glob.missing).toEqual([`${lot}/nothing-*.csv`]);
  });
  it("settings are validated with the setting named", () => {
    expect(() => resolveSettings({ pathMm: -1 })).toThrow(SettingsError);
    const warnings: string[] = [];
    resolveSettings({ colour: 1 }, (w) => warnings.push(w));
    expect(warnings).toEqual([`Unknown setting "colour" (ignored)`]);
    expect(() => resolveSettings({ change: null })).toThrow(
      /Setting change: Invalid input: expected object, received null/,
    );
    expect(() => resolveSettings({ series: "abc" })).toThrow(/Setting series: .*expected object/);
    expect(() => resolveSettings({ series: { steps: 1e7 } })).toThrow(/series.steps: Too big/);
    expect(() => resolveSettings({ series: { steps: 2.5 } })).toThrow(
      /series.steps: must be a whole number/,
    );
    expect(() => resolveSettings({ n: 0.5 })).toThrow(/Setting n: Too small/);
    expect(() => resolveSettings({ changeHueThresholdDeg: 500 })).toThrow(/changeHueThresholdDeg/);
    expect(() => resolveSettings({ limits: { maxFileMb: -1 } })).toThrow(/limits.maxFileMb/);
    expect(() => resolveSettings({ change: { adapt: "vonkries" } })).toThrow(
      /Setting change.adapt: Invalid option/,
    );
    expect(resolveSettings({ limits: { fileTimeoutSeconds: "2,5" } }).limits).toEqual({
      fileTimeoutSeconds: 2.5,
    });
    // a wrong value is described, never repeated (it may come from a file that is not settings)
    let message = "";
    try {
      resolveSettings({ pathMm: "hunter2-secret" });
    } catch (e) {
      message = (e as Error).message;
    }
    expect(message).toBe("Setting pathMm: Invalid input: expected number, received string");
    const nested: string[] = [];
    resolveSettings({ series: { stepz: 3 } }, (w) => nested.push(w));
    expect(nested).toEqual([`Unknown setting "series.stepz" (ignored)`]);
    expect(resolveSettings({ target: "50, 30, -5" }).target).toMatchObject({
      L: 50,
      a: 30,
      b: -5,
      toleranceDE00: 2,
    });
  });
  it("manifest values are checked with their line", () => {
    expect(() => parseManifest("sample,thickness_mm\nA,abc\n", "m.csv")).toThrow(
      /m\.csv:2: thickness_mm must be a positive number/,
    );
  });
});

describe("targets in a batch", () => {
  it("a target under D65 and A, and a target given as a reference spectrum, checked under each light", async () => {
    const lot = await makeLot(2, false);
    const out = await Deno.makeTempDir();
    const reference = `${lot}/stone-001.csv`;
    const settings = `${out}/s.yaml`;
    await Deno.writeTextFile(
      settings,
      `target: { spectrum: ${reference}, illuminants: [D65, A], observer: "10", toleranceDE00: 0.5 }\n` +
        `targets:\n  pair: { under: { D65: [50, 20, -10], A: [52, 26, -12] }, observer: "10" }\n`,
    );
    const sheet = `${out}/sheet.csv`;
    await Deno.writeTextFile(sheet, "file,target\nstone-000.csv,pair\nstone-001.csv,\n");
    expect(
      (await runCli(
        "batch",
        lot,
        "--out",
        out,
        "--settings",
        settings,
        "--manifest",
        sheet,
        "--quiet",
      )).code,
    ).toBe(0);
    const { samples } = JSON.parse(await Deno.readTextFile(`${out}/results.json`));
    const self = samples.find((s: { sample: string }) => s.sample === "stone-001").target;
    expect(self.checks.map((c: { illuminant: string }) => c.illuminant)).toEqual(["D65", "A"]);
    expect(self.dE00).toBeLessThan(1e-9);
    expect(self.pass).toBe(true);
    const pair = samples.find((s: { sample: string }) => s.sample === "stone-000").target;
    expect(pair.name).toBe("pair");
    expect(pair.checks.length).toBe(2);
    expect(pair.checks[1].L).toBe(52);
    expect(pair.dE00).toBe(Math.max(...pair.checks.map((c: { dE00: number }) => c.dE00)));
  });
});

describe("sample sheets from decimal-comma spreadsheets (regression)", () => {
  it("a semicolon-separated sheet with decimal commas is read, not silently ignored", () => {
    const rows = parseManifest("sample;file;thickness_mm;path_mm\nA-1;a.csv;1,5;6\n", "s.csv");
    expect(rows.length).toBe(1);
    expect(rows[0]!.sample).toBe("A-1");
    expect(rows[0]!.thicknessMm).toBe(1.5);
    expect(rows[0]!.pathMm).toBe(6);
  });
});

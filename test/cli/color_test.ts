import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT, runCli } from "../_run_cli.ts";
import { csvHeader } from "../../lib/analysis/csv_headers.ts";

const fixture = (p: string) => `${ROOT}test/fixtures/${p}`;
const run = runCli;

const KEYS = [
  "sample",
  "file",
  "illuminant",
  "observer",
  "pathMm",
  "X",
  "Y",
  "Z",
  "x",
  "y",
  "L",
  "a",
  "b",
  "C",
  "h",
];

describe("crystint color (machine contract)", () => {
  it("--json prints one row per sample × illuminant × observer with the contract keys", async () => {
    const r = await run(
      "color",
      fixture("colour/cr_corundum_1nm.csv"),
      "--ordinate",
      "transmittance",
      "--illuminant",
      "D65,A",
      "--observer",
      "2,10",
      "--json",
    );
    expect(r.code).toBe(0);
    const rows = JSON.parse(r.stdout);
    expect(rows.length).toBe(4);
    for (const row of rows) for (const k of KEYS) expect(row).toHaveProperty(k);
    expect(rows.map((x: { observer: string }) => x.observer)).toEqual(["2", "10", "2", "10"]);
    expect(rows[0].h).toBeGreaterThanOrEqual(0);
    expect(rows[0].h).toBeLessThan(360);
  });

  it("--csv prints a header row and the same numbers", async () => {
    const r = await run(
      "color",
      fixture("colour/cr_corundum_1nm.csv"),
      "--csv",
      "--illuminant",
      "D65",
    );
    expect(r.code).toBe(0);
    const [header, first] = r.stdout.trim().split("\n");
    // the readable headers of the one mapping (lib/analysis/csv_headers.ts), in contract order
    expect(header!.split(",").slice(0, KEYS.length)).toEqual(KEYS.map(csvHeader));
    expect(first!.split(",")[2]).toBe("D65");
  });

  it("--path rescales by Beer–Lambert: doubling the path of a 2 mm slab darkens it", async () => {
    const a = JSON.parse(
      (await run(
        "color",
        fixture("colour/cr_corundum_1nm.csv"),
        "--thickness",
        "2",
        "--json",
        "--illuminant",
        "D65",
      )).stdout,
    );
    const b = JSON.parse(
      (await run(
        "color",
        fixture("colour/cr_corundum_1nm.csv"),
        "--thickness",
        "2",
        "--path",
        "4",
        "--json",
        "--illuminant",
        "D65",
      )).stdout,
    );
    expect(a[0].pathMm).toBe(2);
    expect(b[0].pathMm).toBe(4);
    expect(b[0].Y).toBeLessThan(a[0].Y);
  });

  it("exit 2 when some inputs fail, the others still reported; errors name file and line", async () => {
    const r = await run(
      "color",
      fixture("colour/ramp_2nm.csv"),
      fixture("exports/bad/non_numeric_cell.csv"),
      "--json",
    );
    expect(r.code).toBe(2);
    expect(JSON.parse(r.stdout).length).toBe(2);
    expect(r.stderr).toContain("non_numeric_cell.csv:5:");
  });

  it("exit 1 for usage errors: unknown option, unknown illuminant, bad observer, no files", async () => {
    expect((await run("color", fixture("colour/ramp_2nm.csv"), "--bogus")).code).toBe(1);
    expect((await run("color", fixture("colour/ramp_2nm.csv"), "--illuminant", "Q9")).code).toBe(1);
    expect((await run("color", fixture("colour/ramp_2nm.csv"), "--observer", "5")).code).toBe(1);
    expect((await run("color")).code).toBe(1);
  });

  it("--help shows usage with an example, exit 0", async () => {
    const r = await run("color", "--help");
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/Example:/);
  });

  it("a custom illuminant SPD file can be named in --illuminant", async () => {
    const spd = await Deno.makeTempFile({ suffix: ".csv" });
    await Deno.writeTextFile(
      spd,
      "nm,T\n" + Array.from({ length: 95 }, (_, i) => `${360 + 5 * i},1`).join("\n"),
    );
    const r = await run(
      "color",
      fixture("colour/neutral_grey_5nm.csv"),
      "--illuminant",
      spd,
      "--json",
    );
    await Deno.remove(spd);
    expect(r.code).toBe(0);
    const [row] = JSON.parse(r.stdout);
    expect(row.Y).toBeCloseTo(30, 6);
    expect(row.x).toBeCloseTo(1 / 3, 2);
  });
});

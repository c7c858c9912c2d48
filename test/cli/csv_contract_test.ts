import { describe, it } from "node:test";
import { expect } from "expect";
import { parse } from "csv-parse/sync";
import { ROOT, runCli } from "../_run_cli.ts";
import { csvHeader } from "../../lib/analysis/csv_headers.ts";

const stone = `${ROOT}test/fixtures/colour/cr_corundum_1nm.csv`;
const spinel = `${ROOT}test/fixtures/colour/co_spinel_1nm.csv`;

/** Parses CSV output and checks the header is the documented one (keys through the mapping). */
function parseChecked(stdout: string, keys: string[]): Record<string, string>[] {
  const rows = parse(stdout, { columns: true, bom: true }) as Record<string, string>[];
  const header = parse(stdout, { to_line: 1 })[0] as string[];
  expect(header).toEqual(keys.map(csvHeader));
  expect(rows.length).toBeGreaterThan(0);
  return rows;
}

/** Boolean columns must read true/false, never blank (issue 11 item 7). */
function expectBooleans(rows: Record<string, string>[], keys: string[]) {
  for (const row of rows) {
    for (const k of keys) expect(["true", "false"]).toContain(row[csvHeader(k)]);
  }
}

const COLOR_KEYS = [
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
  "uPrime",
  "vPrime",
  "dominantNm",
  "complementary",
  "purity",
  "srgb",
  "srgbOutOfGamut",
  "p3",
  "p3OutOfGamut",
  "method",
  "extrapolated",
];

describe("--csv of every row command parses as CSV with the documented header", () => {
  it("color", async () => {
    const r = await runCli("color", stone, "--thickness", "2", "--path", "4", "--csv");
    expect(r.code).toBe(0);
    const rows = parseChecked(r.stdout, COLOR_KEYS);
    expect(rows.length).toBe(2); // D65 and A, 2° observer
    expectBooleans(rows, ["complementary", "srgbOutOfGamut", "p3OutOfGamut", "extrapolated"]);
    expect(rows.map((x) => x["observer"])).toEqual(["2", "2"]);
  });

  it("change", async () => {
    const r = await runCli("change", stone, "--csv");
    expect(r.code).toBe(0);
    parseChecked(r.stdout, [
      "sample",
      "file",
      "from",
      "to",
      "observer",
      "dE00",
      "dEab",
      "dL",
      "dC",
      "dh",
      "L1",
      "a1",
      "b1",
      "C1",
      "h1",
      "L2",
      "a2",
      "b2",
      "C2",
      "h2",
      "adapt",
      "pathMm",
    ]);
  });

  it("series (one row per path, --step honoured)", async () => {
    const r = await runCli(
      "series",
      stone,
      "--thickness",
      "2",
      "--from",
      "1",
      "--to",
      "3",
      "--step",
      "0.5",
      "--csv",
    );
    expect(r.code).toBe(0);
    const rows = parseChecked(r.stdout, [
      "sample",
      "file",
      "illuminant",
      "observer",
      "pathMm",
      "L",
      "a",
      "b",
      "C",
      "h",
      "srgb",
    ]);
    expect(rows.map((x) => Number(x["path (mm)"]))).toEqual([1, 1.5, 2, 2.5, 3]);
  });

  it("pleochroism", async () => {
    const r = await runCli("pleochroism", stone, spinel, "--thickness", "2", "--csv");
    expect(r.code).toBe(0);
    const rows = parseChecked(r.stdout, [
      "sampleO",
      "sampleE",
      "illuminant",
      "observer",
      "pathMm",
      "Lo",
      "ao",
      "bo",
      "Co",
      "ho",
      "Le",
      "ae",
      "be",
      "Ce",
      "he",
      "Lu",
      "au",
      "bu",
      "Cu",
      "hu",
      "dE00oe",
      "srgbO",
      "srgbE",
      "srgbU",
    ]);
    expect(rows[0]!["L* (o)"]).toBeTruthy();
  });

  it("metamerism", async () => {
    const r = await runCli("metamerism", stone, spinel, "--test", "A,F11", "--csv");
    expect(r.code).toBe(0);
    const rows = parseChecked(r.stdout, [
      "sample1",
      "sample2",
      "reference",
      "test",
      "observer",
      "mismatchReference",
      "indexAb",
      "index00",
    ]);
    expect(rows.length).toBe(2);
  });

  it("bands", async () => {
    const r = await runCli("bands", stone, "--csv");
    expect(r.code).toBe(0);
    parseChecked(r.stdout, [
      "sample",
      "file",
      "band",
      "shape",
      "centerCm1",
      "centerCm1Sigma",
      "centerNm",
      "centerNmSigma",
      "fwhmCm1",
      "fwhmCm1Sigma",
      "height",
      "heightSigma",
      "area",
      "areaSigma",
      "assignment",
    ]);
  });

  it("calibrate and predict", async () => {
    const dir = await Deno.makeTempDir();
    const c = await runCli(
      "calibrate",
      `${ROOT}spectra/standards/standards.csv`,
      "--band-nm",
      "555",
      "--out",
      `${dir}/cal.json`,
      "--csv",
    );
    expect(c.code).toBe(0);
    const [cal] = parseChecked(c.stdout, [
      "metric",
      "mode",
      "unit",
      "alphaBase",
      "slope",
      "intercept",
      "slopeSigma",
      "interceptSigma",
      "r2",
      "syx",
      "lod",
      "loq",
      "n",
    ]);
    expect(cal!["alpha base"]).toBe("e");
    expect(JSON.parse(await Deno.readTextFile(`${dir}/cal.json`)).alphaBase).toBe("e");
    const p = await runCli(
      "predict",
      `${ROOT}spectra/standards/STD-3.csv`,
      "--thickness",
      "2",
      "--calibration",
      `${dir}/cal.json`,
      "--csv",
    );
    expect(p.code).toBe(0);
    const rows = parseChecked(p.stdout, [
      "sample",
      "file",
      "response",
      "responseSigma",
      "concentration",
      "concentrationSigma",
      "halfWidth95",
      "unit",
      "outsideRange",
    ]);
    expectBooleans(rows, ["outsideRange"]);
  });

  it("segregation", async () => {
    const dir = await Deno.makeTempDir();
    // an invented profile following Scheil with k = 0.5, C0 = 1 exactly (closed form)
    const g = [0.1, 0.3, 0.5, 0.7, 0.9];
    await Deno.writeTextFile(
      `${dir}/p.csv`,
      "fraction,concentration\n" + g.map((x) => `${x},${0.5 * (1 - x) ** -0.5}`).join("\n"),
    );
    const r = await runCli("segregation", `${dir}/p.csv`, "--csv");
    expect(r.code).toBe(0);
    const [row] = parseChecked(r.stdout, ["k", "kSigma", "c0", "c0Sigma", "n", "residualRms"]);
    expect(Number(row!["k_eff"])).toBeCloseTo(0.5, 6);
  });

  it("aim", async () => {
    const r = await runCli(
      "aim",
      "--target",
      "50,20,-20",
      "--path",
      "2",
      "--dopant",
      `Cr=${stone}`,
      "--thickness",
      "2",
      "--csv",
    );
    expect([0, 2]).toContain(r.code);
    const rows = parseChecked(r.stdout, [
      "dopant",
      "level",
      "levelUnit",
      "sensitivity",
      "pathMm",
      "L",
      "a",
      "b",
      "dE00",
      "illuminant",
      "observer",
      "reachable",
    ]);
    expectBooleans(rows, ["reachable"]);
    expect(rows[0]!["level unit"]).toBe(`× unit spectrum ${stone}`);
  });
});

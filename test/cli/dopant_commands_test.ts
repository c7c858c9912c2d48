import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT, runCli } from "../_run_cli.ts";

describe("crystint calibrate / predict / aim / segregation (machine contract)", () => {
  it("calibrate with a response column prints slope, intercept, their sigmas, r2, lod, loq", async () => {
    const dir = await Deno.makeTempDir();
    // Miller & Miller's worked example as a standards table with ready responses
    await Deno.writeTextFile(
      `${dir}/std.csv`,
      "sample,concentration,unit,response\n" +
        [[0, 2.1], [2, 5.0], [4, 9.0], [6, 12.6], [8, 17.3], [10, 21.0], [12, 24.7]]
          .map(([x, y], i) => `S${i},${x},pg/ml,${y}`).join("\n") +
        "\n",
    );
    const r = await runCli("calibrate", `${dir}/std.csv`, "--json");
    expect(r.code).toBe(0);
    const cal = JSON.parse(r.stdout);
    for (const k of ["slope", "intercept", "slopeSigma", "interceptSigma", "r2", "lod", "loq"]) {
      expect(cal).toHaveProperty(k);
    }
    expect(cal.slope).toBeCloseTo(1.93, 2);
    expect(cal.unit).toBe("pg/ml");
  });

  it("calibrate from spectra writes a calibration that predict reuses; the demo standards come back", async () => {
    const dir = await Deno.makeTempDir();
    const r = await runCli(
      "calibrate",
      `${ROOT}spectra/standards/standards.csv`,
      "--metric",
      "band-area",
      "--band-nm",
      "555",
      "--out",
      `${dir}/cal.json`,
      "--json",
    );
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout).r2).toBeGreaterThan(0.99);
    const p = await runCli(
      "predict",
      `${ROOT}spectra/standards/STD-3.csv`,
      "--thickness",
      "2",
      "--calibration",
      `${dir}/cal.json`,
      "--json",
    );
    expect(p.code).toBe(0);
    const [row] = JSON.parse(p.stdout);
    for (
      const k of [
        "sample",
        "file",
        "response",
        "concentration",
        "concentrationSigma",
        "unit",
        "outsideRange",
      ]
    ) expect(row).toHaveProperty(k);
    expect(Math.abs(row.concentration - 0.2)).toBeLessThan(0.02);
    expect(row.unit).toBe("wt%");
  });

  it("aim prints {levels, pathMm, L, a, b, dE00, sensitivity} and finds the levels behind a target", async () => {
    const unit = `${ROOT}spectra/unit`;
    const r = await runCli(
      "aim",
      "--target",
      "45,15,6",
      "--illuminant",
      "D65",
      "--observer",
      "10",
      "--path",
      "6",
      "--dopant",
      `Cr=${unit}/cr_in_corundum.csv`,
      "--dopant",
      `Ti=${unit}/ti_in_corundum.csv`,
      "--json",
    );
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    for (const k of ["levels", "pathMm", "L", "a", "b", "dE00", "sensitivity"]) {
      expect(out).toHaveProperty(k);
    }
    expect(Object.keys(out.levels)).toEqual(["Cr", "Ti"]);
    expect(out.pathMm).toBe(6);
    expect(out.dE00).toBeLessThan(1);
    const usage = await runCli(
      "aim",
      "--target",
      "45,15",
      "--dopant",
      `Cr=${unit}/cr_in_corundum.csv`,
      "--path",
      "6",
    );
    expect(usage.code).toBe(1);
  });

  it("segregation fits k_eff from the demo boule profile (positions with --length)", async () => {
    const r = await runCli(
      "segregation",
      `${ROOT}spectra/unit/boule_B-26-04_profile.csv`,
      "--length",
      "80",
      "--json",
    );
    expect(r.code).toBe(0);
    const fit = JSON.parse(r.stdout);
    expect(Math.abs(fit.k - 0.62)).toBeLessThan(3 * fit.kSigma + 0.02);
    expect(fit.kSigma).toBeGreaterThan(0);
  });
});

describe("calibrate from a table of ready responses", () => {
  it("keeps the metric its header names, so predict can apply the calibration to spectra", async () => {
    const dir = await Deno.makeTempDir();
    await Deno.writeTextFile(
      `${dir}/std.csv`,
      "sample,Cr2O3 (wt%),band height (cm-1) @ 555 nm\nA,0.1,1.0\nB,0.2,2.1\nC,0.3,2.9\nD,0.4,4.1\n",
    );
    const r = await runCli("calibrate", `${dir}/std.csv`, "--out", `${dir}/cal.json`, "--json");
    expect(r.code).toBe(0);
    const cal = JSON.parse(await Deno.readTextFile(`${dir}/cal.json`));
    expect(cal.metric).toBe("band-height");
    expect(cal.metricOptions.bandNm).toBe(555);
    // closed-form OLS slope of these four points: Σ(x−x̄)(y−ȳ)/Σ(x−x̄)² = 0.505 / 0.05 = 10.1
    expect(cal.slope).toBeCloseTo(10.1, 9);
  });
});

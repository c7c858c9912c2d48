import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT, runCli } from "../_run_cli.ts";
import { normaliseUncertaintyArgs } from "../../cli/_uncertainty_options.ts";
import { readSpectrumFile } from "../../lib/io/read_file.ts";
import { spectrumColorUncertainty } from "../../lib/cie/color_uncertainty.ts";

const FILE = `${ROOT}test/fixtures/colour/cr_corundum_5nm.csv`;
const BASE = ["--thickness", "2", "--path", "6", "--illuminant", "D65,A"];
const SOURCES = ["--noise-sd", "0.003", "--thickness-sd", "0.02", "--path-sd", "0.06"];

describe("crystint color --uncertainty (machine contract)", () => {
  it("--json adds LSd, aSd, bSd, CSd, hSd and a 3×3 labCovariance equal to the library's", async () => {
    const r = await runCli("color", FILE, ...BASE, "--uncertainty", ...SOURCES, "--json");
    expect(r.code).toBe(0);
    const rows = JSON.parse(r.stdout);
    expect(rows.length).toBe(2);
    const [spectrum] = await readSpectrumFile(FILE, { thicknessMm: 2 });
    const lib = spectrumColorUncertainty(spectrum!, {
      illuminants: ["D65", "A"],
      pathMm: 6,
      sources: { noiseSd: 0.003, thicknessSdMm: 0.02, pathSdMm: 0.06 },
    });
    rows.forEach((row: Record<string, unknown>, i: number) => {
      for (const k of ["LSd", "aSd", "bSd", "CSd", "hSd"]) {
        expect(row[k]).toBeCloseTo(lib[i]![k as "LSd"], 12);
      }
      const cov = row["labCovariance"] as number[][];
      expect(cov.length).toBe(3);
      expect(cov.every((c) => c.length === 3)).toBe(true);
      expect(cov[0]![0]).toBeCloseTo((row["LSd"] as number) ** 2, 12);
      expect(row["uncertaintyMode"]).toBe("linear");
      expect(row["noiseSource"]).toBe("given");
    });
  });

  it("says on stderr when the noise is estimated", async () => {
    const r = await runCli("color", FILE, ...BASE, "--uncertainty", "--json");
    expect(r.code).toBe(0);
    expect(r.stderr).toContain("noise σ estimated from the high-frequency residual");
    expect(JSON.parse(r.stdout)[0].noiseSource).toBe("estimated");
  });

  it("`--uncertainty mc --draws N` and `--uncertainty-mode mc --draws N` are the same run", async () => {
    const a = await runCli(
      "color",
      FILE,
      ...BASE,
      "--uncertainty",
      "mc",
      "--draws",
      "300",
      ...SOURCES,
      "--json",
    );
    const b = await runCli(
      "color",
      FILE,
      ...BASE,
      "--uncertainty",
      "--uncertainty-mode",
      "mc",
      "--draws",
      "300",
      ...SOURCES,
      "--json",
    );
    expect(a.code).toBe(0);
    const ra = JSON.parse(a.stdout), rb = JSON.parse(b.stdout);
    expect(ra[0].uncertaintyMode).toBe("mc");
    expect(ra[0].uncertainty.draws).toBe(300);
    expect(ra[0].LSd).toBe(rb[0].LSd);
    expect(ra.length).toBe(2); // "mc" was not read as a file
  });

  it("--csv gains the scalar columns", async () => {
    const r = await runCli("color", FILE, ...BASE, "--uncertainty", ...SOURCES, "--csv");
    const header = r.stdout.split("\n")[0]!.split(",");
    // headers from the one mapping, lib/analysis/csv_headers.ts
    for (const k of ["L* sd", "a* sd", "b* sd", "C*ab sd", "h_ab sd (deg)"]) {
      expect(header).toContain(k);
    }
    expect(header).not.toContain("labCovariance");
  });

  it("change rows gain dE00Sd", async () => {
    const r = await runCli(
      "change",
      FILE,
      "--thickness",
      "2",
      "--path",
      "6",
      "--uncertainty",
      ...SOURCES,
      "--json",
    );
    expect(r.code).toBe(0);
    const [row] = JSON.parse(r.stdout);
    expect(row.dE00Sd).toBeGreaterThan(0);
    expect(row.dE00Sd).toBeLessThan(row.dE00);
  });

  it("a σ option without --uncertainty, or an unknown mode, is a usage error (exit 1)", async () => {
    expect((await runCli("color", FILE, "--noise-sd", "0.01")).code).toBe(1);
    expect((await runCli("color", FILE, "--uncertainty-mode", "x", "--uncertainty")).code).toBe(1);
    expect((await runCli("color", FILE, "--uncertainty", "--noise-sd", "-1")).code).toBe(1);
  });

  it("normaliseUncertaintyArgs keeps everything after -- as it is", () => {
    expect(normaliseUncertaintyArgs(["--uncertainty", "mc", "a.csv"])).toEqual([
      "--uncertainty",
      "--uncertainty-mode=mc",
      "a.csv",
    ]);
    expect(normaliseUncertaintyArgs(["--uncertainty=linear"])).toEqual([
      "--uncertainty",
      "--uncertainty-mode=linear",
    ]);
    expect(normaliseUncertaintyArgs(["--uncertainty", "--", "mc"])).toEqual([
      "--uncertainty",
      "--",
      "mc",
    ]);
  });
});

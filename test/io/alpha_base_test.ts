// ReadOptions.alphaBase: decadic α (A = α₁₀·d) is held as the model's natural α (T = e^(−α·d)),
// α = α₁₀ · ln 10 (ISO 80000-9 / IUPAC Gold Book: napierian vs decadic absorption coefficient).
import { describe, it } from "node:test";
import { expect } from "expect";
import { readResultsJson } from "../_results_json.ts";
import { readSpectraFromText } from "../../lib/io/read_spectra.ts";
import { spectrumColor } from "../../lib/cie/spectrum_color.ts";
import { makeLot, runCli } from "../_run_cli.ts";

/** A messy export: metadata in comments, semicolons and decimal commas, 2 nm steps. */
function alphaTable(header: string, value: (nm: number) => number): string {
  const lines = ["# Measured 2026-11-30 by lab 3", "# scan speed: medium", `nm;${header}`];
  for (let nm = 360; nm <= 830; nm += 2) {
    lines.push(`${nm};${value(nm).toFixed(6).replace(".", ",")}`);
  }
  return lines.join("\r\n") + "\r\n";
}

/** CIE 15:2018 L* of a flat transmittance T (Y = 100·T whatever the illuminant). */
const flatL = (t: number) => 116 * Math.cbrt(t) - 16;

describe("alphaBase on read", () => {
  it("10 multiplies α by ln 10; a header naming its base outranks the option; other ordinates are untouched", () => {
    const dec = alphaTable("alpha (cm-1)", () => 1.5);
    const [asE] = readSpectraFromText(dec, "a.csv");
    const [as10] = readSpectraFromText(dec, "a.csv", { alphaBase: "10" });
    expect(asE!.quantity).toBe("alpha");
    expect(asE!.values[0]).toBeCloseTo(1.5, 12);
    for (const v of as10!.values) expect(v).toBeCloseTo(1.5 * Math.LN10, 12);
    const [natural] = readSpectraFromText(alphaTable("alpha natural (cm-1)", () => 1.5), "n.csv", {
      alphaBase: "10",
    });
    expect(natural!.values[0]).toBeCloseTo(1.5, 12);
    const [said] = readSpectraFromText(alphaTable("alpha decadic (cm-1)", () => 1.5), "d.csv");
    expect(said!.values[0]).toBeCloseTo(1.5 * Math.LN10, 12);
    const [t] = readSpectraFromText(alphaTable("T", () => 0.5), "t.csv", { alphaBase: "10" });
    expect(t!.quantity).toBe("transmittance");
    expect(t!.values[0]).toBeCloseTo(0.5, 12);
  });

  it("a flat decadic α gives the closed-form colour T = 10^(−α₁₀·p), and a banded one the colour of the natural-α file", () => {
    const [flat] = readSpectraFromText(alphaTable("alpha (cm-1)", () => 1.5), "f.csv", {
      alphaBase: "10",
    });
    const [row] = spectrumColor(flat!, { pathMm: 4, illuminants: ["D65"], observers: ["2"] });
    expect(row!.L).toBeCloseTo(flatL(10 ** (-1.5 * 0.4)), 6);
    expect(Math.hypot(row!.a, row!.b)).toBeLessThan(1e-6);
    // a Cr-like band pair in decadic α, and the same file written in natural α (× ln 10)
    const band = (nm: number) =>
      0.2 + 2 * Math.exp(-(((nm - 555) / 40) ** 2)) + 1.4 * Math.exp(-(((nm - 405) / 30) ** 2));
    const [fromDecadic] = readSpectraFromText(alphaTable("alpha (cm-1)", band), "d.csv", {
      alphaBase: "10",
    });
    const [fromNatural] = readSpectraFromText(
      alphaTable("alpha (cm-1)", (nm) => band(nm) * Math.LN10),
      "n.csv",
    );
    const opts = { pathMm: 5, illuminants: ["D65", "A"], observers: ["2", "10"] };
    const a = spectrumColor(fromDecadic!, opts), b = spectrumColor(fromNatural!, opts);
    a.forEach((r, i) => {
      // the natural file is written to 6 decimals, so they agree to about 1e-5 in L*a*b*
      expect(r.L).toBeCloseTo(b[i]!.L, 4);
      expect(r.a).toBeCloseTo(b[i]!.a, 4);
      expect(r.b).toBeCloseTo(b[i]!.b, 4);
    });
  });

  it("batch: --alpha-base 10 and the sheet's alpha_base column read decadic α (closed form)", async () => {
    const lot = await makeLot(0, false);
    const out = await Deno.makeTempDir();
    await Deno.writeTextFile(`${lot}/dec.csv`, alphaTable("alpha (cm-1)", () => 1.5));
    await Deno.writeTextFile(`${lot}/nat.csv`, alphaTable("alpha (cm-1)", () => 1.5));
    const sheet = `${out}/sheet.csv`;
    await Deno.writeTextFile(sheet, "file,path_mm,alpha_base\ndec.csv,4,10\nnat.csv,4,e\n");
    const r = await runCli("batch", lot, "--out", out, "--manifest", sheet, "--quiet");
    expect(r.code).toBe(0);
    const L = async () => {
      const doc = await readResultsJson(`${out}/results.json`);
      return Object.fromEntries(
        doc.samples.map((
          s: { sample: string; color: { L: number }[] },
        ) => [s.sample, s.color[0]!.L]),
      );
    };
    const first = await L();
    expect(first.dec).toBeCloseTo(flatL(10 ** (-1.5 * 0.4)), 4);
    expect(first.nat).toBeCloseTo(flatL(Math.exp(-1.5 * 0.4)), 4);
    // --alpha-base 10 is the setting; a sheet cell still outranks it
    const again = await runCli(
      "batch",
      lot,
      "--out",
      out,
      "--manifest",
      sheet,
      "--alpha-base",
      "10",
      "--quiet",
    );
    expect(again.code).toBe(0);
    expect((await L()).nat).toBeCloseTo(first.nat, 10);
    // without a sheet: the option on top of the settings file (its pathMm kept)
    const bare = await Deno.makeTempDir();
    await Deno.writeTextFile(`${bare}/s.yaml`, "pathMm: 4\n");
    const noSheet = await runCli(
      "batch",
      `${lot}/nat.csv`,
      "--out",
      bare,
      "--settings",
      `${bare}/s.yaml`,
      "--alpha-base",
      "10",
      "--quiet",
    );
    expect(noSheet.stderr).toBe("");
    expect(noSheet.code).toBe(0);
    const doc = await readResultsJson(`${bare}/results.json`);
    expect(doc.samples[0].color[0].L).toBeCloseTo(flatL(10 ** (-1.5 * 0.4)), 4);
  });
});

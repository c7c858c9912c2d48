import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT, runCli } from "../_run_cli.ts";
import { readSpectrumFile } from "../../lib/io/read_file.ts";

const fixture = (p: string) => `${ROOT}test/fixtures/${p}`;
const tempDir = () => Deno.makeTempDir({ prefix: "crystint-convert-" });

/** The x,y rows of a CSV written by convert (lines after the header). */
function csvRows(text: string): number[][] {
  const lines = text.trim().split("\n");
  const header = lines.findIndex((l) => /^(wavelength|wavenumber|energy) \(/.test(l));
  return lines.slice(header + 1).map((l) => l.split(",").map(Number));
}

/** The colour rows of `crystint color --json` for a file. */
async function colorOf(file: string, ...extra: string[]) {
  const r = await runCli(
    "color",
    file,
    "--illuminant",
    "D65,A",
    "--observer",
    "2,10",
    "--json",
    ...extra,
  );
  expect(r.code).toBe(0);
  return JSON.parse(r.stdout) as Record<string, number>[];
}

describe("crystint convert", () => {
  it("CSV → JCAMP-DX → CSV reproduces the data to the written precision", async () => {
    const dir = await tempDir();
    // decimal comma, semicolon, %T with 3 decimals (an invented instrument layout)
    const src = fixture("exports/good/semicolon_decimal_comma_percent.csv");
    let r = await runCli("convert", src, "--to", "jcamp", "--out", `${dir}/a.jdx`);
    expect(r.code).toBe(0);
    const jdx = await Deno.readTextFile(`${dir}/a.jdx`);
    // %T to 3 decimals is T to 5: YFACTOR keeps exactly that
    expect(jdx).toContain("##YFACTOR=0.00001\n");
    r = await runCli(
      "convert",
      `${dir}/a.jdx`,
      "--to",
      "csv",
      "--ordinate",
      "percent",
      "--out",
      `${dir}/b.csv`,
    );
    expect(r.code).toBe(0);
    const back = csvRows(await Deno.readTextFile(`${dir}/b.csv`));
    const original = (await Deno.readTextFile(src)).trim().split("\n").slice(1).map((l) =>
      l.split(";").map((c) => Number(c.replace(",", ".")))
    );
    expect(back).toEqual(original);

    // full-precision data: the CSV written directly and the one via JCAMP-DX agree digit for digit
    const full = fixture("colour/cr_corundum_1nm.csv");
    await runCli("convert", full, "--to", "csv", "--out", `${dir}/direct.csv`);
    await runCli("convert", full, "--to", "jcamp", "--out", `${dir}/full.jdx`);
    await runCli("convert", `${dir}/full.jdx`, "--to", "csv", "--out", `${dir}/via.csv`);
    const direct = csvRows(await Deno.readTextFile(`${dir}/direct.csv`));
    expect(direct.length).toBe(471);
    expect(csvRows(await Deno.readTextFile(`${dir}/via.csv`))).toEqual(direct);
    // and the written precision is 7 significant digits of the source's 8 decimals
    const source = (await Deno.readTextFile(full)).trim().split("\n").slice(1).map((l) =>
      l.split(",").map(Number)
    );
    for (let i = 0; i < source.length; i++) {
      expect(Math.abs(direct[i]![1]! - source[i]![1]!)).toBeLessThanOrEqual(0.5e-7 + 1e-12);
    }
  });

  it("colour from the JCAMP-DX file equals colour from the CSV to 1e-4", async () => {
    const dir = await tempDir();
    for (const name of ["cr_corundum_1nm.csv", "broad_10nm.csv", "dark_stone_1nm.csv"]) {
      const src = fixture(`colour/${name}`);
      const out = `${dir}/${name.replace(".csv", ".jdx")}`;
      expect((await runCli("convert", src, "--to", "jcamp", "--out", out)).code).toBe(0);
      const a = await colorOf(src, "--ordinate", "transmittance");
      const b = await colorOf(out);
      expect(b.length).toBe(a.length);
      a.forEach((row, i) => {
        for (const k of ["X", "Y", "Z", "L", "a", "b"]) {
          expect(Math.abs(b[i]![k]! - row[k]!)).toBeLessThan(1e-4);
        }
      });
    }
  });

  it("refuses to overwrite an existing output without --force (exit 1, file untouched)", async () => {
    const dir = await tempDir();
    const out = `${dir}/kept.jdx`;
    await Deno.writeTextFile(out, "an earlier archive copy\n");
    const before = await Deno.stat(out);
    const src = fixture("colour/cr_corundum_5nm.csv");
    const r = await runCli("convert", src, "--to", "jcamp", "--out", out);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/exists; give --force/);
    expect(await Deno.readTextFile(out)).toBe("an earlier archive copy\n");
    expect((await Deno.stat(out)).mtime?.getTime()).toBe(before.mtime?.getTime());
    const forced = await runCli("convert", src, "--to", "jcamp", "--out", out, "--force");
    expect(forced.code).toBe(0);
    expect(await Deno.readTextFile(out)).toMatch(/^##TITLE=/);
    // no temporary file is left beside it
    const names = [];
    for await (const e of Deno.readDir(dir)) names.push(e.name);
    expect(names).toEqual(["kept.jdx"]);
  });

  it("with several outputs, one existing file stops the run before anything is written", async () => {
    const dir = await tempDir();
    await Deno.writeTextFile(`${dir}/multi_column-ruby-03.csv`, "mine\n");
    const r = await runCli(
      "convert",
      fixture("exports/good/multi_column.csv"),
      "--to",
      "csv",
      "--out-dir",
      dir,
    );
    expect(r.code).toBe(1);
    const names = [];
    for await (const e of Deno.readDir(dir)) names.push(e.name);
    expect(names).toEqual(["multi_column-ruby-03.csv"]);
    expect(await Deno.readTextFile(`${dir}/multi_column-ruby-03.csv`)).toBe("mine\n");
  });

  it("never overwrites an input, even with --force", async () => {
    const dir = await tempDir();
    const input = `${dir}/stone.csv`;
    await Deno.copyFile(fixture("colour/cr_corundum_5nm.csv"), input);
    const bytes = await Deno.readFile(input);
    const r = await runCli(
      "convert",
      input,
      "--to",
      "csv",
      "--out",
      `${dir}/./stone.csv`,
      "--force",
    );
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/it is an input/);
    expect(await Deno.readFile(input)).toEqual(bytes);
  });

  it("writes one output per spectrum of a multi-column file, each reading back to its column", async () => {
    const dir = await tempDir();
    const src = fixture("exports/good/multi_column.csv");
    const r = await runCli("convert", src, "--to", "jcamp", "--out-dir", dir, "--form", "affn");
    expect(r.code).toBe(0);
    const originals = await readSpectrumFile(src);
    expect(originals.length).toBe(3);
    for (const o of originals) {
      const [back] = await readSpectrumFile(`${dir}/multi_column-${o.meta.sample}.jdx`);
      expect(back!.meta.sample).toBe(o.meta.sample);
      expect(Array.from(back!.wavelengthNm)).toEqual(Array.from(o.wavelengthNm));
      o.values.forEach((v, i) =>
        expect(Math.abs(back!.values[i]! - v)).toBeLessThan(0.5e-5 + 1e-12)
      );
    }
  });

  it("resamples onto --grid with the CIE 167 method for the data's spacing and says which", async () => {
    const dir = await tempDir();
    // 5 nm uniform data → Sprague (CIE 167:2005)
    let r = await runCli(
      "convert",
      fixture("colour/cr_corundum_5nm.csv"),
      "--to",
      "jcamp",
      "--grid",
      "400:700:1",
      "--out",
      `${dir}/s.jdx`,
    );
    expect(r.code).toBe(0);
    let text = await Deno.readTextFile(`${dir}/s.jdx`);
    expect(text).toMatch(
      /##\$RESAMPLING=Sprague fifth-order interpolation \(CIE 167:2005\)[^\n]*onto 400:700:1 nm/,
    );
    expect(text).toContain("##NPOINTS=301\n");
    // Sprague reproduces the measured points where the grids meet (it interpolates)
    const [five] = await readSpectrumFile(fixture("colour/cr_corundum_5nm.csv"));
    const [one] = await readSpectrumFile(`${dir}/s.jdx`);
    const at = (s: typeof five, nm: number) => s!.values[s!.wavelengthNm.indexOf(nm)]!;
    for (const nm of [400, 455, 560, 700]) {
      expect(Math.abs(at(one, nm) - at(five, nm))).toBeLessThan(1e-6);
    }
    // no grid: the output says none
    r = await runCli(
      "convert",
      fixture("colour/cr_corundum_5nm.csv"),
      "--to",
      "csv",
      "--out",
      `${dir}/n.csv`,
    );
    text = await Deno.readTextFile(`${dir}/n.csv`);
    expect(text).toContain("Resampling: none");
    // a grid beyond the data fails that input (exit 2) and writes nothing
    r = await runCli(
      "convert",
      fixture("colour/cr_corundum_5nm.csv"),
      "--to",
      "csv",
      "--grid",
      "200:700:5",
      "--out",
      `${dir}/x.csv`,
    );
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/cover/);
    await expect(Deno.stat(`${dir}/x.csv`)).rejects.toThrow();
  });

  it("changes ordinate and axis: decadic α on a wavenumber axis, by Beer–Lambert", async () => {
    const dir = await tempDir();
    const src = fixture("colour/cr_corundum_5nm.csv");
    const r = await runCli(
      "convert",
      src,
      "--to",
      "csv",
      "--ordinate",
      "alpha",
      "--alpha-base",
      "10",
      "--axis",
      "cm-1",
      "--thickness",
      "2",
      "--out",
      `${dir}/alpha.csv`,
    );
    expect(r.code).toBe(0);
    const text = await Deno.readTextFile(`${dir}/alpha.csv`);
    expect(text).toContain("wavenumber (cm-1),alpha (cm-1; decadic)\n");
    expect(text).toContain("Thickness (mm): 2\n");
    const [t] = await readSpectrumFile(src);
    const rows = csvRows(text);
    // α₁₀ = A / d with A = −log10 T and d = 0.2 cm (Beer–Lambert, closed form); ascending in cm⁻¹
    rows.forEach(([nu, a10], i) => {
      const k = rows.length - 1 - i;
      expect(nu).toBeCloseTo(1e7 / t!.wavelengthNm[k]!, 3);
      expect(Math.abs(a10! - -Math.log10(t!.values[k]!) / 0.2)).toBeLessThan(1e-5);
    });
    // reading it back gives the napierian α of the model, α = α₁₀ · ln 10
    const [back] = await readSpectrumFile(`${dir}/alpha.csv`);
    expect(back!.quantity).toBe("alpha");
    expect(back!.values[10]! / (-Math.log10(t!.values[10]!) / 0.2 * Math.LN10)).toBeCloseTo(1, 4);
  });

  it("--alpha-base on a spectrum that stays a transmittance fails that input (exit 2)", async () => {
    const dir = await tempDir();
    const r = await runCli(
      "convert",
      fixture("colour/cr_corundum_5nm.csv"),
      "--to",
      "csv",
      "--alpha-base",
      "10",
      "--out",
      `${dir}/t.csv`,
    );
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/--ordinate alpha/);
  });

  it("usage errors exit 1", async () => {
    const src = fixture("colour/cr_corundum_5nm.csv");
    for (
      const args of [
        [src, "--out", "/tmp/x.csv"],
        [src, "--to", "pdf", "--out", "/tmp/x.pdf"],
        [src, "--to", "csv"],
        [src, "--to", "csv", "--grid", "400:700", "--out", "/tmp/x.csv"],
        [
          src,
          "--to",
          "csv",
          "--ordinate",
          "absorbance",
          "--alpha-base",
          "10",
          "--out",
          "/tmp/x.csv",
        ],
        [src, src, "--to", "csv", "--out", "/tmp/x.csv"],
      ]
    ) {
      expect((await runCli("convert", ...args)).code).toBe(1);
    }
  });
});

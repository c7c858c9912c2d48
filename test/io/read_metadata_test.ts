import { describe, it } from "node:test";
import { expect } from "expect";
import {
  parseMetaNumber,
  parseThicknessMm,
  readerWarnings,
  readSpectraFromBytes,
  readSpectrumFile,
  splitMetadataLine,
} from "../../lib/io/mod.ts";

const good = decodeURIComponent(new URL("../fixtures/exports/good/", import.meta.url).pathname);
const read = async (name: string, options = {}) =>
  (await readSpectrumFile(good + name, options))[0]!;
const bytes = (text: string) => new TextEncoder().encode(text);

/** T of the invented curve of the fixtures (see PROVENANCE.md); only its shape matters here. */
const curve = (sep: string, unitHeader = "wavelength_nm") =>
  [`${unitHeader}${sep}T`, ...Array.from({ length: 20 }, (_, i) => `${400 + 10 * i}${sep}0.5`)]
    .join("\n");

describe("metadata lines: any separator, units in brackets, decimal comma per value", () => {
  it("splits key and value at the first separator outside brackets", () => {
    // invented lines, one per separator the issue lists
    expect(splitMetadataLine("Thickness (mm):\t1,5")).toEqual({
      key: "Thickness (mm)",
      value: "1,5",
    });
    expect(splitMetadataLine("Thickness [mm]\t1.5")).toEqual({
      key: "Thickness [mm]",
      value: "1.5",
    });
    expect(splitMetadataLine("# Thickness: 1.5 mm")).toEqual({ key: "Thickness", value: "1.5 mm" });
    expect(splitMetadataLine("Thickness (mm);3,23;;")).toEqual({
      key: "Thickness (mm)",
      value: "3,23",
    });
    expect(splitMetadataLine("Polarisation,e")).toEqual({ key: "Polarisation", value: "e" });
    expect(splitMetadataLine("Operator = L. Moreau")).toEqual({
      key: "Operator",
      value: "L. Moreau",
    });
    expect(splitMetadataLine("Sample    garnet 7")).toEqual({ key: "Sample", value: "garnet 7" });
    expect(splitMetadataLine("# Thickness 1.5 mm")).toEqual({ key: "Thickness", value: "1.5 mm" });
    expect(splitMetadataLine("End of data")).toBeUndefined();
  });
  it("judges the decimal mark on each value, and refuses lists", () => {
    expect(parseMetaNumber("1,5")).toBe(1.5);
    expect(parseMetaNumber("1.5 mm")).toBe(1.5);
    expect(parseMetaNumber("1.234,5")).toBe(1234.5);
    expect(parseMetaNumber("1,234.5")).toBe(1234.5);
    expect(parseMetaNumber("1,5,7")).toBeUndefined();
    expect(parseMetaNumber("1, 5")).toBeUndefined();
    expect(parseMetaNumber("medium")).toBeUndefined();
    // unit conversions are exact decimal scalings (closed form: 1 cm = 10 mm, 1 µm = 0.001 mm)
    expect(parseThicknessMm("0,15 cm")).toBe(1.5);
    expect(parseThicknessMm("1500 µm")).toBe(1.5);
    expect(parseThicknessMm("1,5", "Thickness (mm)")).toBe(1.5);
    expect(parseThicknessMm("0,15", "Thickness [cm]")).toBe(1.5);
  });
});

describe("metadata read from each invented layout (fixtures in test/fixtures/exports/good)", () => {
  it("Thickness (mm):<TAB>1,5 in a comma-separated file reads 1.5 mm", async () => {
    const s = await read("meta_tab_after_colon.csv");
    expect(s.thicknessMm).toBe(1.5);
    expect(s.meta.sample).toBe("ruby-slab-4");
    expect(s.polarisation).toBe("e");
    expect(s.meta.host).toBe("corundum");
    expect(s.meta.operator).toBe("L. Moreau");
    expect(s.meta.date).toBe("2026-11-30, 14:05");
    expect(s.meta.fileValues?.thicknessMm).toEqual({
      value: 1.5,
      source: "file",
      key: "Thickness (mm)",
      how: "field",
      line: 2,
    });
    expect(s.meta.fileValues?.polarisation?.value).toBe("e");
    expect(s.meta.fileValues?.host?.value).toBe("corundum");
    expect(s.meta.sources).toEqual({
      axis: "file",
      ordinate: "file",
      thicknessMm: "file",
      polarisation: "file",
    });
  });
  it("metadata in # comment lines", async () => {
    const s = await read("meta_in_comments.csv");
    expect(s.thicknessMm).toBe(1.5);
    expect(s.meta.sample).toBe("spinel-3");
    expect(s.polarisation).toBe("e");
    expect(s.meta.host).toBe("spinel");
    expect(s.meta.instrument).toBe("bench UV-Vis II");
    expect(s.meta.fileValues?.thicknessMm?.line).toBe(2);
    expect(s.meta.fields?.["line 6"]).toBeUndefined(); // prose comments stay in comments only
  });
  it("tab-separated keys with units in brackets", async () => {
    const s = await read("meta_brackets_tab.txt");
    expect(s.thicknessMm).toBe(1.5);
    expect(s.meta.instrument).toBe("double-beam bench");
    expect(s.meta.host).toBe("YAG");
    expect(s.polarisation).toBe("unpolarised");
  });
  it("semicolon-separated with decimal comma and CRLF", async () => {
    const s = await read("meta_semicolon_decimal_comma.csv");
    expect(s.thicknessMm).toBe(3.23);
    expect(s.meta.sample).toBe("beryl-22");
    expect(s.polarisation).toBe("o");
    expect(s.meta.date).toBe("30.11.2026");
    expect(s.meta.operator).toBe("P. Ilić");
  });
  it("key = value with the thickness in cm; a footer that contradicts it is reported", async () => {
    const s = await read("meta_equals_cm_footer.txt");
    expect(s.thicknessMm).toBe(1.5);
    expect(s.meta.sample).toBe("tourmaline 9");
    expect(s.polarisation).toBe("e");
    expect(s.meta.operator).toBe("R. Okafor");
    expect(s.meta.fileWarnings?.map((w) => w.message).join(" ")).toMatch(
      /thickness twice: 1\.5 \(line 2\) and 2 \(line \d+\)/,
    );
    expect(s.meta.fileWarnings?.[0]?.need).toBe("thickness");
  });
  it("an option wins over the file, and the file's value is still on record", async () => {
    const s = await read("meta_tab_after_colon.csv", { thicknessMm: 2, axis: "nm" });
    expect(s.thicknessMm).toBe(2);
    expect(s.meta.sources?.thicknessMm).toBe("option");
    expect(s.meta.sources?.axis).toBe("option");
    expect(s.meta.fileValues?.thicknessMm?.value).toBe(1.5);
  });
  it("the ordinate's provenance: a preamble line, or the column header", async () => {
    const field = await read("preamble_mode_trailing_delimiter.csv");
    expect(field.meta.fileValues?.ordinate).toEqual({
      value: "percent",
      source: "file",
      how: "field",
      key: "Data mode",
      line: 3,
    });
    const header = await read("comma_header.csv");
    expect(header.meta.fileValues?.ordinate).toEqual({
      value: "transmittance",
      source: "file",
      how: "header",
      key: "T",
      line: 1,
    });
    const option = await read("comma_header.csv", { ordinate: "transmittance" });
    expect(option.meta.sources?.ordinate).toBe("option");
  });
  it("the existing preamble fixture still reads its verbatim fields", async () => {
    const s = await read("preamble_metadata.csv");
    expect(s.meta.fields?.["Scan speed"]).toBe("medium");
    expect(s.meta.operator).toBe("K. Varga");
  });
});

describe("reader warnings: once per file, none when the header names the unit", () => {
  it("wavelength_nm names the unit: no axis warning", () => {
    const [s] = readSpectraFromBytes(bytes(curve(",")), "named.csv");
    expect(s!.meta.fileWarnings).toEqual([]);
    expect(s!.meta.fileValues?.axis).toEqual({
      value: "nm",
      source: "file",
      how: "header",
      key: "wavelength_nm",
      line: 1,
    });
    expect(readerWarnings([s!])).toEqual([]);
  });
  it("a 1,000-column file with an axis of no unit says it once, with a machine hint", () => {
    const rows = ["x," + Array.from({ length: 1000 }, (_, k) => `s${k} T`).join(",")];
    for (let i = 0; i < 20; i++) {
      rows.push(`${400 + 10 * i},` + new Array(1000).fill("0.5").join(","));
    }
    const spectra = readSpectraFromBytes(bytes(rows.join("\n")), "wide.csv");
    expect(spectra.length).toBe(1000);
    expect(spectra[0]!.meta.fileWarnings).toBe(spectra[999]!.meta.fileWarnings);
    const lines = readerWarnings(spectra);
    expect(lines.length).toBe(1);
    expect(lines[0]).toMatch(/axis read as nm/);
    expect(lines[0]).not.toMatch(/--/);
    expect(spectra[0]!.meta.fileWarnings?.[0]?.need).toBe("axis");
    expect(spectra[0]!.meta.fileValues?.axis?.how).toBe("range");
  });
  it("per-spectrum notes of many spectra are grouped into one line", () => {
    const rows = ["nm," + Array.from({ length: 50 }, (_, k) => `s${k} T`).join(",")];
    for (let i = 0; i < 20; i++) {
      rows.push(`${400 + 10 * i},` + new Array(50).fill(i === 3 ? "1.01" : "0.5").join(","));
    }
    const spectra = readSpectraFromBytes(bytes(rows.join("\n")), "noisy.csv");
    expect(spectra[7]!.meta.warnings).toEqual([
      "1 value(s) slightly outside 0..1 clipped (noise, or a baseline or reference a little off)",
    ]);
    expect(readerWarnings(spectra)).toEqual([
      "50 of 50 spectra: value(s) slightly outside 0..1 clipped (noise, or a baseline or reference a little off)",
    ]);
  });
});

describe("thickness units (regression: unknown units were read as mm)", () => {
  it("converts the usual units and refuses the rest", async () => {
    const { parseThicknessMm } = await import("../../lib/io/read_metadata.ts");
    // 1 mil = 0.0254 mm, 1 in = 25.4 mm (exact, by definition of the inch)
    expect(parseThicknessMm("59 mil")).toBeCloseTo(1.4986, 10);
    expect(parseThicknessMm("0.06 in")).toBeCloseTo(1.524, 10);
    expect(parseThicknessMm("1500000 nm")).toBeCloseTo(1.5, 10);
    expect(parseThicknessMm("1.5", "Thickness [mm]")).toBe(1.5);
    expect(parseThicknessMm("0,15", "Thickness (cm)")).toBeCloseTo(1.5, 12);
    for (const bad of ["1.5 furlongs", "1.5-1.6 mm", "about 2 mm"]) {
      expect(parseThicknessMm(bad)).toBeUndefined();
    }
  });
});

describe("quoted numeric cells (regression: such files read as having no data)", () => {
  it('"380","0.80" rows read like unquoted ones', async () => {
    const { readSpectraFromBytes } = await import("../../lib/io/read_spectra.ts");
    const rows = ["wavelength_nm,T"];
    for (let nm = 380; nm <= 780; nm += 20) rows.push(`"${nm}","0.80"`);
    const [s] = readSpectraFromBytes(new TextEncoder().encode(rows.join("\n")), "q.csv");
    expect(s!.wavelengthNm.length).toBe(21);
    expect([...s!.values].every((v) => v === 0.8)).toBe(true);
  });
});

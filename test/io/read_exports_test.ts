import { describe, it } from "node:test";
import { expect } from "expect";
import {
  decodeAsdfLine,
  InputError,
  type InputProblem,
  readSpectraFromBytes,
  readSpectrumFile,
} from "../../lib/io/mod.ts";
import { spectrumAbsorbance } from "../../lib/spectrum/mod.ts";

const dir = (sub: string) =>
  decodeURIComponent(new URL(`../fixtures/exports/${sub}/`, import.meta.url).pathname);
const read = (sub: string, name: string, options = {}) =>
  readSpectrumFile(dir(sub) + name, options);

/** T of the invented corundum-like curve all "good" fixtures were written from. */
function truthT(nm: number): number {
  const a = 0.8 * Math.exp(-0.5 * ((1e7 / nm - 18000) / 1200) ** 2) +
    1.0 * Math.exp(-0.5 * ((1e7 / nm - 24500) / 1400) ** 2) + 0.05;
  return 10 ** -a;
}

async function expectTruth(name: string, tolerance = 2e-4) {
  const [s] = await read("good", name);
  expect(s).toBeDefined();
  const a = spectrumAbsorbance({ ...s!, thicknessMm: s!.thicknessMm ?? 2 });
  const t = a.map((v) => 10 ** -v);
  s!.wavelengthNm.forEach((nm, i) => {
    if (i > 0) expect(nm).toBeGreaterThan(s!.wavelengthNm[i - 1]!);
    expect(Math.abs(t[i]! - truthT(nm))).toBeLessThan(tolerance);
  });
  return s!;
}

describe("reading well-formed exports of many layouts", () => {
  it("comma-separated with wavelength_nm,T header", async () => {
    const s = await expectTruth("comma_header.csv");
    expect(s.quantity).toBe("transmittance");
    expect(s.wavelengthNm.length).toBe(95);
  });
  it("semicolon-separated with decimal comma and %T", async () => {
    const s = await expectTruth("semicolon_decimal_comma_percent.csv");
    expect(s.quantity).toBe("transmittance");
  });
  it("tab-separated absorbance", async () => {
    expect((await expectTruth("tab_absorbance.txt")).quantity).toBe("absorbance");
  });
  it("metadata preamble kept in meta; thickness, polarisation and sample name read", async () => {
    const s = await expectTruth("preamble_metadata.csv");
    expect(s.meta.sample).toBe("garnet-07");
    expect(s.thicknessMm).toBe(1.5);
    expect(s.polarisation).toBe("o");
    expect(s.meta.fields?.["Operator"]).toBe("K. Varga");
  });
  it("comment lines, blank lines and CRLF", async () => {
    await expectTruth("comments_crlf.csv");
  });
  it("UTF-8 with BOM, UTF-16 LE and BE with BOM", async () => {
    for (const f of ["utf8_bom.csv", "utf16le_bom.csv", "utf16be_bom.csv"]) await expectTruth(f);
  });
  it("descending wavelength axis is returned ascending", async () => {
    await expectTruth("descending_axis.csv");
  });
  it("wavenumber axis with α in cm⁻¹ and thickness from the preamble", async () => {
    const s = await expectTruth("wavenumber_alpha.csv", 5e-4);
    expect(s.quantity).toBe("alpha");
    expect(s.thicknessMm).toBe(2);
  });
  it("micrometre axis and electron-volt axis", async () => {
    await expectTruth("micrometre_axis.csv");
    await expectTruth("electronvolt_absorbance.csv");
  });
  it("whitespace-separated with decimal comma", async () => {
    await expectTruth("whitespace_decimal_comma.txt");
  });
  it("one x column with several y columns gives several spectra named from the header", async () => {
    const spectra = await read("good", "multi_column.csv");
    expect(spectra.map((s) => s.meta.sample)).toEqual(["ruby-01", "ruby-02", "ruby-03"]);
    expect(spectra[0]!.values[40]).toBeCloseTo(truthT(560), 4);
    expect(spectra[2]!.values[40]).toBeCloseTo(truthT(560) ** 2, 4);
  });
  it("noise slightly outside 0..1 is clipped with a warning", async () => {
    const [s] = await read("good", "noise_clipped.csv");
    expect(s!.values[0]).toBe(0);
    expect(s!.values[94]).toBe(1);
    expect(s!.meta.warnings?.join(" ")).toMatch(/2 value\(s\).*clipped/);
  });
  it("the ordinate named in a preamble line, and a delimiter at the end of every line", async () => {
    const s = await expectTruth("preamble_mode_trailing_delimiter.csv");
    expect(s.meta.sample).toBe("Sample 1");
  });
  it("a text footer after the table is kept as metadata", async () => {
    const [s] = await read("good", "footer_text.csv");
    expect(s!.wavelengthNm.length).toBe(95);
    expect(s!.meta.fields?.["Checksum"]).toBe("12ab");
  });
  it("JCAMP-DX (X++(Y..Y)) with YFACTOR; TITLE becomes the sample", async () => {
    const s = await expectTruth("stone.jdx", 1e-4);
    expect(s.meta.sample).toBe("spinel-12");
  });
  it("the metadata layouts (meta_*) read the same curve", async () => {
    for (
      const f of [
        "meta_tab_after_colon.csv",
        "meta_in_comments.csv",
        "meta_brackets_tab.txt",
        "meta_semicolon_decimal_comma.csv",
        "meta_equals_cm_footer.txt",
      ]
    ) expect((await expectTruth(f)).wavelengthNm.length).toBe(95);
  });
  it("--ordinate and --axis override what the file says", async () => {
    const [s] = await read("bad", "no_header_ambiguous.csv", {
      ordinate: "transmittance",
      axis: "nm",
    });
    expect(s!.values[40]).toBeCloseTo(truthT(560), 4);
  });
});

describe("rejecting bad input with the specific error", () => {
  const cases: [string, InputProblem, number | undefined, RegExp][] = [
    ["empty.csv", "empty", undefined, /empty/i],
    ["only_header.csv", "empty", undefined, /no numeric data/i],
    ["binary.bin", "binary", undefined, /binary/i],
    ["non_numeric_cell.csv", "non-numeric", 5, /"abc" is not a number/],
    ["nan_value.csv", "non-finite", 7, /NaN/],
    ["inf_value.csv", "non-finite", 8, /inf/],
    ["duplicate_x.csv", "duplicate-x", 12, /Duplicate x value 405 \(also at line 11\)/],
    ["non_monotonic.csv", "non-monotonic", 12, /300 breaks the ascending order/],
    ["too_few_points.csv", "too-few-points", 2, /at least 5/],
    ["t_out_of_range.csv", "out-of-range", 2, /if the values are percent/],
    ["no_header_ambiguous.csv", "ambiguous-ordinate", 1, /needs to be stated/],
    ["ragged_row.csv", "malformed", 10, /3 fields/],
    ["npoints_mismatch.jdx", "malformed", 8, /NPOINTS says 12/],
  ];
  for (const [name, problem, line, message] of cases) {
    it(`${name}: ${problem}${line ? ` at line ${line}` : ""}`, async () => {
      const error = await read("bad", name).then(() => undefined, (e) => e);
      expect(error).toBeInstanceOf(InputError);
      expect((error as InputError).problem).toBe(problem);
      expect((error as InputError).line).toBe(line);
      expect((error as InputError).message).toMatch(message);
      expect((error as InputError).message.startsWith(dir("bad") + name)).toBe(true);
    });
  }
  it("ambiguous_axis.csv: an x axis that could be µm or eV asks for the axis unit", async () => {
    const error = await read("bad", "ambiguous_axis.csv").then(() => undefined, (e) => e);
    expect((error as InputError).problem).toBe("ambiguous-axis");
    expect((error as InputError).hint).toEqual({
      need: "axis",
      choices: ["nm", "um", "cm-1", "ev"],
    });
    expect((error as InputError).message).not.toMatch(/--/);
  });
  it("the ordinate and percent hints are machine-readable, not CLI flags", async () => {
    const ordinate = await read("bad", "no_header_ambiguous.csv").then(() => undefined, (e) => e);
    expect((ordinate as InputError).hint?.need).toBe("ordinate");
    const percent = await read("bad", "t_out_of_range.csv").then(() => undefined, (e) => e);
    expect((percent as InputError).hint).toEqual({ need: "ordinate", choices: ["percent"] });
    for (const e of [ordinate, percent]) expect((e as InputError).message).not.toMatch(/--/);
  });
  it("a missing file is reported as unreadable", async () => {
    const error = await read("bad", "no_such_file.csv").then(() => undefined, (e) => e);
    expect((error as InputError).problem).toBe("unreadable");
  });
});

describe("JCAMP-DX ASDF compression (McDonald & Wilks 1988)", () => {
  it("decodes the same ten values written as AFFN, SQZ, DIF and DIFDUP", () => {
    const expected = [1, 2, 3, 3, 2, 1, 0, -1, -2, -3];
    for (const line of ["1 2 3 3 2 1 0 -1 -2 -3", "ABCCBA@abc", "AJJ%jjjjjj", "AJT%jX"]) {
      expect(decodeAsdfLine(line, "x", 1).values).toEqual(expected);
    }
  });
});

describe("totality: any bytes give spectra or an InputError", () => {
  it("never throws anything else on random and mutated input", async () => {
    const fc = await import("fast-check");
    const seed = new TextEncoder().encode(Deno.readTextFileSync(dir("good") + "comma_header.csv"));
    const jcamp = new TextEncoder().encode(Deno.readTextFileSync(dir("good") + "stone.jdx"));
    const mutate = (base: Uint8Array) =>
      fc.array(fc.tuple(fc.nat(base.length - 1), fc.integer({ min: 0, max: 255 })), {
        maxLength: 8,
      }).map((edits) => {
        const copy = base.slice();
        for (const [at, byte] of edits) copy[at] = byte;
        return copy;
      });
    // text edits that produce overflowing numbers, huge repeat counts and odd cells
    const poison = fc.constantFrom(
      "1e309",
      "-1e309",
      "1e99999",
      "Infinity",
      "-inf",
      "NaN",
      "S99999999999",
      "A99999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999999",
      "##YFACTOR=1e308\n",
      "##NPOINTS=1e12\n",
      "-50",
      ",,",
      '"',
    );
    const inject = (base: Uint8Array) =>
      fc.array(fc.tuple(fc.nat(base.length - 1), poison), { minLength: 1, maxLength: 3 }).map(
        (edits) => {
          let text = new TextDecoder().decode(base);
          for (const [at, piece] of edits) {
            const i = at % text.length;
            text = text.slice(0, i) + piece + text.slice(i + (piece.length % 4));
          }
          return new TextEncoder().encode(text);
        },
      );
    fc.assert(
      fc.property(
        fc.oneof(
          fc.uint8Array({ maxLength: 400 }),
          mutate(seed),
          mutate(jcamp),
          inject(seed),
          inject(jcamp),
          fc.string({ maxLength: 300 }).map((s) => new TextEncoder().encode(s)),
        ),
        (bytes) => {
          try {
            const spectra = readSpectraFromBytes(bytes, "fuzz.csv");
            for (const s of spectra) {
              expect(s.values.every(Number.isFinite)).toBe(true);
              expect(s.wavelengthNm.every((v) => Number.isFinite(v) && v > 0)).toBe(true);
              if (s.quantity === "transmittance") {
                expect(s.values.every((v) => v >= 0 && v <= 1)).toBe(true);
              }
              if (s.quantity === "absorbance") expect(s.values.every((v) => v >= -0.3)).toBe(true);
            }
          } catch (e) {
            if (!(e instanceof InputError)) throw e;
          }
        },
      ),
      { numRuns: 1500, seed: 20261202 },
    );
  });
});

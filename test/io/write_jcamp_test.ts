import { describe, it } from "node:test";
import { expect } from "expect";
import { convert } from "jcampconverter";
import { InputError } from "../../lib/io/input_error.ts";
import { decodeAsdfLine, readJcamp } from "../../lib/io/read_jcamp.ts";
import { spectrumColumns } from "../../lib/io/spectrum_columns.ts";
import { writeJcamp } from "../../lib/io/write_jcamp.ts";
import { convertSpectrum } from "../../lib/analysis/convert_spectrum.ts";
import type { Spectrum } from "../../lib/spectrum/spectrum.ts";
import { seededNormal } from "../_random.ts";

/**
 * A messy, realistic slab spectrum (invented): a Cr³⁺-like pair of Gaussian bands in wavenumber,
 * an absorption edge that saturates to exactly 0 below 330 nm (long DUP runs), noise that grows
 * as T falls, 1 nm steps 300–1100 nm, full double precision.
 */
function messySlab(seed = 7): Spectrum {
  const noise = seededNormal(seed);
  const wavelengthNm = Float64Array.from({ length: 801 }, (_, i) => 300 + i);
  const values = wavelengthNm.map((nm) => {
    const nu = 1e7 / nm;
    const a = 0.9 * Math.exp(-(((nu - 18000) / 1800) ** 2)) +
      0.7 * Math.exp(-(((nu - 24600) / 1700) ** 2)) + (nm < 340 ? (340 - nm) * 0.4 : 0);
    const t = 0.86 * 10 ** -a;
    const noisy = t + noise() * 0.0004 / Math.sqrt(Math.max(t, 1e-3));
    return nm < 330 ? 0 : Math.min(1, Math.max(0, noisy));
  });
  return {
    wavelengthNm,
    values,
    quantity: "transmittance",
    thicknessMm: 2.35,
    polarisation: "e",
    meta: { sample: "CZ-114 wafer 3", sourceFile: "in.csv" },
  };
}

/** Absorbance of the same slab: negative values at high T (noise), so SQZ/DIF minus digits. */
function messyAbsorbance(): Spectrum {
  const s = messySlab(11);
  const values = s.values.map((t) => (t > 0 ? -Math.log10(t) - 0.06 : 6));
  return { ...s, values, quantity: "absorbance" };
}

const dataLines = (text: string) => {
  const lines = text.split("\n");
  const start = lines.findIndex((l) => l.startsWith("##XYDATA")) + 1;
  const end = lines.findIndex((l) => l.startsWith("##END"));
  return { lines, start, end, data: lines.slice(start, end) };
};

/** x and y as jcampconverter parses them. */
function parseWithJcampconverter(text: string): { x: number[]; y: number[] } {
  const data = convert(text).flatten[0]!.spectra[0]!.data;
  return { x: Array.from(data.x ?? []), y: Array.from(data.y ?? []) };
}

const factor = (text: string, label: string) =>
  Number(new RegExp(`##${label}=(.*)`).exec(text)![1]);

describe("writeJcamp() (JCAMP-DX 4.24, McDonald & Wilks 1988)", () => {
  it("AFFN and DIFDUP outputs of the same spectrum read back identical", () => {
    for (const spectrum of [messySlab(), messyAbsorbance()]) {
      const affn = readJcamp(writeJcamp(spectrum, { form: "affn" }), "a.jdx")[0]!;
      const difdup = readJcamp(writeJcamp(spectrum, { form: "difdup" }), "d.jdx")[0]!;
      expect(Array.from(difdup.values)).toEqual(Array.from(affn.values));
      expect(Array.from(difdup.wavelengthNm)).toEqual(Array.from(affn.wavelengthNm));
    }
  });

  it("reads back to the written precision: every value within YFACTOR/2", () => {
    for (const spectrum of [messySlab(), messyAbsorbance()]) {
      for (const form of ["affn", "difdup"] as const) {
        const text = writeJcamp(spectrum, { form });
        const yFactor = factor(text, "YFACTOR");
        const back = readJcamp(text, "x.jdx")[0]!;
        expect(back.values.length).toBe(spectrum.values.length);
        for (let i = 0; i < back.values.length; i++) {
          expect(Math.abs(back.values[i]! - spectrum.values[i]!)).toBeLessThanOrEqual(
            yFactor / 2 * (1 + 1e-9),
          );
          expect(back.wavelengthNm[i]).toBeCloseTo(spectrum.wavelengthNm[i]!, 9);
        }
      }
    }
  });

  it("chooses YFACTOR from the requested significant digits, or coarser when the data are", () => {
    // closed form of the rule: 7 significant digits of max |y| = 0.86… → 10^(−1−6)
    expect(factor(writeJcamp(messySlab()), "YFACTOR")).toBe(1e-7);
    expect(factor(writeJcamp(messySlab(), { ySignificantDigits: 4 }), "YFACTOR")).toBe(1e-4);
    // data with 4 decimals (as an instrument writes them) keep exactly those
    const s = messySlab();
    const rounded = { ...s, values: s.values.map((v) => Math.round(v * 1e4) / 1e4) };
    const text = writeJcamp(rounded);
    expect(factor(text, "YFACTOR")).toBe(1e-4);
    expect(Array.from(readJcamp(text, "r.jdx")[0]!.values)).toEqual(
      Array.from(rounded.values).map((v) => Math.round(v * 1e4) * 1e-4),
    );
  });

  it("DIFDUP: lines of at most 80 characters, DUP runs for the saturated edge, Y-checks", () => {
    const text = writeJcamp(messySlab());
    const { data } = dataLines(text);
    expect(Math.max(...data.map((l) => l.length))).toBeLessThanOrEqual(80);
    // the 30 saturated zeros: "@" then a DIF of zero repeated (DUP), McDonald & Wilks Table VII
    expect(data[0]).toMatch(/^300 @%[S-Zs]\d*/);
    // every line after the first opens with the last value of the line before (Y-check)
    const decoded = data.map((l, i) => decodeAsdfLine(l, "x.jdx", i + 1).values);
    expect(decoded.length).toBeGreaterThan(10);
    for (let i = 1; i < decoded.length; i++) {
      expect(decoded[i]![1]).toBe(decoded[i - 1]![decoded[i - 1]!.length - 1]);
    }
    // the last line is the final abscissa and its check value alone
    expect(decoded[decoded.length - 1]!.length).toBe(2);
    expect(decoded[decoded.length - 1]![0]).toBe(1100);
  });

  it("writes the example sequence of the ASDF test in the DIFDUP form the reader test decodes", () => {
    // 1 2 3 3 2 1 0 −1 −2 −3 ↔ "AJT%jX" (test/io/read_exports_test.ts, McDonald & Wilks 1988 §5)
    const wavelengthNm = Float64Array.from({ length: 10 }, (_, i) => 401 + i);
    const values = Float64Array.from([1, 2, 3, 3, 2, 1, 0, -1, -2, -3]);
    const text = writeJcamp({
      wavelengthNm,
      values,
      quantity: "absorbance",
      meta: { sample: "t" },
    });
    expect(dataLines(text).data).toEqual(["401 AJT%jX", "410 c"]);
    expect(factor(text, "YFACTOR")).toBe(1);
  });

  it("a corrupted Y-check is caught by our reader with its line number", () => {
    const text = writeJcamp(messySlab(), { form: "difdup" });
    const { lines, start } = dataLines(text);
    const target = start + 4; // 0-based index of the fifth data line
    // change the last digit of the check value (the SQZ token after the abscissa)
    lines[target] = lines[target]!.replace(
      /^(\d+ [@A-Ia-i]\d*?)(\d)(?=[^0-9]|$)/,
      (_, a, d) => `${a}${(Number(d) + 1) % 10}`,
    );
    expect(lines[target]).not.toBe(text.split("\n")[target]);
    const error = (() => {
      try {
        readJcamp(lines.join("\n"), "corrupt.jdx");
      } catch (e) {
        return e;
      }
    })();
    expect(error).toBeInstanceOf(InputError);
    expect((error as InputError).line).toBe(target + 1);
    expect((error as InputError).problem).toBe("malformed");
    expect((error as InputError).message).toMatch(/^corrupt\.jdx:\d+: Y-check value/);
  });

  it("puts sample, thickness, polarisation and host in labelled records that read back", () => {
    const text = writeJcamp(messySlab(), { host: "corundum", records: { resampling: "none" } });
    expect(text).toMatch(/^##TITLE=CZ-114 wafer 3\n##JCAMP-DX=4.24\n/);
    expect(text).toContain("##$THICKNESS MM=2.35\n");
    expect(text).toContain("##$POLARISATION=e\n");
    expect(text).toContain("##$HOST=corundum\n");
    expect(text).toContain("##$RESAMPLING=none\n");
    for (const label of ["XUNITS=NANOMETERS", "YUNITS=TRANSMITTANCE", "FIRSTX=300", "LASTX=1100"]) {
      expect(text).toContain(`##${label}\n`);
    }
    expect(text).toContain("##NPOINTS=801\n");
    const back = readJcamp(text, "m.jdx")[0]!;
    expect(back.meta.sample).toBe("CZ-114 wafer 3");
    expect(back.thicknessMm).toBe(2.35);
    expect(back.polarisation).toBe("e");
    expect(back.meta.fields?.["$HOST"]).toBe("corundum");
  });

  it("an uneven axis is written as (XY..XY) and reads back", () => {
    // a detector pixel grid: steps from 0.42 to 0.47 nm (invented)
    const wavelengthNm = Float64Array.from(
      { length: 300 },
      (_, i) => 380 + 0.42 * i + 1e-4 * i * i,
    );
    const values = wavelengthNm.map((nm) => 0.5 + 0.3 * Math.sin(nm / 20));
    const s: Spectrum = { wavelengthNm, values, quantity: "transmittance", meta: { sample: "p" } };
    const text = writeJcamp(s);
    expect(text).toContain("##XYPOINTS=(XY..XY)\n");
    expect(text).not.toContain("##XYDATA");
    const back = readJcamp(text, "p.jdx")[0]!;
    for (let i = 0; i < 300; i++) {
      expect(back.wavelengthNm[i]).toBeCloseTo(wavelengthNm[i]!, 6);
      expect(back.values[i]).toBeCloseTo(values[i]!, 6);
    }
  });
});

describe("jcampconverter (npm, independent general-purpose JCAMP-DX parser) reads our files", () => {
  const cases: [string, Spectrum, Parameters<typeof writeJcamp>[1]][] = [
    ["transmittance, nm, DIFDUP", messySlab(), { form: "difdup" }],
    ["transmittance, nm, AFFN", messySlab(), { form: "affn" }],
    ["absorbance with negative values, DIFDUP", messyAbsorbance(), {}],
    ["percent transmittance", messySlab(), { ordinate: "percent" }],
  ];
  for (const [name, spectrum, options] of cases) {
    it(`${name}: same x and y as our reader`, () => {
      const text = writeJcamp(spectrum, options);
      const parsed = parseWithJcampconverter(text);
      const ours = readJcamp(text, "x.jdx")[0]!;
      const scale = options?.ordinate === "percent" ? 100 : 1;
      expect(parsed.x.length).toBe(ours.values.length);
      for (let i = 0; i < ours.values.length; i++) {
        expect(Math.abs(parsed.x[i]! - ours.wavelengthNm[i]!)).toBeLessThan(1e-9);
        expect(Math.abs(parsed.y[i]! - ours.values[i]! * scale)).toBeLessThan(1e-9 * scale);
      }
    });
  }
  it("a wavenumber grid (cm-1, resampled evenly) with decadic α", () => {
    const grid = { start: 9100, stop: 30000, step: 10, axis: "cm-1" as const };
    const { spectrum } = convertSpectrum(messySlab(), { quantity: "alpha", grid });
    const options = { axis: "cm-1" as const, alphaBase: "10" as const };
    const text = writeJcamp(spectrum, options);
    expect(text).toContain("##XUNITS=1/CM\n");
    expect(text).toContain("##DELTAX=10\n");
    const parsed = parseWithJcampconverter(text);
    const cols = spectrumColumns(spectrum, options);
    const yFactor = factor(text, "YFACTOR");
    expect(parsed.x.length).toBe(2091);
    for (let i = 0; i < cols.x.length; i++) {
      expect(parsed.x[i]).toBeCloseTo(cols.x[i]!, 6);
      expect(Math.abs(parsed.y[i]! - cols.y[i]!)).toBeLessThanOrEqual(yFactor / 2 * (1 + 1e-9));
    }
    // and our reader turns the decadic α back into the model's napierian α (× ln 10)
    const ours = readJcamp(text, "a.jdx")[0]!;
    expect(ours.quantity).toBe("alpha");
    for (let i = 0; i < ours.values.length; i++) {
      expect(Math.abs(ours.values[i]! - spectrum.values[i]!)).toBeLessThanOrEqual(
        yFactor * Math.LN10 / 2 * (1 + 1e-9),
      );
    }
  });
});

describe("readJcamp() on valid compressed lines", () => {
  it("an SQZ E or e right after the abscissa is the pseudo-digit ±5, not an exponent", () => {
    // McDonald & Wilks 1988 §5.3: E is an exponent only when a sign and digits follow; J5 = DIF +15
    expect(decodeAsdfLine("400E123J5", "x.jdx", 1).values).toEqual([400, 5123, 5138]);
    expect(decodeAsdfLine("400e12", "x.jdx", 1).values).toEqual([400, -512]);
    expect(decodeAsdfLine("1.5E+02 3", "x.jdx", 1).values).toEqual([150, 3]);
  });
  it("µm and eV axes read back to the same wavelengths", () => {
    const s = messySlab();
    for (const axis of ["um", "ev"] as const) {
      const grid = axis === "um"
        ? { start: 0.4, stop: 1.0, step: 0.002, axis }
        : { start: 1.5, stop: 3.5, step: 0.005, axis };
      const { spectrum } = convertSpectrum(s, { grid });
      const back = readJcamp(writeJcamp(spectrum, { axis }), "u.jdx")[0]!;
      expect(back.values.length).toBe(spectrum.values.length);
      back.wavelengthNm.forEach((nm, i) => expect(nm).toBeCloseTo(spectrum.wavelengthNm[i]!, 6));
    }
  });
});

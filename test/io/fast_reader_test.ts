import { describe, it } from "node:test";
import { expect } from "expect";
import fc from "fast-check";
import { InputError, readSpectraFromBytes, readSpectraFromText } from "../../lib/io/mod.ts";
import { decodeText } from "../../lib/io/decode_text.ts";
import { parseNumericLine, WHITESPACE_DELIMITER } from "../../lib/io/parse_numeric_line.ts";
import type { Spectrum } from "../../lib/spectrum/spectrum.ts";
import { indexSourceLines } from "../../lib/io/byte_source.ts";
import { streamSpectra } from "../../lib/io/stream_spectra.ts";

const root = decodeURIComponent(new URL("../fixtures/exports/", import.meta.url).pathname);

/**
 * The outcome of one read: the spectra, or the error's problem, line and message. `auto` reads
 * the bytes (an ASCII table straight from its bytes), `text` the decoded text by the fast path,
 * `general` every line cell by cell.
 */
function outcome(bytes: Uint8Array, file: string, route: "auto" | "text" | "general") {
  try {
    if (route === "text") return { spectra: readSpectraFromText(decodeText(bytes, file), file) };
    return { spectra: readSpectraFromBytes(bytes, file, { tableReader: route }) };
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    return { error: { problem: e.problem, line: e.line, message: e.message } };
  }
}

/** Counts of the stream route's outcomes: read, declined, refused by throwing. */
const streamed = { read: 0, declined: 0, threw: 0 };

/**
 * Reads the bytes a stretch of 7 values at a time (`streamSpectra`) and puts each spectrum's
 * values back together; the stream route may decline or throw, never read other spectra.
 */
function checkStreamed(bytes: Uint8Array, file: string, whole: ReturnType<typeof outcome>) {
  const source = {
    size: bytes.length,
    readAt: (p: number, into: Uint8Array) => {
      const part = bytes.subarray(p, p + into.length);
      into.set(part);
      return part.length;
    },
  };
  const text = indexSourceLines(source, 1000);
  let spectra: Spectrum[] | undefined;
  const values: Float64Array<ArrayBuffer>[] = [];
  try {
    spectra = text && streamSpectra(text, file, {}, {
      begin: (s) => s.forEach((x) => values.push(new Float64Array(x.wavelengthNm.length))),
      stretch: (v, n, from) =>
        values.forEach((s, k) => s.set(v.subarray(k * n, (k + 1) * n), from)),
    }, 7);
  } catch {
    streamed.threw++;
    return;
  }
  if (!spectra) {
    streamed.declined++;
    return;
  }
  streamed.read++;
  expectSame({ spectra: spectra.map((s, i) => ({ ...s, values: values[i]! })) }, whole);
}

/** The bit patterns of a Float64Array (so −0 ≠ 0 and NaN = NaN), for bitwise comparison. */
const bits = (a: Float64Array) => Array.from(new BigUint64Array(a.slice().buffer));

function expectSame(a: ReturnType<typeof outcome>, b: ReturnType<typeof outcome>) {
  expect(a.error).toEqual(b.error);
  if (!a.spectra) return;
  expect(a.spectra.length).toBe(b.spectra!.length);
  a.spectra.forEach((s: Spectrum, i) => {
    const t = b.spectra![i]!;
    expect(bits(s.wavelengthNm)).toEqual(bits(t.wavelengthNm));
    expect(bits(s.values)).toEqual(bits(t.values));
    expect({ ...s, wavelengthNm: 0, values: 0 }).toEqual({ ...t, wavelengthNm: 0, values: 0 });
  });
}

describe("parseNumericLine (the fast path) equals Number() bit for bit", () => {
  it("parses plain decimals, signs, exponents, −0 and decimal commas", () => {
    const cols = [new Float64Array(1), new Float64Array(1), new Float64Array(1)];
    // identities: each value is what Number() (ECMA-262 StringToNumber) gives for the text
    expect(parseNumericLine("-0, +.5 ,1.e3", 44, false, cols, 0)).toBe(true);
    expect(Object.is(cols[0]![0], -0)).toBe(true);
    expect([cols[1]![0], cols[2]![0]]).toEqual([0.5, 1000]);
    expect(parseNumericLine("360,0;76,821;", 59, true, cols.slice(0, 2), 0)).toBe(true);
    expect([cols[0]![0], cols[1]![0]]).toEqual([360, 76.821]);
    expect(parseNumericLine("  3.5e-7\t 12  ", WHITESPACE_DELIMITER, false, cols.slice(0, 2), 0))
      .toBe(true);
    expect([cols[0]![0], cols[1]![0]]).toEqual([3.5e-7, 12]);
  });
  it("declines what the general reader must judge", () => {
    const two = [new Float64Array(1), new Float64Array(1)];
    for (
      const line of [
        "1,,2",
        "1,2,3",
        "1",
        '"1",2',
        "1,2x",
        "1,1e309",
        "1,0.12345678901234567",
        ",5,1",
        "1.5-2 3",
      ]
    ) {
      const delimiter = line.includes(",") ? 44 : WHITESPACE_DELIMITER;
      expect([line, parseNumericLine(line, delimiter, false, two, 0)]).toEqual([line, false]);
    }
  });
  it("any double, written in any of the usual ways, reads back as Number() reads it", () => {
    fc.assert(
      fc.property(
        fc.double({ noNaN: true, noDefaultInfinity: true }),
        fc.integer({ min: 0, max: 17 }),
        fc.constantFrom("fixed", "exp", "plain"),
        (x, digits, form) => {
          const text = form === "fixed"
            ? x.toFixed(Math.min(digits, 12))
            : form === "exp"
            ? x.toExponential(Math.min(digits, 16))
            : String(x);
          const cols = [new Float64Array(1), new Float64Array(1)];
          if (parseNumericLine(`1,${text}`, 44, false, cols, 0)) {
            expect(bits(cols[1]!)).toEqual(bits(Float64Array.of(Number(text))));
          }
        },
      ),
      { numRuns: 3000, seed: 4401 },
    );
  });
});

describe("the fast reader and the general reader give identical spectra", () => {
  for (const sub of ["good", "bad"]) {
    for (const entry of Deno.readDirSync(root + sub)) {
      it(`${sub}/${entry.name}`, () => {
        const bytes = Deno.readFileSync(root + sub + "/" + entry.name);
        const general = outcome(bytes, entry.name, "general");
        expectSame(outcome(bytes, entry.name, "auto"), general);
        checkStreamed(bytes, entry.name, general);
        expectSame(outcome(bytes, entry.name, "text"), general);
      });
    }
  }

  it("on generated messy tables (delimiters, decimal commas, padding, footers, bad cells)", () => {
    const cell = fc.oneof(
      {
        weight: 60,
        arbitrary: fc.double({ min: 0, max: 1, noNaN: true }).map((v) => v.toFixed(5)),
      },
      { weight: 20, arbitrary: fc.double({ min: 0, max: 1, noNaN: true }).map(String) },
      {
        weight: 10,
        arbitrary: fc.constantFrom(
          "-0",
          "+0.5",
          ".5",
          "0.",
          "1e-3",
          "2.5E-1",
          "0.123456789012345678",
          " 0.25 ",
          "\u00a00.5",
          "0.5\u00a0",
        ),
      },
      {
        weight: 1,
        arbitrary: fc.constantFrom(
          "1e309",
          "-1e309",
          "",
          "abc",
          "NaN",
          '"0.5"',
          "1,5",
          "0.1.2",
          "-50",
        ),
      },
    );
    const table = fc.record({
      delimiter: fc.constantFrom(",", ";", "\t", " ", "  "),
      decimalComma: fc.boolean(),
      trailing: fc.boolean(),
      crlf: fc.boolean(),
      columns: fc.integer({ min: 1, max: 4 }),
      rows: fc.array(fc.array(cell, { minLength: 4, maxLength: 4 }), {
        minLength: 5,
        maxLength: 30,
      }),
      header: fc.constantFrom(
        "",
        "wavelength_nm{d}T{d}T{d}T{d}T",
        "nm{d}a T{d}b T{d}c T{d}d T",
        "x{d}A{d}abs{d}A{d}A",
        "x{d}T",
      ),
      preamble: fc.constantFrom("", "Thickness (mm):\t1,5\n", "# Sample: s1\n# note\n"),
      footer: fc.constantFrom("", "\nEnd of data\nChecksum: 1f", "\n1;2;3"),
    });
    let read = 0, failed = 0;
    fc.assert(
      fc.property(table, (t) => {
        const d = t.delimiter;
        const lines: string[] = [];
        if (t.header) {
          lines.push(t.header.split("{d}").slice(0, t.columns + 1).join(d.trim() ? d : "  "));
        }
        t.rows.forEach((r, i) => {
          const x = String(400 + 5 * i);
          let cells = [x, ...r.slice(0, t.columns)];
          if (t.decimalComma && d !== ",") cells = cells.map((c) => c.replace(".", ","));
          lines.push(cells.join(d) + (t.trailing && d.trim() ? d : ""));
        });
        const text = t.preamble + lines.join(t.crlf ? "\r\n" : "\n") + t.footer;
        const bytes = new TextEncoder().encode(text);
        const fast = outcome(bytes, "gen.csv", "auto");
        const general = outcome(bytes, "gen.csv", "general");
        expectSame(fast, general);
        expectSame(outcome(bytes, "gen.csv", "text"), general);
        checkStreamed(bytes, "gen.csv", general);
        if (fast.spectra) read++;
        else failed++;
      }),
      { numRuns: 600, seed: 13013 },
    );
    // both kinds of outcome must be well represented, or the comparison proves little
    console.log(`generated tables: ${read} read, ${failed} refused`);
    expect(read).toBeGreaterThan(100);
    expect(failed).toBeGreaterThan(100);
    // the stretch route must have read most of what reads (the rest: refused or declined)
    console.log(`a stretch at a time: ${JSON.stringify(streamed)}`);
    expect(streamed.read).toBeGreaterThan(100);
  });
});

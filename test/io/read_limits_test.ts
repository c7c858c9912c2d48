import { describe, it } from "node:test";
import { expect } from "expect";
import {
  DEFAULT_READ_LIMITS,
  InputError,
  type InputProblem,
  readInputBytes,
  readSpectraFromBytes,
  readSpectrumFile,
} from "../../lib/io/mod.ts";

const bytes = (text: string) => new TextEncoder().encode(text);

/** The InputError a read raises (the test fails when it raises anything else or nothing). */
function errorOf(read: () => unknown): InputError {
  try {
    read();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error("expected an InputError");
}

async function asyncErrorOf(read: () => Promise<unknown>): Promise<InputError> {
  const e = await read().then(() => undefined, (e) => e);
  if (e instanceof InputError) return e;
  throw new Error(`expected an InputError, got ${e}`);
}

function expectProblem(e: InputError, problem: InputProblem, line?: number) {
  expect(e.problem).toBe(problem);
  if (line !== undefined) expect(e.line).toBe(line);
}

/** A plain export of `rows` points and `columns` T columns (invented values). */
function table(rows: number, columns = 1): string {
  const out = ["nm," + Array.from({ length: columns }, (_, k) => `s${k} T`).join(",")];
  for (let i = 0; i < rows; i++) {
    out.push(`${300 + i * 0.01},` + new Array(columns).fill("0.5").join(","));
  }
  return out.join("\n");
}

describe("only regular files are read, and no further than the size cap", () => {
  it("a device is refused without being read", async () => {
    expectProblem(await asyncErrorOf(() => readSpectrumFile("/dev/zero")), "not-a-file");
  });
  it("a folder is refused", async () => {
    const dir = Deno.makeTempDirSync();
    try {
      expectProblem(await asyncErrorOf(() => readSpectrumFile(dir)), "not-a-file");
    } finally {
      Deno.removeSync(dir, { recursive: true });
    }
  });
  it("a FIFO is refused without blocking", async (t) => {
    const dir = Deno.makeTempDirSync();
    try {
      const made = await new Deno.Command("mkfifo", { args: [`${dir}/pipe.csv`] }).output()
        .catch(() => undefined);
      if (!made?.success) return t.skip("mkfifo is not available");
      expectProblem(await asyncErrorOf(() => readSpectrumFile(`${dir}/pipe.csv`)), "not-a-file");
    } finally {
      Deno.removeSync(dir, { recursive: true });
    }
  });
  it("a file over the cap is refused (cap settable; default 64 MB)", async () => {
    expect(DEFAULT_READ_LIMITS.maxBytes).toBe(64 * 1024 * 1024);
    const dir = Deno.makeTempDirSync();
    try {
      Deno.writeTextFileSync(`${dir}/a.csv`, table(100));
      const e = await asyncErrorOf(() =>
        readSpectrumFile(`${dir}/a.csv`, { limits: { maxBytes: 1000 } })
      );
      expectProblem(e, "too-large");
      expect(e.file).toBe(`${dir}/a.csv`);
      expect((await readInputBytes(`${dir}/a.csv`)).length).toBe(table(100).length);
      expectProblem(
        errorOf(() =>
          readSpectraFromBytes(bytes(table(100)), "a.csv", { limits: { maxBytes: 10 } })
        ),
        "too-large",
      );
    } finally {
      Deno.removeSync(dir, { recursive: true });
    }
  });
});

describe("points, columns and values caps per file", () => {
  it("too many rows: refused at the first row past the cap", () => {
    const e = errorOf(() =>
      readSpectraFromBytes(bytes(table(100)), "rows.csv", { limits: { maxPoints: 50 } })
    );
    expectProblem(e, "too-large", 52); // header on line 1, row 51 on line 52
  });
  it("too many columns: refused on the first data line", () => {
    const e = errorOf(() =>
      readSpectraFromBytes(bytes(table(10, 30)), "wide.csv", { limits: { maxColumns: 10 } })
    );
    expectProblem(e, "too-large", 2);
  });
  it("too many values in all (points × columns)", () => {
    const e = errorOf(() =>
      readSpectraFromBytes(bytes(table(100, 10)), "many.csv", { limits: { maxValues: 500 } })
    );
    expectProblem(e, "too-large");
  });
  it("200,000 points read without a stack overflow (no spreads over the data)", () => {
    const [s] = readSpectraFromBytes(bytes(table(200_000)), "long.csv");
    expect(s!.wavelengthNm.length).toBe(200_000);
  });
});

describe("JCAMP-DX repeat counts are checked before expanding", () => {
  const jcamp = (npoints: string, data: string) =>
    `##TITLE=dup\n##JCAMP-DX=4.24\n##XUNITS=NANOMETERS\n##YUNITS=TRANSMITTANCE\n##FIRSTX=400\n##LASTX=409\n##DELTAX=1\n${npoints}##XYDATA=(X++(Y..Y))\n${data}\n##END=\n`;
  it("a 300-byte file with a huge DUP count is refused at once", () => {
    const text = jcamp("##NPOINTS=10\n", "400 5S99999999999");
    expect(text.length).toBeLessThan(300);
    const before = Deno.memoryUsage().rss;
    expectProblem(errorOf(() => readSpectraFromBytes(bytes(text), "dup.jdx")), "too-large", 10);
    expect(Deno.memoryUsage().rss - before).toBeLessThan(50e6);
  });
  it("without NPOINTS the hard cap applies", () => {
    const text = jcamp("", "400 5S99999999999");
    expectProblem(errorOf(() => readSpectraFromBytes(bytes(text), "dup.jdx")), "too-large", 9);
  });
  it("more points than NPOINTS says is malformed, before the excess is read", () => {
    const text = jcamp("##NPOINTS=5\n", "400 5 5 5 5 5\n405 5 5 5 5 5");
    expectProblem(errorOf(() => readSpectraFromBytes(bytes(text), "n.jdx")), "malformed", 11);
  });
  it("a factor that overflows the values is non-finite", () => {
    const text = jcamp("##NPOINTS=10\n##YFACTOR=1e308\n", "400 5 5 5 5 5 5 5 5 5 5");
    expectProblem(errorOf(() => readSpectraFromBytes(bytes(text), "f.jdx")), "non-finite", 11);
  });
});

describe("totality of numbers: non-finite and impossible values are refused with their line", () => {
  const base = (cell: string, header = "nm,T") =>
    [header, "400,0.5", "410,0.5", `420,${cell}`, "430,0.5", "440,0.5", "450,0.5"].join("\n");
  for (const cell of ["1e309", "-1e309", "Infinity", "NaN", "1e99999"]) {
    it(`${cell} in a cell`, () => {
      const e = errorOf(() => readSpectraFromBytes(bytes(base(cell, "nm,A")), "inf.csv"));
      expectProblem(e, "non-finite", 4);
      expect(e.message).toMatch(/inf\.csv:4: /);
    });
  }
  it("1e309 on the x axis", () => {
    const text = ["nm,A", "400,0.5", "410,0.5", "1e309,0.5", "430,0.5", "440,0.5"].join("\n");
    expectProblem(errorOf(() => readSpectraFromBytes(bytes(text), "x.csv")), "non-finite", 4);
  });
  it("absorbance −50 is impossible (T would be 10⁵⁰)", () => {
    const e = errorOf(() => readSpectraFromBytes(bytes(base("-50", "nm,A")), "neg.csv"));
    expectProblem(e, "out-of-range", 4);
  });
  it("absorbance slightly below zero (baseline noise) is kept as it is", () => {
    const [s] = readSpectraFromBytes(bytes(base("-0.02", "nm,A")), "noise.csv");
    expect(s!.values[2]).toBe(-0.02);
  });
  it("α strongly negative is impossible: A = α·d / ln 10 below −0.3 over the slab", () => {
    const text = (alpha: string) =>
      ["Thickness: 2 mm", "nm,alpha (cm-1)", "400,1", "410,1", `420,${alpha}`, "430,1", "440,1"]
        .join("\n");
    // closed form: −0.3 · ln 10 / 0.2 cm = −3.45 cm⁻¹
    expectProblem(
      errorOf(() => readSpectraFromBytes(bytes(text("-3.5")), "a.csv")),
      "out-of-range",
      5,
    );
    expect(readSpectraFromBytes(bytes(text("-3.4")), "a.csv")[0]!.values[2]).toBe(-3.4);
  });
  it("T = 1.5 is impossible beyond noise", () => {
    const e = errorOf(() => readSpectraFromBytes(bytes(base("1.5")), "t.csv"));
    expectProblem(e, "out-of-range", 4);
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { readSpectraFromBytes } from "../../lib/io/read_spectra.ts";

const bytes = (text: string) => new TextEncoder().encode(text);
const rows = "400,1\n401,1.1\n402,1.2\n403,1.3\n404,1.4\n405,1.5\n";

describe("sample names of single-column exports (design notes: a single data column's sample is the file stem)", () => {
  it("a generic header such as alpha_cm-1 or absorbance_au gives the file stem", () => {
    for (const header of ["alpha_cm-1", "absorbance_au", "Abs (a.u.)"]) {
      const [s] = readSpectraFromBytes(
        bytes(`wavelength_nm,${header}\n${rows}`),
        "slabs/TCW-07.csv",
      );
      expect(s!.meta.sample).toBe("TCW-07");
    }
  });
  it("a header that names a sample keeps that name", () => {
    const [s] = readSpectraFromBytes(bytes(`wavelength_nm,ruby-01 absorbance\n${rows}`), "x.csv");
    expect(s!.meta.sample).toBe("ruby-01");
  });
});

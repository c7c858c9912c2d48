import { describe, it } from "node:test";
import { expect } from "expect";
import { readResponseHeader } from "../../lib/dopant/response_header.ts";
import { spectrumMetric } from "../../lib/dopant/response_metric.ts";

describe("response column headers of a standards table", () => {
  it("names the metric, its position and unit in the usual spellings", () => {
    expect(readResponseHeader("band height (cm-1) @ 555 nm")).toEqual({
      metric: "band-height",
      options: { bandNm: 555 },
      unit: "cm-1",
      alphaBase: "e",
    });
    expect(readResponseHeader("alpha at 555 nm (cm-1)")).toMatchObject({
      metric: "alpha-at",
      options: { atNm: 555 },
    });
    expect(readResponseHeader("Band area [cm-2] near 18000 cm-1").options.bandNm).toBeCloseTo(
      555.5556,
      3,
    );
    // λ = hc / E with hc = 1239.84198 eV·nm (CODATA 2018): 2.0 eV is 619.92 nm
    expect(readResponseHeader("band height @ 2.0 eV").options.bandNm).toBeCloseTo(619.921, 3);
    expect(readResponseHeader("alpha10 at 400 nm (cm-1, decadic)").alphaBase).toBe("10");
    expect(readResponseHeader("response").metric).toBeUndefined();
  });

  it("a calibration of an unnamed response refuses spectra and says what it needs", () => {
    expect(() => spectrumMetric("response")).toThrow(/band-area, band-height, alpha-at/);
    expect(spectrumMetric("band-height")).toBe("band-height");
  });
});

describe("standards table with a named response column", () => {
  it("reads the rows and the metric the header names", async () => {
    const { parseStandardsTable } = await import("../../lib/dopant/standards.ts");
    const t = parseStandardsTable(
      "sample,Cr2O3 (wt%),band height (cm-1) @ 555 nm,response_sigma\nS1,0.1,1.2,0.05\nS2,0.2,2.5,0.05\n",
      "std.csv",
    );
    expect(t.rows.map((r) => [r.concentration, r.response, r.responseSigma, r.unit])).toEqual([
      [0.1, 1.2, 0.05, "wt%"],
      [0.2, 2.5, 0.05, "wt%"],
    ]);
    expect(t.response).toMatchObject({ metric: "band-height", options: { bandNm: 555 } });
  });
});

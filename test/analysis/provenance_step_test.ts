import { describe, it } from "node:test";
import { expect } from "expect";
import { analyseSample, type SampleSettings } from "../../lib/analysis/mod.ts";
import { readSpectraFromBytes } from "../../lib/io/read_spectra.ts";
import { reconcile } from "../../lib/analysis/provenance_step.ts";

/** An invented export: a comment preamble stating thickness, polarisation and host. */
function exportWith(preamble: string): Uint8Array {
  const rows = [preamble, "wavelength_nm,T"];
  for (let nm = 360; nm <= 830; nm += 5) rows.push(`${nm},${nm > 600 ? 0.7 : 0.35}`);
  return new TextEncoder().encode(rows.join("\n") + "\n");
}

const base: SampleSettings = {
  read: {},
  reflection: { reflection: "none" },
  illuminants: ["D65"],
  observers: ["2"],
  change: { from: "D65", to: "A", observer: "2", adapt: "none" },
  series: { fromMm: 1, toMm: 10, steps: 4 },
  changeHueThresholdDeg: 20,
  changeMinChroma: 5,
  extra: {},
};

describe("provenance of input values (option > sheet > file > settings > default)", () => {
  it("the file's thickness is used and said to come from the file", () => {
    const [s] = readSpectraFromBytes(exportWith("# Thickness: 1,5 mm\n# Polarisation: e"), "a.csv");
    const r = analyseSample(s!, "a.csv", { ...base, fallbackThicknessMm: 2 });
    expect(r.thicknessMm).toBe(1.5);
    expect(r.provenance.thicknessMm).toEqual({ value: 1.5, source: "file" });
    expect(r.provenance.polarisation).toEqual({ value: "e", source: "file" });
    // the settings' fallback disagrees: said, not silently dropped
    expect(r.warnings.join("\n")).toMatch(
      /thickness: the file says 1.5 mm, the settings says 2 mm/,
    );
  });

  it("a sheet thickness that contradicts the file wins, with a warning naming both", () => {
    const [s] = readSpectraFromBytes(exportWith("Thickness (mm);3,23"), "b.csv");
    const r = analyseSample(s!, "b.csv", { ...base, sheet: { thicknessMm: 1 } });
    expect(r.provenance.thicknessMm).toEqual({ value: 1, source: "sheet" });
    expect(r.warnings.join("\n")).toMatch(/the sheet says 1 mm, the file says 3.23 mm/);
  });

  it("values that agree to rounding are not a conflict; the path defaults to the thickness", () => {
    const [s] = readSpectraFromBytes(exportWith("Thickness [mm]\t2.00"), "c.csv");
    const r = analyseSample(s!, "c.csv", { ...base, sheet: { thicknessMm: 2.001 } });
    expect(r.warnings.filter((w) => /thickness/.test(w))).toEqual([]);
    expect(r.provenance.pathMm.source).toBe("default");
  });

  it("reconcile() orders by precedence whatever the order given", () => {
    const warnings: string[] = [];
    const v = reconcile<number>("path", [["settings", 5], ["sheet", 6]], String, warnings);
    expect(v).toEqual({ value: 6, source: "sheet" });
    expect(warnings.length).toBe(1);
  });
});

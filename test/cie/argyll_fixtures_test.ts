import { describe, it } from "node:test";
import { expect } from "expect";
import { readSpectrumFile } from "../../lib/io/mod.ts";
import { spectrumColor } from "../../lib/cie/mod.ts";

// Reference XYZ from Argyll CMS spec2cie; see test/fixtures/colour/PROVENANCE.md.
const here = new URL("../fixtures/colour/", import.meta.url);
const reference = JSON.parse(Deno.readTextFileSync(new URL("argyll_reference.json", here))) as {
  fixtures: Record<string, Record<string, number[]>>;
};

describe("XYZ of fixture spectra against Argyll CMS spec2cie", () => {
  const names = Object.keys(reference.fixtures);
  it("has at least 20 fixtures covering 1, 2, 5, 10, 20 nm and irregular grids", () => {
    expect(names.length).toBeGreaterThanOrEqual(20);
    for (const tag of ["_1nm", "_2nm", "_5nm", "_10nm", "_20nm", "pixels_", "sparse_"]) {
      expect(names.some((n) => n.includes(tag))).toBe(true);
    }
  });
  for (const name of names) {
    // 20 nm sampling of a band carries an inherent error of a few hundredths (ASTM E308 §7.4)
    const tolerance = name.includes("_20nm") ? 0.03 : 0.02;
    it(`${name}: D65 and A, 2° and 10°, within ${tolerance}`, async () => {
      const [spectrum] = await readSpectrumFile(
        decodeURIComponent(new URL(`${name}.csv`, here).pathname),
      );
      const rows = spectrumColor(spectrum!, { illuminants: ["D65", "A"], observers: ["2", "10"] });
      expect(rows.length).toBe(4);
      for (const row of rows) {
        const [X, Y, Z] = reference.fixtures[name]![`${row.illuminant}/${row.observer}`]!;
        expect(Math.abs(row.X - X!)).toBeLessThanOrEqual(tolerance);
        expect(Math.abs(row.Y - Y!)).toBeLessThanOrEqual(tolerance);
        expect(Math.abs(row.Z - Z!)).toBeLessThanOrEqual(tolerance);
      }
    });
  }
});

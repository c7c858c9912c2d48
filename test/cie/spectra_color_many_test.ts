import { describe, it } from "node:test";
import { expect } from "expect";
import {
  conditionsOf,
  spectraColorRows,
  spectraToXyz,
  spectrumColor,
  tristimulusWeights,
} from "../../lib/cie/mod.ts";
import type { Spectrum } from "../../lib/spectrum/mod.ts";
import { seededNormal } from "../_random.ts";

// Messy realistic spectra: absorption bands, a UV edge, noise growing as T falls, saturated
// (clipped) tops and one black slab.
function messySpectra(nm: Float64Array, count: number, seed: number): Float64Array[] {
  const noise = seededNormal(seed);
  const out: Float64Array[] = [];
  for (let k = 0; k < count; k++) {
    const centre = 420 + ((k * 37) % 300), depth = 0.2 + (k % 7) * 0.4;
    out.push(nm.map((x) => {
      const a = depth * Math.exp(-0.5 * ((1e7 / x - 1e7 / centre) / 1500) ** 2) +
        2 / (1 + Math.exp((x - 390 - (k % 5) * 10) / 6));
      const t = 10 ** -a;
      return Math.min(1, Math.max(0, t + 0.002 * noise() / Math.sqrt(t + 0.01)));
    }));
  }
  out.push(new Float64Array(nm.length)); // black
  return out;
}

const asSpectrum = (nm: Float64Array<ArrayBuffer>, v: Float64Array, i: number): Spectrum => ({
  wavelengthNm: nm,
  values: v as Float64Array<ArrayBuffer>,
  quantity: "transmittance",
  meta: { sample: `s${i + 1}`, sourceFile: "lot.csv" },
});

const GRIDS: [string, Float64Array<ArrayBuffer>][] = [
  ["1 nm 380–780 (Sprague)", Float64Array.from({ length: 401 }, (_, i) => 380 + i)],
  [
    "10 nm 400–700 (ASTM E2022 Lagrange)",
    Float64Array.from({ length: 31 }, (_, i) => 400 + 10 * i),
  ],
  [
    "irregular pixels (PCHIP)",
    Float64Array.from({ length: 700 }, (_, i) => 350.3 + 0.68 * i + 0.00002 * i * i),
  ],
];

describe("spectraColorRows() and spectraToXyz()", () => {
  const conditions = conditionsOf(["D65", "A"], ["2", "10"]);
  for (const [name, nm] of GRIDS) {
    it(`${name}: rows identical to spectrumColor one spectrum at a time, columns and flat alike`, () => {
      const cols = messySpectra(nm, 12, 7);
      const flat = new Float64Array(cols.length * nm.length);
      cols.forEach((c, i) => flat.set(c, i * nm.length));
      const labels = { samples: cols.map((_, i) => `s${i + 1}`), file: "lot.csv" };
      const fromColumns = spectraColorRows({ wavelengthNm: nm, values: cols }, conditions, labels);
      const fromFlat = spectraColorRows({ wavelengthNm: nm, values: flat }, conditions, labels);
      const oneByOne = cols.flatMap((v, i) =>
        spectrumColor(asSpectrum(nm, v, i), {
          illuminants: ["D65", "A"],
          observers: ["2", "10"],
          transmittance: v,
        })
      );
      expect(fromColumns).toEqual(oneByOne);
      expect(fromFlat).toEqual(oneByOne);
      // the black slab is below the luminance floor in every condition
      expect(fromFlat.slice(-4).every((r) => r.x === null && r.notes !== undefined)).toBe(true);
    });
  }

  it("identity: perfect transmitters give each condition's white (CIE 15:2018 §7, Y = 100)", () => {
    const nm = GRIDS[0]![1];
    const r = spectraToXyz(
      { wavelengthNm: nm, values: new Float64Array(3 * nm.length).fill(1) },
      conditions,
    );
    expect(r.count).toBe(3);
    for (let s = 0; s < 3; s++) {
      conditions.forEach((c, k) => {
        const w = tristimulusWeights(nm, c.illuminant, c.observer).white;
        const o = 3 * (s * conditions.length + k);
        expect(r.xyz[o]).toBeCloseTo(w.X, 12);
        expect(r.xyz[o + 1]).toBeCloseTo(100, 12);
        expect(r.xyz[o + 2]).toBeCloseTo(w.Z, 12);
      });
    }
  });

  it("refuses a flat array that is not whole spectra and a column of the wrong length", () => {
    const nm = GRIDS[1]![1];
    expect(() =>
      spectraToXyz({ wavelengthNm: nm, values: new Float64Array(nm.length + 1) }, conditions)
    )
      .toThrow(RangeError);
    expect(() => spectraToXyz({ wavelengthNm: nm, values: [new Float64Array(5)] }, conditions))
      .toThrow(RangeError);
  });
});

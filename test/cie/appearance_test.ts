import { describe, it } from "node:test";
import { expect } from "expect";
import {
  adaptXyz,
  colorChange,
  deltaE2000,
  dominantWavelength,
  GRID_NM,
  hueDifferenceDeg,
  metamerismIndex,
  spectralLocus,
  spectrumColor,
  swatchFromXyz,
  thicknessSeries,
  xyzToLab,
} from "../../lib/cie/mod.ts";
import { readSpectrumFile } from "../../lib/io/mod.ts";
import type { Spectrum } from "../../lib/spectrum/mod.ts";

const here = new URL("../fixtures/colour/", import.meta.url);
const argyll = JSON.parse(Deno.readTextFileSync(new URL("argyll_reference.json", here))) as {
  whites: Record<string, number[]>;
  fixtures: Record<string, Record<string, number[]>>;
};
const fixture = async (name: string) =>
  (await readSpectrumFile(decodeURIComponent(new URL(`${name}.csv`, here).pathname)))[0]!;
const xyz = (v: number[]) => ({ X: v[0]!, Y: v[1]!, Z: v[2]! });

describe("colour change between illuminants", () => {
  it("identity: a flat (neutral) spectrum changes by ΔE00 ≈ 0 under each illuminant's own white", () => {
    const flat = new Float64Array(471).fill(0.4);
    for (const [from, to] of [["D65", "A"], ["D65", "F11"], ["C", "D50"]]) {
      const c = colorChange(GRID_NM, flat, from!, to!, "10");
      expect(c.dE00).toBeLessThan(1e-9);
    }
  });

  for (const name of ["colour_change_5nm", "cr_corundum_1nm", "green_beryl_2nm", "ti_blue_2nm"]) {
    it(`${name}: ΔE00 D65→A equals ΔE00 from Argyll spec2cie's Lab, within 0.02`, async () => {
      const s = await fixture(name);
      for (const obs of ["2", "10"]) {
        const c = colorChange(s.wavelengthNm, s.values, "D65", "A", obs);
        const ref = argyll.fixtures[name]!;
        const lab1 = xyzToLab(xyz(ref[`D65/${obs}`]!), xyz(argyll.whites[`D65/${obs}`]!));
        const lab2 = xyzToLab(xyz(ref[`A/${obs}`]!), xyz(argyll.whites[`A/${obs}`]!));
        expect(Math.abs(c.dE00 - deltaE2000(lab1, lab2))).toBeLessThan(0.02);
      }
    });
  }

  it("dh is signed and wraps across 0°/360°", () => {
    expect(hueDifferenceDeg(350, 10)).toBe(20);
    expect(hueDifferenceDeg(10, 350)).toBe(-20);
    expect(hueDifferenceDeg(100, 290)).toBe(-170);
  });

  it("adaptation maps the source white onto the destination white (Bradford and CAT16)", () => {
    const a = { X: 109.85, Y: 100, Z: 35.585 }, d65 = { X: 95.047, Y: 100, Z: 108.883 };
    for (const m of ["bradford", "cat16"] as const) {
      const w = adaptXyz(a, a, d65, m);
      expect(w.X).toBeCloseTo(95.047, 9);
      expect(w.Z).toBeCloseTo(108.883, 9);
      const back = adaptXyz(adaptXyz({ X: 30, Y: 20, Z: 10 }, a, d65, m), d65, a, m);
      expect(back.X).toBeCloseTo(30, 9);
    }
  });

  it("Bradford reproduces the published example of the colour-science library (chromatic_adaptation_VonKries docs)", () => {
    // XYZ [0.20654008, 0.12197225, 0.05136952] from white [0.95045593, 1, 1.08905775] to
    // [0.96429568, 1, 0.82510460] with Bradford → [0.2166600, 0.1260477, 0.0385506]
    const s = (v: number[]) => ({ X: 100 * v[0]!, Y: 100 * v[1]!, Z: 100 * v[2]! });
    const a = adaptXyz(
      s([0.20654008, 0.12197225, 0.05136952]),
      s([0.95045593, 1, 1.08905775]),
      s([0.96429568, 1, 0.8251046]),
      "bradford",
    );
    expect(a.X / 100).toBeCloseTo(0.21666, 5);
    expect(a.Y / 100).toBeCloseTo(0.1260477, 6);
    expect(a.Z / 100).toBeCloseTo(0.0385506, 6);
    // CAT16 (Li et al. 2017) is a different cone space but must land close by
    const c = adaptXyz(
      s([0.20654008, 0.12197225, 0.05136952]),
      s([0.95045593, 1, 1.08905775]),
      s([0.96429568, 1, 0.8251046]),
      "cat16",
    );
    expect(Math.abs(c.X - a.X)).toBeLessThan(0.5);
    expect(Math.abs(c.Z - a.Z)).toBeLessThan(0.5);
  });

  it("with --adapt the neutral stays neutral against the first white", () => {
    const c = colorChange(GRID_NM, new Float64Array(471).fill(0.5), "D65", "A", "2", "cat16");
    expect(c.dE00).toBeLessThan(1e-6);
  });
});

describe("metamerism index (CIE 15 §9.2.2)", () => {
  it("identity: 0 for a specimen against itself and, after the multiplicative correction, against a uniformly scaled copy", async () => {
    const s = await fixture("colour_change_5nm");
    expect(metamerismIndex(s.wavelengthNm, s.values, s.values).index00).toBe(0);
    const scaled = s.values.map((v) => 0.8 * v);
    expect(metamerismIndex(s.wavelengthNm, s.values, scaled).index00).toBeLessThan(1e-9);
    // a different absorption in the red is not a uniform scale: the index stays above zero
    const redder = s.values.map((v, i) =>
      v * Math.exp(-0.8 * Math.exp(-0.5 * ((s.wavelengthNm[i]! - 640) / 25) ** 2))
    );
    const other = metamerismIndex(s.wavelengthNm, s.values, redder);
    expect(other.mismatchReference).toBeGreaterThan(0.5);
    expect(other.index00).toBeGreaterThan(0.1);
  });
});

describe("dominant wavelength and purity (CIE 15 §9.1)", () => {
  const white = { x: 0.31272, y: 0.32903 };
  it("by construction: halfway between the D65 white and the 580 nm locus point gives 580 nm, pe 0.5", () => {
    const locus = spectralLocus("2");
    const k = locus.nm.indexOf(580);
    expect(locus.x[k]).toBeCloseTo(0.51249, 5);
    expect(locus.y[k]).toBeCloseTo(0.48659, 5);
    const d = dominantWavelength(
      (white.x + 0.51249) / 2,
      (white.y + 0.48659) / 2,
      white.x,
      white.y,
      "2",
    )!;
    expect(d.wavelengthNm).toBeCloseTo(580, 1);
    expect(d.purity).toBeCloseTo(0.5, 4);
    expect(d.complementary).toBe(false);
  });
  it("purity 1 on the locus, undefined at the white; purples get a complementary wavelength", () => {
    const locus = spectralLocus("2");
    const k = locus.nm.indexOf(520);
    expect(dominantWavelength(locus.x[k]!, locus.y[k]!, white.x, white.y)!.purity).toBeCloseTo(
      1,
      6,
    );
    expect(dominantWavelength(white.x, white.y, white.x, white.y)).toBeUndefined();
    const purple = dominantWavelength(0.35, 0.2, white.x, white.y)!;
    expect(purple.complementary).toBe(true);
    expect(purple.wavelengthNm).toBeGreaterThan(490);
    expect(purple.wavelengthNm).toBeLessThan(570);
  });
});

describe("swatches and gamut", () => {
  it("a saturated red absorption fixture is flagged out of sRGB and the mapped value is inside", async () => {
    const s = await fixture("red_edge_1nm");
    const [row] = spectrumColor(s, { illuminants: ["D65"], observers: ["2"] });
    expect(row!.srgbOutOfGamut).toBe(true);
    const sw = swatchFromXyz(row!, { X: row!.whiteX, Y: row!.whiteY, Z: row!.whiteZ });
    expect(sw.srgb.unmapped.some((v) => v < 0 || v > 1)).toBe(true);
    for (const v of sw.srgb.rgb) {
      expect(v).toBeGreaterThanOrEqual(0);
      expect(v).toBeLessThanOrEqual(1);
    }
    expect(row!.srgb).toMatch(/^#[0-9a-f]{6}$/);
  });
  it("a grey is not flagged and shows as a grey (sRGB of D65 white is #ffffff)", async () => {
    const s = await fixture("neutral_grey_5nm");
    const [row] = spectrumColor(s, { illuminants: ["D65"], observers: ["2"] });
    expect(row!.srgbOutOfGamut).toBe(false);
    const [r, g, b] = [1, 3, 5].map((i) => parseInt(row!.srgb.slice(i, i + 2), 16));
    expect(Math.max(r!, g!, b!) - Math.min(r!, g!, b!)).toBeLessThanOrEqual(1);
    expect(
      swatchFromXyz({ X: 95.047, Y: 100, Z: 108.883 }, { X: 95.047, Y: 100, Z: 108.883 }).srgb.css,
    ).toBe("#ffffff");
  });
  it("closed form: sRGB primaries from IEC 61966-2-1 — XYZ of pure red (0.4124, 0.2126, 0.0193) gives #ff0000", () => {
    const d65 = { X: 95.047, Y: 100, Z: 108.883 };
    expect(swatchFromXyz({ X: 41.24, Y: 21.26, Z: 1.93 }, d65).srgb.css).toBe("#ff0000");
  });
});

describe("pleochroism of a synthetic uniaxial pair", () => {
  const band = (centreNm: number) =>
    GRID_NM.map((nm) => 10 ** -(1.2 * Math.exp(-0.5 * ((1e7 / nm - 1e7 / centreNm) / 1200) ** 2)));
  const spectrum = (values: Float64Array<ArrayBuffer>, polarisation: "o" | "e"): Spectrum => ({
    wavelengthNm: GRID_NM,
    values,
    quantity: "transmittance",
    polarisation,
    meta: { sample: polarisation },
  });
  it("o and e bands 20 nm apart differ clearly; equal bands do not", () => {
    const lab = (s: Spectrum) => {
      const [r] = spectrumColor(s, { illuminants: ["D65"], observers: ["10"] });
      return { L: r!.L, a: r!.a, b: r!.b };
    };
    const o = spectrum(band(555), "o"), e = spectrum(band(575), "e");
    expect(deltaE2000(lab(o), lab(e))).toBeGreaterThan(3);
    expect(deltaE2000(lab(o), lab(spectrum(band(555), "e")))).toBe(0);
  });
});

describe("thickness series", () => {
  it("lightness falls with path, chroma peaks inside the range, target L is met", async () => {
    const s = { ...(await fixture("cr_corundum_1nm")), thicknessMm: 2 };
    const series = thicknessSeries(s, { fromMm: 0.5, toMm: 20, steps: 40, targetL: 50 });
    for (let i = 1; i < series.points.length; i++) {
      expect(series.points[i]!.L).toBeLessThan(series.points[i - 1]!.L);
    }
    expect(series.maxChromaPathMm).toBeGreaterThan(0.5);
    expect(series.maxChromaPathMm).toBeLessThan(20);
    expect(series.maxChroma).toBeGreaterThanOrEqual(
      Math.max(...series.points.map((p) => p.C)) - 1e-9,
    );
    const check = thicknessSeries(s, {
      fromMm: series.targetLightnessPathMm!,
      toMm: series.targetLightnessPathMm! + 1,
      steps: 1,
    });
    expect(check.points[0]!.L).toBeCloseTo(50, 6);
  });
});

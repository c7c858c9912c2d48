import { describe, it } from "node:test";
import { expect } from "expect";
import fc from "fast-check";
import {
  BELOW_FLOOR_NOTE,
  DISPLAY_WHITE,
  dominantWavelength,
  GRID_NM,
  invert,
  LUMINANCE_FLOOR_Y,
  rgbToXyzMatrix,
  spectralLocus,
  spectrumColor,
  swatchFromXyz,
  tristimulusWeights,
  XYZ_TO_P3,
  XYZ_TO_SRGB,
  xyzToXy,
} from "../../lib/cie/mod.ts";
import type { Spectrum } from "../../lib/spectrum/mod.ts";

const spectrum = (nm: Float64Array<ArrayBuffer>, values: Float64Array<ArrayBuffer>): Spectrum => ({
  wavelengthNm: nm,
  values,
  quantity: "transmittance",
  meta: { sample: "edge" },
});
const grid5 = Float64Array.from({ length: 81 }, (_, i) => 380 + 5 * i);
const flat = (v: number) => spectrum(grid5, new Float64Array(grid5.length).fill(v));
const ALL = { illuminants: ["D65", "A", "F11"], observers: ["2", "10"] };

describe("luminance floor (Y < 0.01 on the Y = 100 scale)", () => {
  it("a black stone (T = 0): chromaticity, hue, dominant wavelength and purity null with a note; no gamut flags", () => {
    for (const row of spectrumColor(flat(0), ALL)) {
      expect([row.X, row.Y, row.Z]).toEqual([0, 0, 0]);
      expect([row.x, row.y, row.uPrime, row.vPrime, row.h]).toEqual([null, null, null, null, null]);
      expect(row.dominantNm).toBeNull();
      expect(row.purity).toBeNull();
      expect(row.complementary).toBe(false);
      expect(row.notes).toEqual([BELOW_FLOOR_NOTE]);
      expect(row.L).toBe(0);
      expect(row.srgbOutOfGamut).toBe(false);
      expect(row.p3OutOfGamut).toBe(false);
      expect(row.srgb).toBe("#000000");
    }
  });

  it("a very dark slab with a red window (Y ≈ 0.005) is below the floor; ten times brighter is not", () => {
    // a red-passing slab: T rises past 600 nm, scaled so Y lands either side of the floor
    const shape = grid5.map((nm) => 1 / (1 + Math.exp(-(nm - 620) / 8)));
    const y1 = spectrumColor(spectrum(grid5, shape), { illuminants: ["D65"] })[0]!.Y;
    const dark = spectrumColor(
      spectrum(grid5, shape.map((v) => (v * 0.5 * LUMINANCE_FLOOR_Y) / y1)),
      {
        illuminants: ["D65"],
      },
    )[0]!;
    expect(dark.Y).toBeCloseTo(0.005, 12);
    expect(dark.x).toBeNull();
    expect(dark.dominantNm).toBeNull();
    const dim = spectrumColor(
      spectrum(grid5, shape.map((v) => (v * 10 * LUMINANCE_FLOOR_Y) / y1)),
      {
        illuminants: ["D65"],
      },
    )[0]!;
    expect(dim.notes).toBeUndefined();
    expect(dim.x).toBeGreaterThan(0.6);
    expect(dim.dominantNm).toBeGreaterThan(600);
    expect(dim.purity).toBeLessThanOrEqual(1);
  });
});

describe("display spaces on the white of the D65 tables", () => {
  it("DISPLAY_WHITE is the D65 2° white of the tables the colours use (CIE 15:2018 Table 9: 95.04, 100, 108.88)", () => {
    const w = tristimulusWeights(GRID_NM, "D65", "2").white;
    expect(DISPLAY_WHITE).toEqual({ X: w.X, Y: w.Y, Z: w.Z });
    expect(Math.abs(DISPLAY_WHITE.X - 95.04)).toBeLessThan(0.02);
    expect(Math.abs(DISPLAY_WHITE.Z - 108.88)).toBeLessThan(0.02);
    // and its chromaticity is the IEC 61966-2-1 white (0.3127, 0.3290) to that precision
    const xy = xyzToXy(DISPLAY_WHITE);
    expect(Math.abs(xy.x - 0.3127)).toBeLessThan(5e-5);
    expect(Math.abs(xy.y - 0.329)).toBeLessThan(5e-5);
  });

  it("sRGB matches IEC 61966-2-1:1999: forward matrix within 2.5e-4, its 4-decimal inverse within 5e-4", () => {
    // The standard's forward matrix (0.4124 …) is rounded to 4 decimals and its row sums give
    // the white Z = 1.0890 where the tables give 1.0888; its XYZ → RGB matrix is the inverse of
    // that rounded forward matrix, so it deviates further from the exact inverse.
    const forward = [[0.4124, 0.3576, 0.1805], [0.2126, 0.7152, 0.0722], [0.0193, 0.1192, 0.9505]];
    const inverse = [[3.2406, -1.5372, -0.4986], [-0.9689, 1.8758, 0.0415], [
      0.0557,
      -0.204,
      1.057,
    ]];
    const ours = invert(XYZ_TO_SRGB);
    for (let r = 0; r < 3; r++) {
      for (let c = 0; c < 3; c++) {
        expect(Math.abs(ours[r]![c]! - forward[r]![c]!)).toBeLessThan(2.5e-4);
        expect(Math.abs(XYZ_TO_SRGB[r]![c]! - inverse[r]![c]!)).toBeLessThan(5e-4);
      }
    }
  });

  it("closed form: the P3 matrix has the SMPTE EG 432-1 primaries (0.680, 0.320), (0.265, 0.690), (0.150, 0.060)", () => {
    const toXyz = rgbToXyzMatrix(
      [[0.68, 0.32], [0.265, 0.69], [0.15, 0.06]],
      [xyzToXy(DISPLAY_WHITE).x, xyzToXy(DISPLAY_WHITE).y],
    );
    const primaries = [[0.68, 0.32], [0.265, 0.69], [0.15, 0.06]];
    for (let c = 0; c < 3; c++) {
      const col = [0, 1, 2].map((r) => toXyz[r]![c]!);
      const s = col[0]! + col[1]! + col[2]!;
      expect(col[0]! / s).toBeCloseTo(primaries[c]![0]!, 12);
      expect(col[1]! / s).toBeCloseTo(primaries[c]![1]!, 12);
    }
    // XYZ_TO_P3 inverts it: the white maps to (1, 1, 1)
    const w = [DISPLAY_WHITE.X / 100, DISPLAY_WHITE.Y / 100, DISPLAY_WHITE.Z / 100];
    for (const m of [XYZ_TO_P3, XYZ_TO_SRGB]) {
      for (let r = 0; r < 3; r++) {
        expect(m[r]![0]! * w[0]! + m[r]![1]! * w[1]! + m[r]![2]! * w[2]!).toBeCloseTo(1, 12);
      }
    }
  });

  it("a perfect transmitter is inside sRGB and P3 under every illuminant and observer and shows #ffffff (CIE 15:2018: it is the white)", () => {
    for (const row of spectrumColor(flat(1), ALL)) {
      expect(row.srgbOutOfGamut).toBe(false);
      expect(row.p3OutOfGamut).toBe(false);
      expect(row.srgb).toBe("#ffffff");
      expect(row.p3).toBe("color(display-p3 1.0000 1.0000 1.0000)");
      expect(row.notes).toBeUndefined();
    }
  });

  it("near-white (T between 0.9999 and 1, a clear stone read to four decimals) is inside both gamuts", () => {
    const values = grid5.map((nm) => 1 - 1e-4 * Math.round((1 + Math.sin(nm / 23)) / 2));
    for (const row of spectrumColor(spectrum(grid5, values), ALL)) {
      expect(row.srgbOutOfGamut).toBe(false);
      expect(row.p3OutOfGamut).toBe(false);
    }
  });

  it("a white given on the IEC figures (95.047, 100, 108.883) against itself is white and inside", () => {
    const iec = { X: 95.047, Y: 100, Z: 108.883 };
    const s = swatchFromXyz(iec, iec);
    expect(s.srgb.outOfGamut).toBe(false);
    expect(s.p3.outOfGamut).toBe(false);
    expect(s.srgb.css).toBe("#ffffff");
  });
});

describe("excitation purity never above 1 (CIE 15:2018 §9.1)", () => {
  it("property: random transmittance spectra (smooth, spiky, edge-only) give 0 ≤ purity ≤ 1 (fast-check, seeded)", () => {
    const nm = GRID_NM;
    const arbitrary = fc.oneof(
      // smooth: a sum of a few Gaussian absorption bands in wavelength
      fc.array(
        fc.tuple(
          fc.double({ min: 360, max: 830, noNaN: true }),
          fc.double({ min: 5, max: 120, noNaN: true }),
          fc.double({ min: 0, max: 6, noNaN: true }),
        ),
        { minLength: 1, maxLength: 4 },
      ).map((bands) =>
        nm.map((x) =>
          Math.exp(-bands.reduce((a, [c, w, d]) => a + d * Math.exp(-(((x - c) / w) ** 2)), 0))
        )
      ),
      // spikes: light only in a few narrow lines, including the folded ends of the locus
      fc.array(fc.integer({ min: 0, max: nm.length - 1 }), { minLength: 1, maxLength: 3 }).map(
        (idx) => {
          const v = new Float64Array(nm.length);
          for (const i of idx) v[i] = 1;
          return v;
        },
      ),
      // noisy: uniform random T
      fc.array(fc.double({ min: 0, max: 1, noNaN: true }), {
        minLength: nm.length,
        maxLength: nm.length,
      })
        .map((a) => Float64Array.from(a)),
    );
    fc.assert(
      fc.property(
        arbitrary,
        fc.constantFrom("D65", "A"),
        fc.constantFrom("2", "10"),
        (values, ill, obs) => {
          const [row] = spectrumColor(spectrum(nm, values), {
            illuminants: [ill],
            observers: [obs],
          });
          if (row!.purity !== null) {
            expect(row!.purity).toBeGreaterThanOrEqual(0);
            expect(row!.purity).toBeLessThanOrEqual(1);
          }
        },
      ),
      { seed: 20261202, numRuns: 400 },
    );
  });

  it("a chromaticity beyond the 380–700 nm locus (a 365 nm line) gets purity 1, not more", () => {
    const locus = spectralLocus("2");
    const k = locus.nm.indexOf(365);
    const white = xyzToXy(DISPLAY_WHITE);
    const d = dominantWavelength(locus.x[k]!, locus.y[k]!, white.x, white.y, "2");
    expect(d).toBeDefined();
    expect(d!.purity).toBeLessThanOrEqual(1);
  });
});

describe("swatch hex strings", () => {
  it("equal the `color` package's hex of the same 8-bit values on 3,000 seeded colours, mapped or not", async () => {
    const { default: Color } = await import("color");
    let seed = 42;
    const rnd = () => {
      seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
      return seed / 4294967296;
    };
    const white = { X: 95.04, Y: 100, Z: 108.88 };
    for (let i = 0; i < 3000; i++) {
      const sw = swatchFromXyz({ X: 80 * rnd(), Y: 80 * rnd(), Z: 90 * rnd() }, white);
      const expected = Color.rgb(sw.srgb.rgb.map((v) => Math.round(v * 255))).hex().toLowerCase();
      expect(sw.srgb.css).toBe(expected);
    }
  });
});

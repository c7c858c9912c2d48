/**
 * Statistical checks of the band and edge analysis on seeded synthetic spectra (generators in
 * ./_synthetic.ts, closed forms named there): usable range, band count, accuracy and coverage
 * of the reported 1σ, convergence with the default baseline, Tauc gap and Urbach energy.
 */
import { describe, it } from "node:test";
import { expect } from "expect";
import { analyseBands, bandArea, fitBandsCm1 } from "../../lib/bands/mod.ts";
import type { Spectrum } from "../../lib/spectrum/spectrum.ts";
import { seededNormal } from "../_random.ts";
import {
  edgeAlpha,
  pairAndSeparated,
  seededUniform,
  syntheticExport,
  type TrueBand,
} from "./_synthetic.ts";

function absorbanceSpectrum(
  wavelengthNm: Float64Array<ArrayBuffer>,
  values: Float64Array<ArrayBuffer>,
  thicknessMm?: number,
): Spectrum {
  const s: Spectrum = {
    wavelengthNm,
    values,
    quantity: "absorbance",
    meta: { sample: "synthetic" },
  };
  if (thicknessMm !== undefined) s.thicknessMm = thicknessMm;
  return s;
}

const trueArea = (b: TrueBand) => bandArea(b.height, b.fwhmCm1, "gaussian");

describe("analyseBands() on absorbance exports with a saturating UV edge (σ_T 1e-3, pair 1.0–1.6 FWHM apart + a separated band)", () => {
  const N = 60;
  const runs = Array.from({ length: N }, (_, k) => {
    const seed = 1000 + k;
    const bands = pairAndSeparated(seed);
    const ex = syntheticExport(bands, seed);
    return { bands, ex, result: analyseBands(absorbanceSpectrum(ex.wavelengthNm, ex.absorbance)) };
  });

  it("the saturated UV is left out and reported, and no band is reported inside it", () => {
    for (const { ex, result } of runs) {
      // the noise-free absorbance passes 3 (T = 1e-3 = σ_T) below about 325 nm
      const saturatedTo = Math.max(...[...ex.wavelengthNm].filter((_, i) => ex.truth[i]! > 3));
      const uv = result.excluded.find((e) => e.fromNm === 300);
      expect(uv?.reason).toBe("photometric floor");
      expect(uv!.toNm).toBeGreaterThanOrEqual(saturatedTo);
      for (const b of result.bands) expect(b.centerNm).toBeGreaterThan(uv!.toNm);
    }
  });

  it("the right band count in ≥ 85 % of spectra; centres within 1 % and areas within 10 % on those", () => {
    const right = runs.filter((r) => r.result.bands.length === r.bands.length);
    expect(right.length / N).toBeGreaterThanOrEqual(0.85);
    for (const { bands, result } of right) {
      result.bands.forEach((b, i) => {
        const t = bands[i]!;
        expect(Math.abs(b.centerCm1 - t.centerCm1) / t.centerCm1).toBeLessThan(0.01);
        expect(Math.abs(b.area - trueArea(t)) / trueArea(t)).toBeLessThan(0.10);
      });
    }
  });

  it("the reported 1σ of centre, FWHM, height and area covers the truth 58–78 % of the time", () => {
    let inside = 0, total = 0;
    for (const { bands, result } of runs) {
      if (result.bands.length !== bands.length) continue;
      result.bands.forEach((b, i) => {
        const t = bands[i]!;
        const pairs: [number, number | null, number][] = [
          [b.centerCm1, b.centerCm1Sigma, t.centerCm1],
          [b.fwhmCm1, b.fwhmCm1Sigma, t.fwhmCm1],
          [b.height, b.heightSigma, t.height],
          [b.area, b.areaSigma, trueArea(t)],
        ];
        for (const [v, s, truth] of pairs) {
          total++;
          if (s !== null && Math.abs(v - truth) <= s) inside++;
        }
      });
    }
    expect(inside / total).toBeGreaterThan(0.58);
    expect(inside / total).toBeLessThan(0.78);
  });

  it("the noise model matches the residual (χ²/(n − p) within 0.8–1.25) and the model choice is by BIC with the models listed", () => {
    for (const { result } of runs) {
      expect(result.reducedChi2).toBeGreaterThan(0.8);
      expect(result.reducedChi2).toBeLessThan(1.25);
      expect(result.criterion).toBe("BIC");
      const chosen = result.models.filter((m) => m.chosen);
      expect(chosen.length).toBe(1);
      expect(chosen[0]!.bands).toBe(result.bands.length);
    }
  });

  it("output never holds NaN", () => {
    const text = JSON.stringify(
      runs.map((r) => r.result),
      (_, v) => (typeof v === "number" && Number.isNaN(v) ? "NaN!" : v),
    );
    expect(text).not.toContain("NaN!");
  });
});

describe("two bands 1,954 and 2,400 cm⁻¹ wide, 1,500 cm⁻¹ apart (the case that merged silently)", () => {
  it("are found as two bands over 20 noise draws, or a warning says the residual is above noise", () => {
    let two = 0;
    for (let seed = 1; seed <= 20; seed++) {
      const bands = [
        { centerCm1: 18000, fwhmCm1: 1954, height: 0.6 },
        { centerCm1: 19500, fwhmCm1: 2400, height: 0.5 },
      ];
      const ex = syntheticExport(bands, seed, { edge: null });
      const r = analyseBands(absorbanceSpectrum(ex.wavelengthNm, ex.absorbance));
      if (r.bands.length === 2) two++;
      else expect(r.warnings.some((w) => /residual above noise/.test(w))).toBe(true);
    }
    expect(two).toBeGreaterThanOrEqual(17);
  });
});

describe("four overlapping Gaussians on 900 points with the default baseline (b0 + b1 + λ⁻⁴)", () => {
  it("converge to the optimum from starts within 2 % in 30/30 runs, residual within 5 % of the no-baseline optimum", () => {
    const K = 2 * Math.sqrt(2 * Math.LN2);
    const truth = [[16000, 900, 0.5], [17000, 900, 0.7], [18000, 900, 0.6], [25500, 2500, 0.4]];
    const x = Array.from({ length: 900 }, (_, i) => 1e7 / (330 + i * 0.6));
    for (let seed = 1; seed <= 30; seed++) {
      const normal = seededNormal(seed), u = seededUniform(seed);
      const y = x.map((nu) =>
        truth.reduce((s, [c, f, h]) => s + h! * Math.exp(-0.5 * ((nu - c!) / (f! / K)) ** 2), 0) +
        0.005 * normal()
      );
      const sigma = x.map(() => 0.005);
      const near = (v: number) => v * (1 + 0.04 * (u() - 0.5));
      const candidates = truth.map(([c, f, h]) => ({
        centerCm1: near(c!),
        fwhmCm1: near(f!),
        height: h!,
        significance: 1,
      }));
      const plain = fitBandsCm1(x, y, {
        candidates: truth.map(([c, f, h]) => ({
          centerCm1: c!,
          fwhmCm1: f!,
          height: h!,
          significance: 1,
        })),
        baselineTerms: [],
        sigma,
      });
      const fit = fitBandsCm1(x, y, { candidates, sigma });
      expect(fit.converged).toBe(true);
      expect(fit.residualRms).toBeLessThan(1.05 * plain.residualRms);
      fit.bands.forEach((b, i) =>
        expect(Math.abs(b.centerCm1 - truth[i]![0]!) / truth[i]![0]!).toBeLessThan(0.005)
      );
    }
  });
});

describe("edge analysis on synthetic α spectra (Tauc form joined to an Urbach tail, see _synthetic.ts)", () => {
  const nm = Float64Array.from({ length: 601 }, (_, i) => 300 + i);
  const cases = [
    ["direct", 3.3, 0.05, 2e4],
    ["direct", 2.9, 0.1, 5e4],
    ["indirect", 3.0, 0.08, 2e3],
    ["indirect", 3.4, 0.04, 5e3],
  ] as const;
  for (const [kind, eg, eu, amp] of cases) {
    it(`${kind} gap ${eg} eV, Eu ${eu * 1000} meV: gap within 0.03 eV and Eu within 25 % over 5 noise draws`, () => {
      const { alpha } = edgeAlpha(kind, eg, eu, amp);
      for (let seed = 1; seed <= 5; seed++) {
        const normal = seededNormal(seed);
        // noise growing with α, as for α from a thin sample's transmittance
        const values = nm.map((w) => {
          const a = alpha(1239.8419843320026 / w);
          return a + (0.05 + 0.003 * a) * normal();
        });
        const r = analyseBands(
          { wavelengthNm: nm, values, quantity: "alpha", meta: { sample: "edge" } },
          { tauc: kind },
        );
        const e = r.edge!;
        expect(e.gapEv).not.toBeNull();
        expect(Math.abs(e.gapEv! - eg)).toBeLessThan(0.03);
        expect(e.gapEvSigma!).toBeGreaterThan(0);
        // the window starts at the edge, not in the tail far below it
        expect(e.fromEv!).toBeGreaterThan(eg - eu);
        expect(Math.abs(e.urbachEv! - eu) / eu).toBeLessThan(0.25);
        expect(e.urbachToEv!).toBeLessThanOrEqual(e.fromEv!);
      }
    });
  }
  it("a saturated absorbance export: the edge is said to be saturated, no gap is given, Eu of the tail within 25 %", () => {
    // the generator's edge A₀·exp((ν̃ − ν̃₀)/w) with w = 1200 cm⁻¹ is an Urbach tail of
    // Eu = 1200 cm⁻¹ × hc = 1200 × 1.23984e-4 eV (hc = 1.23984e-4 eV·cm, CODATA)
    const eu = 1200 * 1.2398419843320026e-4;
    for (const seed of [1, 2, 3]) {
      const ex = syntheticExport([], seed);
      const r = analyseBands(absorbanceSpectrum(ex.wavelengthNm, ex.absorbance, 2), {
        tauc: "direct",
      });
      expect(r.edge!.gapEv).toBeNull();
      expect(r.edge!.message).toMatch(/^edge saturated below 3\d\d nm \(photometric floor\)/);
      expect(Math.abs(r.edge!.urbachEv! - eu) / eu).toBeLessThan(0.25);
      expect(r.bands.length).toBe(0);
    }
  });
  it("an edge above the measured range is said to be outside the data, with no number", () => {
    const { alpha } = edgeAlpha("direct", 4.6, 0.05, 2e4);
    const values = nm.map((w) => alpha(1239.8419843320026 / w) + 0.5);
    const r = analyseBands(
      {
        wavelengthNm: nm,
        values: Float64Array.from(values),
        quantity: "alpha",
        meta: { sample: "e" },
      },
      { tauc: "direct" },
    );
    expect(r.edge!.gapEv).toBeNull();
    expect(r.edge!.message).toBe("edge above 4.13 eV: outside the data");
  });
});

describe("comparable numbers and sharp lines", () => {
  it("bands as α (natural, α = A·ln 10/d) agree between slabs of 1 and 3 mm of the same crystal", () => {
    // Beer–Lambert: A = α d / ln 10, so the same α gives 3× the absorbance in a 3 mm slab
    const bands = [{ centerCm1: 18000, fwhmCm1: 2800, height: 1 }, {
      centerCm1: 24600,
      fwhmCm1: 3200,
      height: 1.4,
    }];
    const alphaPerCm = (mm: number) =>
      bands.map((b) => ({ ...b, height: b.height * (mm / 10) / Math.LN10 * 2 }));
    const heights = [1, 3].map((mm, k) => {
      const ex = syntheticExport(alphaPerCm(mm), 50 + k, { edge: null });
      const r = analyseBands(absorbanceSpectrum(ex.wavelengthNm, ex.absorbance, mm));
      expect(r.alphaBase).toBe("natural");
      return r.bandsAlpha!.map((b) => [b.height, b.heightSigma]);
    });
    heights[0]!.forEach(([h1, s1], i) => {
      const [h3, s3] = heights[1]![i]!;
      const alphaTrue = 2 * bands[i]!.height;
      expect(Math.abs(h1! - alphaTrue) / alphaTrue).toBeLessThan(0.03);
      expect(Math.abs(h1! - h3!)).toBeLessThan(3 * Math.hypot(s1!, s3!) + 0.02 * h1!);
    });
  });

  it("a ruby-like slab: the sharp line near 694 nm is found, nothing is reported in the saturated UV", () => {
    const ruby = [
      { centerCm1: 14405, fwhmCm1: 30, height: 0.25 },
      { centerCm1: 18000, fwhmCm1: 2800, height: 0.9 },
      { centerCm1: 24600, fwhmCm1: 3200, height: 1.3 },
    ];
    for (const seed of [1, 2, 3]) {
      const ex = syntheticExport(ruby, seed, { stepNm: 0.5 });
      const r = analyseBands(absorbanceSpectrum(ex.wavelengthNm, ex.absorbance), {
        host: "corundum",
      });
      const line = r.bands.find((b) => Math.abs(b.centerNm - 694.2) < 1);
      expect(line).toBeDefined();
      expect(line!.fwhmCm1).toBeLessThan(150);
      const uvTo = r.excluded.find((e) => e.fromNm === 300)!.toNm;
      expect(r.bands.every((b) => b.centerNm > uvTo)).toBe(true);
    }
  });

  it("a width held at the resolution cap has σ null, is listed as held and warned about", () => {
    const ruby = [{ centerCm1: 14405, fwhmCm1: 10, height: 0.3 }, {
      centerCm1: 18000,
      fwhmCm1: 2800,
      height: 0.9,
    }];
    const ex = syntheticExport(ruby, 4, { edge: null });
    const r = analyseBands(absorbanceSpectrum(ex.wavelengthNm, ex.absorbance), {
      resolutionNm: 1.5,
    });
    const line = r.bands.find((b) => Math.abs(b.centerNm - 694.2) < 1)!;
    expect(line.held).toEqual(["fwhmCm1"]);
    expect(line.fwhmCm1Sigma).toBeNull();
    // 1.5 nm at 694.2 nm is 1.5·ν̃²/1e7 cm⁻¹ (the cap is set at the starting centre)
    expect(Math.abs(line.fwhmCm1 / ((1.5 * line.centerCm1 ** 2) / 1e7) - 1)).toBeLessThan(1e-3);
    expect(r.held.some((h) => h.parameter === "fwhmCm1")).toBe(true);
    expect(r.warnings.some((w) => /width held/.test(w))).toBe(true);
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { analyseSample, type SampleSettings } from "../../lib/analysis/mod.ts";
import type { Spectrum } from "../../lib/spectrum/spectrum.ts";
import { fitCalibration } from "../../lib/dopant/linear_calibration.ts";
import { spectrumResponse } from "../../lib/dopant/response_metric.ts";
import { seededNormal } from "../_random.ts";

const K = 2 * Math.sqrt(2 * Math.LN2); // FWHM = K·σ of a Gaussian

/** Absorbance of a slab with two Gaussian bands in wavenumber (a synthetic, Cr³⁺-like pair). */
function slab(seed: number, thicknessMm = 2, scale = 1): Spectrum {
  const normal = seededNormal(seed);
  const nm = Float64Array.from({ length: 471 }, (_, i) => 360 + i);
  const values = nm.map((w) => {
    const v = 1e7 / w;
    const band = (c: number, fwhm: number, h: number) =>
      h * Math.exp(-0.5 * ((v - c) / (fwhm / K)) ** 2);
    return scale * (band(18000, 2300, 0.5) + band(24800, 2800, 0.4)) + 0.02 + 0.0005 * normal();
  });
  return {
    wavelengthNm: nm,
    values,
    quantity: "absorbance",
    thicknessMm,
    meta: { sample: `slab-${seed}`, sourceFile: `slab-${seed}.csv` },
  };
}

function settings(extra: Partial<SampleSettings> = {}): SampleSettings {
  return {
    read: {},
    reflection: { reflection: "none" },
    illuminants: ["D65", "A"],
    observers: ["2", "10"],
    change: { from: "D65", to: "A", observer: "2", adapt: "none" },
    series: { fromMm: 1, toMm: 10, steps: 5 },
    changeHueThresholdDeg: 20,
    changeMinChroma: 5,
    extra: {},
    ...extra,
  };
}

describe("analyseSample", () => {
  it("a perfect transmitter is the white of every condition (CIE 15: L* = 100, a* = b* = 0)", () => {
    const nm = Float64Array.from({ length: 95 }, (_, i) => 360 + 5 * i);
    const clear: Spectrum = {
      wavelengthNm: nm,
      values: nm.map(() => 1),
      quantity: "transmittance",
      meta: { sample: "clear" },
    };
    const r = analyseSample(clear, "clear.csv", settings());
    expect(r.color.length).toBe(4);
    for (const row of r.color) {
      expect(row.L).toBeCloseTo(100, 6);
      expect(row.a).toBeCloseTo(0, 6);
      expect(row.b).toBeCloseTo(0, 6);
    }
    expect(r.change.dE00).toBeCloseTo(0, 6);
    expect(r.change.marked).toBe(false);
  });

  it("a target at the sample's own colour gives ΔE00 0 under that light; a pass needs every light", () => {
    const first = analyseSample(slab(1), "s.csv", settings());
    const at = (ill: string) =>
      first.color.find((c) => c.illuminant === ill && c.observer === "2")!;
    const target = {
      L: at("D65").L,
      a: at("D65").a,
      b: at("D65").b,
      illuminant: "D65",
      observer: "2",
      toleranceDE00: 1,
      also: [{ L: at("A").L, a: at("A").a, b: at("A").b + 3, illuminant: "A" }],
      name: "own",
    };
    const r = analyseSample(slab(1), "s.csv", settings({ target }));
    expect(r.target!.checks.map((c) => c.illuminant)).toEqual(["D65", "A"]);
    expect(r.target!.checks[0]!.dE00).toBeCloseTo(0, 9);
    expect(r.target!.checks[1]!.dE00).toBeGreaterThan(1); // b* 3 off under A
    expect(r.target!.pass).toBe(false); // pass needs every light
  });

  it("the dopant step reuses the band fit: the same α response as fitting α afresh", () => {
    // Beer–Lambert: α = A·ln10 / d, so a fit of A scaled by ln10/d must equal a fit of α
    const standards = [0.5, 1, 1.5, 2].map((c, i) => ({
      x: c,
      y: spectrumResponse(slab(10 + i, 2, c), "band-height", { bandNm: 555 }).value,
    }));
    const cal = {
      ...fitCalibration(standards, "ols", "wt%", "band-height", { bandNm: 555 }),
      name: "cr",
    };
    const sample = slab(42, 2, 1.2);
    const r = analyseSample(sample, "s.csv", settings({ calibration: cal }));
    const direct = spectrumResponse(sample, "band-height", { bandNm: 555 });
    expect(r.dopant).not.toBeNull();
    expect(r.dopant!.response / direct.value).toBeCloseTo(1, 3);
    expect(r.dopant!.concentration).toBeCloseTo(1.2, 1);
  });

  it("no thickness: the series is skipped with a warning, colour still computed", () => {
    const s = slab(3);
    delete s.thicknessMm;
    const r = analyseSample(s, "s.csv", settings());
    expect(r.series).toBeNull();
    expect(r.warnings.join(" ")).toMatch(/no thickness known/);
    expect(r.color.length).toBe(4);
  });
});

describe("the uncertainty step", () => {
  it("gives σ per colour row and guard-banded verdicts (JCGM 106 decision rule)", () => {
    const base = analyseSample(slab(7), "s.csv", settings());
    expect(base.uncertainty).toBeNull(); // off unless asked for
    const d65 = base.color.find((c) => c.illuminant === "D65" && c.observer === "2")!;
    const target = (dL: number) => ({
      L: d65.L + dL,
      a: d65.a,
      b: d65.b,
      illuminant: "D65",
      observer: "2",
      toleranceDE00: 1,
      also: [],
      name: "t",
    });
    const u = { sources: { noiseSd: 0.002, thicknessSdMm: 0.02 } };
    const on = analyseSample(slab(7), "s.csv", settings({ uncertainty: u, target: target(0) }));
    expect(on.uncertainty!.rows.length).toBe(4);
    for (const r of on.uncertainty!.rows) expect(r.LSd).toBeGreaterThan(0);
    expect(on.uncertainty!.sources.noiseSource).toBe("given");
    expect(on.uncertainty!.changeDE00Sd).toBeGreaterThan(0);
    // on target, σ far below the tolerance: certainly a pass
    expect(on.target!.verdict).toBe("pass");
    // 5 units of L* away with a tolerance of 1: certainly a fail
    const far = analyseSample(slab(7), "s.csv", settings({ uncertainty: u, target: target(5) }));
    expect(far.target!.verdict).toBe("fail");
    expect(far.target!.passProbability).toBeLessThan(0.05);
    // ΔE00 at the tolerance: the probability sits near one half, so undecided
    const sl = (L: number) => 1 + (0.015 * (L - 50) ** 2) / Math.sqrt(20 + (L - 50) ** 2);
    const dL = 1 * sl(d65.L + 0.5); // ΔE00 = ΔL/S_L for a pure lightness step (Sharma et al.)
    const edge = analyseSample(slab(7), "s.csv", settings({ uncertainty: u, target: target(dL) }));
    expect(edge.target!.verdict).toBe("undecided");
  });
});

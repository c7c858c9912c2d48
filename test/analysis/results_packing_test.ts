import { describe, it } from "node:test";
import { expect } from "expect";
import { analyseSample, type SampleSettings } from "../../lib/analysis/mod.ts";
import {
  ResultsPacker,
  STORED_DIGITS,
  unpackResults,
  unpackSample,
} from "../../lib/analysis/results_packing.ts";
import type { SampleResult } from "../../lib/analysis/sample_result.ts";
import type { Spectrum } from "../../lib/spectrum/spectrum.ts";
import { seededNormal } from "../_random.ts";

const K = 2 * Math.sqrt(2 * Math.LN2); // FWHM = K·σ of a Gaussian

/** Absorbance of a slab with two Gaussian bands in wavenumber (synthetic, Cr³⁺-like). */
function slab(seed: number): Spectrum {
  const normal = seededNormal(seed);
  const nm = Float64Array.from({ length: 471 }, (_, i) => 360 + i);
  const values = nm.map((w) => {
    const v = 1e7 / w;
    const band = (c: number, fwhm: number, h: number) =>
      h * Math.exp(-0.5 * ((v - c) / (fwhm / K)) ** 2);
    return band(18000, 2300, 0.5) + band(24800, 2800, 0.4) + 0.02 + 0.0005 * normal();
  });
  return {
    wavelengthNm: nm,
    values,
    quantity: "absorbance",
    thicknessMm: 2,
    meta: { sample: `slab-${seed}`, sourceFile: `slab-${seed}.csv` },
  };
}

const SETTINGS: SampleSettings = {
  read: {},
  reflection: { reflection: "none" },
  illuminants: ["D65", "A"],
  observers: ["2", "10"],
  change: { from: "D65", to: "A", observer: "2", adapt: "none" },
  series: { fromMm: 1, toMm: 10, steps: 5 },
  changeHueThresholdDeg: 20,
  changeMinChroma: 5,
  extra: { cut: "oval" },
  uncertainty: { sources: { noiseSd: 0.001 } },
};

/**
 * What results.json should give back, written from the module's rule (not its code): JSON's
 * view of the result, every non-integer number at 9 significant digits, curves as they are.
 */
function atStoredPrecision(v: unknown, round = true): unknown {
  if (typeof v === "number") {
    if (!Number.isFinite(v)) return null;
    return round && !Number.isInteger(v) ? Number(v.toPrecision(9)) : v === 0 ? 0 : v;
  }
  if (Array.isArray(v)) return v.map((x) => atStoredPrecision(x ?? null, round));
  if (v && typeof v === "object") {
    return Object.fromEntries(
      Object.entries(v).filter(([, x]) => x !== undefined).map((
        [k, x],
      ) => [k, atStoredPrecision(x, round && k !== "plot" && k !== "curve")]),
    );
  }
  return v;
}

/** Packs results as the batch does and reads them back from the JSON text. */
function roundTrip(results: SampleResult[]) {
  const packer = new ResultsPacker();
  const text = `{"samples":[${results.map((r) => JSON.stringify(packer.pack(r))).join(",")}],` +
    `"errors":[],"shared":${JSON.stringify(packer.shared)}}`;
  return { text, doc: unpackResults(JSON.parse(text)) };
}

describe("results.json packing (lib/analysis/results_packing.ts)", () => {
  const results = [1, 2, 3].map((seed) =>
    analyseSample(slab(seed), `lot/slab-${seed}.csv`, SETTINGS)
  );

  it("gives back every sample exactly as stored: every key, 9 significant digits, same order", () => {
    expect(STORED_DIGITS).toBe(9);
    const { doc } = roundTrip(results);
    results.forEach((r, i) => {
      const back = doc.samples[i]!;
      expect(back).toEqual(atStoredPrecision(r));
      // the colour rows keep every key, in their order (the colour-row contract)
      back.color.forEach((row, j) => expect(Object.keys(row)).toEqual(Object.keys(r.color[j]!)));
      expect(Object.keys(back.provenance)).toEqual(Object.keys(r.provenance));
      expect(Object.keys(back.change!)).toEqual(Object.keys(r.change!));
      expect(Object.keys(back.bands!.assignments[0]!)).toEqual(
        Object.keys(r.bands!.assignments[0]!),
      );
    });
    // with chromatic adaptation the change keeps some of its repeats: same keys, same order
    const adapted = analyseSample(slab(4), "lot/slab-4.csv", {
      ...SETTINGS,
      change: { ...SETTINGS.change, adapt: "cat16" },
    });
    const change = roundTrip([adapted]).doc.samples[0]!.change!;
    expect(Object.keys(change)).toEqual(Object.keys(adapted.change!));
    // the samples exercise every packed part
    expect(results[0]!.bands!.assignments.length).toBeGreaterThan(0);
    expect(results[0]!.series!.points.length).toBeGreaterThan(2);
    expect(results[0]!.uncertainty!.rows.length).toBe(4);
  });

  it("moves no number by more than 5 parts in 10⁹ of itself", () => {
    const { doc } = roundTrip(results);
    const pairs: [number, number][] = [];
    const walk = (a: unknown, b: unknown) => {
      if (typeof a === "number" && typeof b === "number") pairs.push([a, b]);
      else if (a && typeof a === "object" && b && typeof b === "object") {
        for (const k of Object.keys(a)) {
          walk((a as Record<string, unknown>)[k], (b as Record<string, unknown>)[k]);
        }
      }
    };
    walk(results, doc.samples);
    expect(pairs.length).toBeGreaterThan(300);
    for (const [full, stored] of pairs) {
      expect(Math.abs(stored - full)).toBeLessThanOrEqual(5e-9 * Math.abs(full));
    }
  });

  it("stores what samples share once: the text is under 70 % of the plain JSON", () => {
    const { text } = roundTrip(results);
    const plain = JSON.stringify({ samples: results, errors: [] });
    // (curves are step text in both: this is the tables, the shared texts and the digits)
    expect(text.length).toBeLessThan(0.7 * plain.length);
    // the charted transmittance is the measurement the bands were fitted to: kept over it
    expect(text.split('"over":"absorbance"').length - 1).toBe(3);
    // each catalogue source text once
    const source = results[0]!.bands!.assignments[0]!.source;
    expect(text.split(JSON.stringify(source)).length - 1).toBe(1);
  });

  it("keeps what would not come back the same as it is: another reason, a row of another file", () => {
    const r = structuredClone(results[0]!);
    r.bands!.assignments[0]!.reason = "a reason of another version";
    r.color[1]!.file = "elsewhere.csv";
    const { doc, text } = roundTrip([r]);
    expect(text).toContain("a reason of another version");
    expect(doc.samples[0]).toEqual(atStoredPrecision(r));
    // a fit to α (not the absorbance the plot comes from): the plot keeps its own steps
    const alpha = structuredClone(results[1]!);
    alpha.bands!.ordinate = "alpha";
    const other = roundTrip([alpha]);
    expect(other.text).not.toContain('"over"');
    expect(other.doc.samples[0]).toEqual(atStoredPrecision(alpha));
  });

  it("gives a document written before packing (no shared block) as it is", () => {
    const older = { samples: [JSON.parse(JSON.stringify(results[0]))], errors: [] };
    const doc = unpackResults(structuredClone(older) as never);
    expect(doc.samples).toEqual(older.samples);
  });

  it("names a reference the shared block lacks", () => {
    const packer = new ResultsPacker();
    const stored = packer.pack(results[0]!);
    expect(() => unpackSample(stored, { shapes: [], catalogue: [] })).toThrow(/no shape 0/);
  });
});

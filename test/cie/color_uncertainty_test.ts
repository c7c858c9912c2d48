import { describe, it } from "node:test";
import { expect } from "expect";
import { table as cie1931 } from "../../lib/cie/data/cie_1931_2deg.ts";
import { table as d65Table } from "../../lib/cie/data/illuminant_d65.ts";
import { estimateNoiseSd, spectrumColorUncertainty } from "../../lib/cie/color_uncertainty.ts";
import {
  seededNormal as productionNormal,
  spectrumColorMonteCarlo,
} from "../../lib/cie/color_monte_carlo.ts";
import { colorChangeUncertainty } from "../../lib/cie/color_difference_uncertainty.ts";
import { pathTransmittanceSensitivity } from "../../lib/optics/path_transmittance_sensitivity.ts";
import { transmittanceForPath } from "../../lib/optics/path_transmittance.ts";
import type { Spectrum } from "../../lib/spectrum/spectrum.ts";
import { seededNormal } from "../_random.ts";

// ---------------------------------------------------------------------------------------------
// An independent colour route, written apart from lib/: plain 1 nm summation of CIE 15:2018
// eq. 7.1–7.2 with the CIE 1931 table and D65 carried linearly from its 5 nm table, then CIELAB
// (CIE 15:2018 eq. 8.3–8.5), and Beer–Lambert rescaling T_path = T^(p/d).
// ---------------------------------------------------------------------------------------------
const NM = Float64Array.from({ length: 471 }, (_, i) => 360 + i);
const XBAR = cie1931.columns["x"]!, YBAR = cie1931.columns["y"]!, ZBAR = cie1931.columns["z"]!;
const D65 = Float64Array.from(NM, (nm) => {
  const v = d65Table.columns["d65"]!;
  const j = Math.floor((nm - d65Table.startNm) / 5);
  const f = (nm - (d65Table.startNm + 5 * j)) / 5;
  return j + 1 < v.length ? v[j]! + f * (v[j + 1]! - v[j]!) : v[j]!;
});
const K = 100 / D65.reduce((s, v, i) => s + v * YBAR[i]!, 0);
const WHITE = [0, 1, 2].map((c) =>
  D65.reduce((s, v, i) => s + K * v * [XBAR, YBAR, ZBAR][c]![i]!, 0)
);

function independentLab(t: ArrayLike<number>): [number, number, number] {
  let x = 0, y = 0, z = 0;
  for (let i = 0; i < 471; i++) {
    const w = K * D65[i]! * t[i]!;
    x += w * XBAR[i]!;
    y += w * YBAR[i]!;
    z += w * ZBAR[i]!;
  }
  const f = (r: number) => r > 216 / 24389 ? Math.cbrt(r) : (24389 / 27 * r + 16) / 116;
  const fx = f(x / WHITE[0]!), fy = f(y / WHITE[1]!), fz = f(z / WHITE[2]!);
  return [116 * fy - 16, 500 * (fx - fy), 200 * (fy - fz)];
}

function sd(v: number[]): number {
  const m = v.reduce((a, b) => a + b, 0) / v.length;
  return Math.sqrt(v.reduce((s, x) => s + (x - m) ** 2, 0) / (v.length - 1));
}

/** Independent Monte Carlo: noise per point, thickness and path drawn, Beer–Lambert, 1 nm sum. */
function independentMonteCarlo(
  t2mm: Float64Array,
  noise: number,
  d: number,
  dSd: number,
  p: number,
  pSd: number,
  draws: number,
): { LSd: number; aSd: number; bSd: number } {
  const normal = seededNormal(20261202);
  const cols: number[][] = [[], [], []];
  const tp = new Float64Array(471);
  for (let k = 0; k < draws; k++) {
    const dk = d + dSd * normal(), pk = p + pSd * normal();
    for (let i = 0; i < 471; i++) tp[i] = Math.max(t2mm[i]! + noise * normal(), 1e-10) ** (pk / dk);
    independentLab(tp).forEach((v, c) => cols[c]!.push(v));
  }
  return { LSd: sd(cols[0]!), aSd: sd(cols[1]!), bSd: sd(cols[2]!) };
}

const gauss = (nm: number, c: number, w: number) => Math.exp(-0.5 * ((nm - c) / w) ** 2);

/** Invented band models (decadic absorbance of a 2 mm slab) with seeded photometric noise. */
function slab(name: string, absorbance: (nm: number) => number, noise: number, seed: number) {
  const normal = seededNormal(seed);
  const values = Float64Array.from(NM, (nm) => 10 ** -absorbance(nm) + noise * normal());
  return {
    wavelengthNm: Float64Array.from(NM),
    values,
    quantity: "transmittance",
    thicknessMm: 2,
    meta: { sample: name },
  } satisfies Spectrum;
}

const SLABS = [
  slab("pink Cr", (l) => 0.02 + 0.3 * gauss(l, 555, 40) + 0.35 * gauss(l, 407, 28), 0.003, 1),
  slab("blue Fe-Ti", (l) => 0.03 + 0.4 * gauss(l, 580, 60) + 0.2 * gauss(l, 720, 70), 0.003, 2),
  slab("yellow edge", (l) => 0.02 + 1.2 * Math.exp(-(l - 360) / 45), 0.003, 3),
];

describe("first-order colour uncertainty against an independent Monte Carlo", () => {
  for (const s of SLABS) {
    it(`${s.meta.sample}: 2 → 6 mm, noise 0.003, thickness σ 0.02, path σ 0.06: LSd, aSd, bSd within 10 %`, () => {
      const [u] = spectrumColorUncertainty(s, {
        illuminants: ["D65"],
        pathMm: 6,
        sources: { noiseSd: 0.003, thicknessSdMm: 0.02, pathSdMm: 0.06 },
      });
      const mc = independentMonteCarlo(s.values, 0.003, 2, 0.02, 6, 0.06, 4000);
      // check value: the independent route's sample σ (Monte Carlo error ≈ 1.1 % at 4000 draws)
      expect(Math.abs(u!.LSd / mc.LSd - 1)).toBeLessThan(0.1);
      expect(Math.abs(u!.aSd / mc.aSd - 1)).toBeLessThan(0.1);
      expect(Math.abs(u!.bSd / mc.bSd - 1)).toBeLessThan(0.1);
      expect(u!.sources).toMatchObject({
        noiseSource: "given",
        thicknessSdMm: 0.02,
        pathSdMm: 0.06,
      });
    });
  }

  it("the production colour of the independent route's slab is the same colour (identity)", () => {
    const s = SLABS[0]!;
    const t = transmittanceForPath(s, 6).values;
    const mine = independentLab(Float64Array.from(s.values, (v) => Math.max(v, 1e-10) ** 3));
    const [u] = spectrumColorMonteCarlo(s, {
      illuminants: ["D65"],
      pathMm: 6,
      sources: { noiseSd: 0 },
      draws: 2,
    });
    expect(t.length).toBe(471);
    expect(Math.abs(u!.labMean!.L - mine[0])).toBeLessThan(1e-9);
    expect(Math.abs(u!.labMean!.a - mine[1])).toBeLessThan(1e-9);
    expect(Math.abs(u!.labMean!.b - mine[2])).toBeLessThan(1e-9);
  });
});

describe("Monte Carlo mode (JCGM 101) against first order", () => {
  const sources = {
    noiseSd: 0.003,
    thicknessSdMm: 0.02,
    pathSdMm: 0.06,
    offsetSd: 0.001,
    wavelengthSdNm: 0.2,
  };
  for (const s of SLABS) {
    it(`${s.meta.sample}: mc and linear agree within 10 % where the linear approximation holds`, () => {
      const options = { illuminants: ["D65", "A"], pathMm: 6, sources };
      const lin = spectrumColorUncertainty(s, options);
      const mc = spectrumColorMonteCarlo(s, { ...options, draws: 4000, seed: 5 });
      lin.forEach((u, r) => {
        for (const k of ["LSd", "aSd", "bSd", "CSd"] as const) {
          expect(Math.abs(mc[r]![k] / u[k] - 1)).toBeLessThan(0.1);
        }
        expect(Math.abs(mc[r]!.hSd! / u.hSd! - 1)).toBeLessThan(0.1);
      });
    });
  }

  it("absorbance export, noise growing as T falls, Fresnel surfaces, estimated noise: mc and linear within 10 %", () => {
    // an absorbance file as an instrument writes it: σ_T = 0.002 becomes σ_A = σ_T/(T ln 10)
    const normal = seededNormal(31);
    const a = Float64Array.from(NM, (l) => {
      const t = 0.85 * 10 ** -(0.05 + 0.9 * gauss(l, 575, 55) + 0.6 * gauss(l, 410, 30));
      return -Math.log10(t + 0.002 * normal());
    });
    const s: Spectrum = {
      wavelengthNm: Float64Array.from(NM),
      values: a,
      quantity: "absorbance",
      thicknessMm: 2,
      meta: { sample: "absorbance export" },
    };
    const options = {
      illuminants: ["D65"],
      pathMm: 4,
      reflection: { reflection: "host" as const, n: 1.76 },
      sources: { thicknessSdMm: 0.02, wavelengthSdNm: 0.3 },
    };
    const [lin] = spectrumColorUncertainty(s, options);
    const [mc] = spectrumColorMonteCarlo(s, { ...options, draws: 4000, seed: 2 });
    expect(lin!.sources.noiseSource).toBe("estimated");
    expect(lin!.sources.noiseSdMax).toBeGreaterThan(1.5 * lin!.sources.noiseSd);
    for (const k of ["LSd", "aSd", "bSd"] as const) {
      expect(Math.abs(mc![k] / lin![k] - 1)).toBeLessThan(0.1);
    }
  });

  it("irregular pixel grid (PCHIP, linearised weights): mc and linear within 10 %", () => {
    // an array-detector grid: steps of 0.4–0.6 nm, 380–780 nm
    const nm: number[] = [];
    for (let l = 380, k = 0; l <= 780; k++) {
      nm.push(l);
      l += 0.5 + 0.1 * Math.sin(k);
    }
    const normal = seededNormal(41);
    const s: Spectrum = {
      wavelengthNm: Float64Array.from(nm),
      values: Float64Array.from(
        nm,
        (l) => 10 ** -(0.03 + 0.3 * gauss(l, 555, 40)) + 0.003 * normal(),
      ),
      quantity: "transmittance",
      thicknessMm: 2,
      meta: { sample: "pixels" },
    };
    const options = {
      illuminants: ["D65"],
      pathMm: 6,
      sources: { noiseSd: 0.003, pathSdMm: 0.06 },
    };
    const [lin] = spectrumColorUncertainty(s, options);
    const [mc] = spectrumColorMonteCarlo(s, { ...options, draws: 1500, seed: 4 });
    for (const k of ["LSd", "aSd", "bSd"] as const) {
      expect(Math.abs(mc![k] / lin![k] - 1)).toBeLessThan(0.1);
    }
    expect(lin!.notes.join(" ")).not.toContain("thickness uncertainty");
  });

  it("near-black stone (T ≈ 0.005 at 2 mm, noise 0.003, to 6 mm): mc differs visibly from linear", () => {
    const black = slab("near-black", (l) => 2.3 + 0.2 * gauss(l, 560, 50), 0, 9);
    const options = { illuminants: ["D65"], pathMm: 6, sources: { noiseSd: 0.003 } };
    const [lin] = spectrumColorUncertainty(black, options);
    const [mc] = spectrumColorMonteCarlo(black, { ...options, draws: 4000, seed: 5 });
    // measured (seed 5, 4000 draws): mc/linear ≈ 2.2 for LSd, 2.0 for aSd, 1.8 for bSd — the
    // cube of T and the clamp at the dark level are far from linear when the noise is
    // comparable to T; the Monte Carlo mean L* is also pulled up from the nominal
    expect(mc!.LSd / lin!.LSd).toBeGreaterThan(1.5);
    expect(mc!.aSd / lin!.aSd).toBeGreaterThan(1.4);
    expect(mc!.labMean!.L).toBeGreaterThan(0);
  });

  it("is repeatable with a seed and changes with another seed", () => {
    const options = { illuminants: ["D65"], pathMm: 6, sources: { noiseSd: 0.003 }, draws: 200 };
    const a = spectrumColorMonteCarlo(SLABS[0]!, { ...options, seed: 3 })[0]!;
    const b = spectrumColorMonteCarlo(SLABS[0]!, { ...options, seed: 3 })[0]!;
    const c = spectrumColorMonteCarlo(SLABS[0]!, { ...options, seed: 4 })[0]!;
    expect(a.labCovariance).toEqual(b.labCovariance);
    expect(a.LSd).not.toBe(c.LSd);
    expect(a.notes.join(" ")).toContain("200 draws, seed 3");
  });
});

describe("closed-form checks", () => {
  const nm = Float64Array.of(450, 550, 650);
  const t = Float64Array.of(0.8, 0.35, 0.6);
  const measured: Spectrum = {
    wavelengthNm: nm,
    values: t,
    quantity: "transmittance",
    thicknessMm: 2,
    meta: { sample: "x" },
  };

  it("Beer–Lambert: ∂T_path/∂d = −T_path·ln(T_path)/d and ∂T_path/∂p = T_path·ln(T_path)/p", () => {
    const s = pathTransmittanceSensitivity(measured, 6);
    for (let i = 0; i < 3; i++) {
      const tp = t[i]! ** 3; // T^(p/d), p/d = 3
      expect(s.transmittance[i]).toBeCloseTo(tp, 14);
      expect(s.perThicknessMm[i]).toBeCloseTo((-tp * Math.log(tp)) / 2, 14);
      expect(s.perPathMm[i]).toBeCloseTo((tp * Math.log(tp)) / 6, 14);
      expect(s.perValue[i]).toBeCloseTo(3 * t[i]! ** 2, 14); // d(T³)/dT
    }
  });

  it("absorbance and α ordinates: ∂T/∂A = −ln10·(p/d)·T, ∂T/∂α = −(p/10)·T (closed form)", () => {
    const a: Spectrum = {
      ...measured,
      values: t.map((v) => -Math.log10(v)),
      quantity: "absorbance",
    };
    const s = pathTransmittanceSensitivity(a, 6);
    for (let i = 0; i < 3; i++) expect(s.perValue[i]).toBeCloseTo(-Math.LN10 * 3 * t[i]! ** 3, 12);
    const alpha: Spectrum = { ...measured, values: Float64Array.of(1, 2, 3), quantity: "alpha" };
    const sa = pathTransmittanceSensitivity(alpha, 6);
    expect(sa.perValue[1]).toBeCloseTo(-0.6 * Math.exp(-1.2), 14);
    expect(sa.perPathMm[1]).toBeCloseTo(-0.2 * Math.exp(-1.2), 14);
    expect(sa.perThicknessMm[1]).toBe(0); // α is intrinsic: the measured thickness drops out
  });

  it("slab with Fresnel surfaces: every sensitivity equals the central difference of transmittanceForPath", () => {
    const reflection = { reflection: "host" as const, n: 1.76 };
    const s = pathTransmittanceSensitivity(measured, 6, reflection);
    const h = 1e-6;
    const at = (sp: Spectrum, p: number) => transmittanceForPath(sp, p, reflection).values;
    for (let i = 0; i < 3; i++) {
      const up = Float64Array.from(t), down = Float64Array.from(t);
      up[i] = up[i]! + h;
      down[i] = down[i]! - h;
      const dv =
        (at({ ...measured, values: up }, 6)[i]! - at({ ...measured, values: down }, 6)[i]!) /
        (2 * h);
      const dd = (at({ ...measured, thicknessMm: 2 + h }, 6)[i]! -
        at({ ...measured, thicknessMm: 2 - h }, 6)[i]!) / (2 * h);
      const dp = (at(measured, 6 + h)[i]! - at(measured, 6 - h)[i]!) / (2 * h);
      expect(Math.abs(s.perValue[i]! - dv)).toBeLessThan(1e-7);
      expect(Math.abs(s.perThicknessMm[i]! - dd)).toBeLessThan(1e-7);
      expect(Math.abs(s.perPathMm[i]! - dp)).toBeLessThan(1e-7);
    }
  });

  it("neutral grey: aSd, bSd come from noise only; from thickness and path ≈ 0; LSd from thickness as closed form", () => {
    const grey: Spectrum = {
      wavelengthNm: Float64Array.from(NM),
      values: new Float64Array(471).fill(0.5),
      quantity: "transmittance",
      thicknessMm: 2,
      meta: { sample: "grey" },
    };
    const [u] = spectrumColorUncertainty(grey, {
      illuminants: ["D65"],
      pathMm: 6,
      sources: { noiseSd: 0.003, thicknessSdMm: 0.02, pathSdMm: 0.06 },
    });
    const b = u!.budget!;
    expect(b.thickness.aSd).toBeLessThan(1e-9);
    expect(b.thickness.bSd).toBeLessThan(1e-9);
    expect(b.path.aSd).toBeLessThan(1e-9);
    expect(b.noise.aSd).toBeGreaterThan(1e-3);
    expect(u!.aSd).toBeCloseTo(b.noise.aSd, 12);
    // closed form: Y/Yn = T_path = 0.5^(p/d), so L = 116·0.5^(p/(3d)) − 16 and
    // ∂L/∂d = 116 · 0.5^(p/(3d)) · ln 0.5 · (−p/(3d²)) = 116 · 0.5 · ln 2 · 0.5 at p 6, d 2
    expect(b.thickness.LSd).toBeCloseTo(116 * 0.5 * Math.LN2 * 0.5 * 0.02, 9);
  });
});

describe("noise estimate from the high-frequency residual", () => {
  it("recovers σ = 0.002 within 15 % on a band spectrum at 1 nm and at 5 nm steps", () => {
    for (const step of [1, 5]) {
      const normal = productionNormal(11 + step);
      const n = Math.floor(470 / step) + 1;
      const v = Float64Array.from(
        { length: n },
        (_, i) => 10 ** -(0.05 + 0.4 * gauss(360 + step * i, 555, 40)) + 0.002 * normal(),
      );
      const est = estimateNoiseSd(v);
      const med = [...est].sort((a, b) => a - b)[n >> 1]!;
      expect(Math.abs(med / 0.002 - 1)).toBeLessThan(0.15);
    }
  });

  it("follows absorbance noise that grows as T falls (σ_A = σ_T / (T ln 10), closed form)", () => {
    const normal = productionNormal(21);
    // T falls from 0.8 to 0.01 across the range; the instrument noise is 0.001 in T
    const tTrue = Float64Array.from(NM, (_, i) => 0.8 * Math.exp(-i / 108));
    const a = tTrue.map((t) => -Math.log10(t + 0.001 * normal()));
    const est = estimateNoiseSd(a);
    const expected = (i: number) => 0.001 / (tTrue[i]! * Math.LN10);
    // a local robust estimate scatters by about ±25 % point to point (about 100 correlated
    // fourth differences per window), so the check is on the median ratio and on the trend
    const ratios = Array.from({ length: 371 }, (_, k) => est[k + 50]! / expected(k + 50));
    const median = ratios.sort((x, y) => x - y)[185]!;
    expect(Math.abs(median - 1)).toBeLessThan(0.15);
    const trend = (est[400]! / est[60]!) / (expected(400) / expected(60));
    expect(trend).toBeGreaterThan(0.6);
    expect(trend).toBeLessThan(1.6);
  });

  it("an estimated noise is stated in the result", () => {
    const [u] = spectrumColorUncertainty(SLABS[1]!, { illuminants: ["D65"], pathMm: 6 });
    expect(u!.sources.noiseSource).toBe("estimated");
    expect(Math.abs(u!.sources.noiseSd / 0.003 - 1)).toBeLessThan(0.15);
    expect(u!.notes.join(" ")).toContain("estimated from the spectrum's high-frequency residual");
  });
});

describe("σ of C*, h and of the colour change ΔE00", () => {
  it("colour change D65 → A: first-order dE00Sd within 10 % of Monte Carlo", () => {
    const s = SLABS[1]!;
    const options = {
      pathMm: 6,
      sources: { noiseSd: 0.003, thicknessSdMm: 0.02, pathSdMm: 0.06, wavelengthSdNm: 0.3 },
    };
    const lin = colorChangeUncertainty(s, "D65", "A", "2", options);
    const mc = colorChangeUncertainty(s, "D65", "A", "2", { ...options, mode: "mc", draws: 4000 });
    expect(lin.dE00).toBeCloseTo(mc.dE00, 12);
    expect(Math.abs(mc.dE00Sd / lin.dE00Sd - 1)).toBeLessThan(0.1);
    for (const adapt of ["cat16", "bradford"] as const) {
      const l2 = colorChangeUncertainty(s, "D65", "A", "2", { ...options, adapt });
      const m2 = colorChangeUncertainty(s, "D65", "A", "2", {
        ...options,
        adapt,
        mode: "mc",
        draws: 3000,
      });
      expect(Math.abs(m2.dE00Sd / l2.dE00Sd - 1)).toBeLessThan(0.1);
    }
  });

  it("the two colours of a change are correlated: dE00Sd is not the independent sum", () => {
    // a grey's colour change is the change of the white: thickness moves both colours alike
    const s = SLABS[0]!;
    const lin = colorChangeUncertainty(s, "D65", "A", "2", {
      pathMm: 6,
      sources: { noiseSd: 0, thicknessSdMm: 0.05 },
    });
    const [d65, a] = spectrumColorUncertainty(s, {
      pathMm: 6,
      sources: { noiseSd: 0, thicknessSdMm: 0.05 },
    });
    expect(lin.dE00Sd).toBeLessThan(
      Math.hypot(d65!.LSd, d65!.aSd, d65!.bSd, a!.LSd, a!.aSd, a!.bSd),
    );
  });
});

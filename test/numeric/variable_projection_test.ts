import { describe, it } from "node:test";
import { expect } from "expect";
import {
  levenbergMarquardt,
  type SeparableModel,
  variableProjection,
} from "../../lib/numeric/mod.ts";
import { GAUSS1_CERTIFIED, GAUSS1_CERTIFIED_RSS, GAUSS1_STARTS, GAUSS1_Y } from "./_nist_gauss1.ts";
import { curvatureAgreement } from "../_curvature_check.ts";
import { seededNormal } from "../_random.ts";

// NIST Statistical Reference Datasets, Nonlinear Regression, Misra1a (lower difficulty):
// y = b1 (1 − exp(−b2 x)); certified b1 2.3894212918E+02 (sd 2.7070075241E+00),
// b2 5.5015643181E-04 (sd 7.2668688436E-06), residual sum of squares 1.2455138894E-01.
const MISRA_X = [
  77.6,
  114.9,
  141.1,
  190.8,
  239.9,
  289.0,
  332.8,
  378.4,
  434.8,
  477.3,
  536.8,
  593.1,
  689.1,
  760.0,
];
const MISRA_Y = Float64Array.from([
  10.07,
  14.73,
  17.94,
  23.93,
  29.61,
  35.18,
  40.02,
  44.82,
  50.76,
  55.05,
  61.01,
  66.4,
  75.47,
  81.78,
]);

describe("Levenberg–Marquardt against the NIST StRD certified values", () => {
  it("Misra1a from both NIST starting points: b1, b2, their standard errors and the RSS", () => {
    const model = (p: Float64Array, out: Float64Array, jac?: Float64Array) => {
      MISRA_X.forEach((x, i) => {
        const e = Math.exp(-p[1]! * x);
        out[i] = p[0]! * (1 - e);
        if (jac) {
          jac[2 * i] = 1 - e;
          jac[2 * i + 1] = p[0]! * x * e;
        }
      });
    };
    for (const start of [[500, 1e-4], [250, 5e-4]]) {
      const r = levenbergMarquardt(MISRA_Y, model, Float64Array.from(start), {
        maxIterations: 500,
        tolerance: 1e-15,
      });
      expect(r.params[0]!).toBeCloseTo(238.94212918, 4);
      expect(r.params[1]! / 5.5015643181e-4).toBeCloseTo(1, 7);
      expect(r.sigmas[0]! / 2.7070075241).toBeCloseTo(1, 5);
      expect(r.sigmas[1]! / 7.2668688436e-6).toBeCloseTo(1, 5);
      expect(r.rss / 1.2455138894e-1).toBeCloseTo(1, 7);
    }
  });
});

describe("variableProjection() (Golub & Pereyra 1973)", () => {
  const misra = {
    linearCount: 1,
    columnOf: [0],
    basis: (t: Float64Array, phi: Float64Array, dphi?: Float64Array) => {
      MISRA_X.forEach((x, i) => {
        const e = Math.exp(-t[0]! * x);
        phi[i] = 1 - e;
        if (dphi) dphi[i] = x * e;
      });
    },
  };
  it("Misra1a (NIST StRD) with b1 linear: certified b1, b2, standard errors and RSS from both starts", () => {
    for (const b2 of [1e-4, 5e-4]) {
      const r = variableProjection(MISRA_Y, misra, Float64Array.of(b2), { tolerance: 1e-15 });
      expect(r.converged).toBe(true);
      expect(r.linear[0]! / 238.94212918).toBeCloseTo(1, 7);
      expect(r.nonlinear[0]! / 5.5015643181e-4).toBeCloseTo(1, 7);
      // sigmas are ordered [θ…, c…]
      expect(r.sigmas[0]! / 7.2668688436e-6).toBeCloseTo(1, 5);
      expect(r.sigmas[1]! / 2.7070075241).toBeCloseTo(1, 5);
      expect(r.rss / 1.2455138894e-1).toBeCloseTo(1, 7);
    }
  });
  it("a parameter pushed against its bound is held: sigma null, held true, the rest still fitted", () => {
    const r = variableProjection(MISRA_Y, misra, Float64Array.of(1e-4), { upper: [4e-4] });
    expect(r.held[0]).toBe(true);
    expect(r.nonlinear[0]).toBe(4e-4);
    expect(r.sigmas[0]).toBeNull();
    expect(r.sigmas[1]).not.toBeNull();
  });
  it("closed form: two exponentials y = 2e^(−0.3x) + 0.5e^(−1.7x) + noise, coverage of 1σ over 200 seeds within 68 % ± 10 %", () => {
    const x = Array.from({ length: 60 }, (_, i) => i * 0.1);
    const model = {
      linearCount: 2,
      columnOf: [0, 1],
      basis: (t: Float64Array, phi: Float64Array, dphi?: Float64Array) => {
        x.forEach((v, i) => {
          for (let k = 0; k < 2; k++) {
            const e = Math.exp(-t[k]! * v);
            phi[k * x.length + i] = e;
            if (dphi) dphi[k * x.length + i] = -v * e;
          }
        });
      },
    };
    let inside = 0, total = 0;
    for (let seed = 1; seed <= 200; seed++) {
      const normal = seededNormal(seed);
      const y = x.map((v) => 2 * Math.exp(-0.3 * v) + 0.5 * Math.exp(-1.7 * v) + 0.01 * normal());
      const r = variableProjection(y, model, Float64Array.of(0.2, 2.5));
      expect(r.converged).toBe(true);
      const truth = [0.3, 1.7, 2, 0.5];
      const values = [...r.nonlinear, ...r.linear];
      truth.forEach((t, k) => {
        total++;
        if (Math.abs(values[k]! - t) <= r.sigmas[k]!) inside++;
      });
    }
    expect(inside / total).toBeGreaterThan(0.58);
    expect(inside / total).toBeLessThan(0.78);
  });
});

describe("variableProjection() with exact second derivatives (Newton steps near the optimum)", () => {
  // Gauss1: b1, b3, b6 linear; θ = [b2, b4, b5, b7, b8] on columns [0, 1, 1, 2, 2]
  const x = GAUSS1_Y.map((_, i) => i + 1);
  const n = x.length;
  const gauss1 = (withCurvature: boolean): SeparableModel => {
    const model: SeparableModel = {
      linearCount: 3,
      columnOf: [0, 1, 1, 2, 2],
      basis: (t, phi, dphi) => {
        for (let i = 0; i < n; i++) {
          const e = Math.exp(-t[0]! * x[i]!);
          phi[i] = e;
          if (dphi) dphi[i] = -x[i]! * e;
          for (let g = 0; g < 2; g++) {
            const c = t[1 + 2 * g]!, w = t[2 + 2 * g]!, d = x[i]! - c;
            const v = Math.exp(-(d * d) / (w * w));
            phi[(1 + g) * n + i] = v;
            if (dphi) {
              dphi[(1 + 2 * g) * n + i] = (2 * d * v) / (w * w);
              dphi[(2 + 2 * g) * n + i] = (2 * d * d * v) / (w * w * w);
            }
          }
        }
      },
    };
    if (withCurvature) {
      // pairs (0,0), (1,1), (1,2), (2,2), (3,3), (3,4), (4,4): derived by hand, checked below
      // against central differences of dphi
      model.curvature = (t, phi, d2) => {
        for (let i = 0; i < n; i++) {
          d2[i] = x[i]! * x[i]! * phi[i]!;
          for (let g = 0; g < 2; g++) {
            const c = t[1 + 2 * g]!, w = t[2 + 2 * g]!, d = x[i]! - c, v = phi[(1 + g) * n + i]!;
            const w2 = w * w, u = (d * d) / w2;
            d2[(1 + 3 * g) * n + i] = (2 * v / w2) * (2 * u - 1);
            d2[(2 + 3 * g) * n + i] = (4 * d * v / (w2 * w)) * (u - 1);
            d2[(3 + 3 * g) * n + i] = (2 * u * v / w2) * (2 * u - 3);
          }
        }
      };
    }
    return model;
  };
  const fitFrom = (start: readonly number[], withCurvature: boolean) =>
    variableProjection(
      GAUSS1_Y,
      gauss1(withCurvature),
      Float64Array.from([start[1]!, start[3]!, start[4]!, start[6]!, start[7]!]),
      { tolerance: 1e-14, maxIterations: 500 },
    );

  it("the Gauss1 second derivatives agree with central differences of the first", () => {
    const model = gauss1(true);
    const t = Float64Array.from([0.0105, 67.5, 23.1, 179, 18.4]);
    const pairs = [[0, 0], [1, 1], [1, 2], [2, 2], [3, 3], [3, 4], [4, 4]];
    for (const { worst, scale } of curvatureAgreement(model, t, pairs, n)) {
      expect(worst).toBeLessThan(1e-6 * scale);
    }
  });

  it("Gauss1 (NIST StRD) from both NIST starts: certified b1…b8 and RSS, with and without the Newton steps", () => {
    for (const start of GAUSS1_STARTS) {
      for (const withCurvature of [false, true]) {
        const r = fitFrom(start, withCurvature);
        expect(r.converged).toBe(true);
        const b = [r.linear[0]!, ...[0, 1, 2, 3, 4].map((k) => r.nonlinear[k]!)];
        const order = [0, 1, 3, 4, 6, 7]; // b1 and the nonlinear b's
        order.forEach((certifiedIndex, k) => {
          expect(b[k]! / GAUSS1_CERTIFIED[certifiedIndex]!).toBeCloseTo(1, 7);
        });
        expect(r.linear[1]! / GAUSS1_CERTIFIED[2]!).toBeCloseTo(1, 7);
        expect(r.linear[2]! / GAUSS1_CERTIFIED[5]!).toBeCloseTo(1, 7);
        expect(r.rss / GAUSS1_CERTIFIED_RSS).toBeCloseTo(1, 9);
      }
    }
  });

  it("Newton steps reach the optimum in fewer iterations than LM alone, on Gauss1 and Misra1a", () => {
    for (const start of GAUSS1_STARTS) {
      expect(fitFrom(start, true).iterations).toBeLessThan(fitFrom(start, false).iterations);
    }
    const misra = (withCurvature: boolean): SeparableModel => ({
      linearCount: 1,
      columnOf: [0],
      basis: (t, phi, dphi) => {
        MISRA_X.forEach((v, i) => {
          const e = Math.exp(-t[0]! * v);
          phi[i] = 1 - e;
          if (dphi) dphi[i] = v * e;
        });
      },
      ...(withCurvature
        ? {
          curvature: (t: Float64Array, _phi: Float64Array, d2: Float64Array) => {
            MISRA_X.forEach((v, i) => (d2[i] = -v * v * Math.exp(-t[0]! * v)));
          },
        }
        : {}),
    });
    // bounds as LM treats them: held where the optimum lies beyond the bound, free where it
    // lies inside, however close (the certified b2 is 5.5015643181e-4)
    const beyond = variableProjection(MISRA_Y, misra(true), Float64Array.of(1e-4), {
      upper: [4e-4],
    });
    expect(beyond.held[0]).toBe(true);
    expect(beyond.nonlinear[0]).toBe(4e-4);
    for (const [lower, start] of [[5.5e-4, 7e-4], [5.5015e-4, 2e-3], [5.4e-4, 5.4e-4]]) {
      const inside = variableProjection(MISRA_Y, misra(true), Float64Array.of(start!), {
        lower: [lower!],
        tolerance: 1e-15,
      });
      expect(inside.held[0]).toBe(false);
      expect(inside.nonlinear[0]! / 5.5015643181e-4).toBeCloseTo(1, 9);
    }
    for (const b2 of [1e-4, 5e-4]) {
      const plain = variableProjection(MISRA_Y, misra(false), Float64Array.of(b2), {
        tolerance: 1e-15,
      });
      const newton = variableProjection(MISRA_Y, misra(true), Float64Array.of(b2), {
        tolerance: 1e-15,
      });
      expect(newton.nonlinear[0]! / 5.5015643181e-4).toBeCloseTo(1, 9);
      expect(newton.rss / 1.2455138894e-1).toBeCloseTo(1, 9);
      expect(newton.iterations).toBeLessThanOrEqual(plain.iterations);
    }
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { deltaE2000 as publicDeltaE2000 } from "../../lib/mod.ts";
import { deltaE2000, deltaE76, deltaE94, deltaECmc, xyzToLab } from "../../lib/cie/mod.ts";

// Sharma, Wu & Dalal (2005), Color Res. Appl. 30(1):21–30, Table 1 (kL = kC = kH = 1).
const SHARMA: number[][] = [
  [50, 2.6772, -79.7751, 50, 0, -82.7485, 2.0425],
  [50, 3.1571, -77.2803, 50, 0, -82.7485, 2.8615],
  [50, 2.8361, -74.02, 50, 0, -82.7485, 3.4412],
  [50, -1.3802, -84.2814, 50, 0, -82.7485, 1.0],
  [50, -1.1848, -84.8006, 50, 0, -82.7485, 1.0],
  [50, -0.9009, -85.5211, 50, 0, -82.7485, 1.0],
  [50, 0, 0, 50, -1, 2, 2.3669],
  [50, -1, 2, 50, 0, 0, 2.3669],
  [50, 2.49, -0.001, 50, -2.49, 0.0009, 7.1792],
  [50, 2.49, -0.001, 50, -2.49, 0.001, 7.1792],
  [50, 2.49, -0.001, 50, -2.49, 0.0011, 7.2195],
  [50, 2.49, -0.001, 50, -2.49, 0.0012, 7.2195],
  [50, -0.001, 2.49, 50, 0.0009, -2.49, 4.8045],
  [50, -0.001, 2.49, 50, 0.001, -2.49, 4.8045],
  [50, -0.001, 2.49, 50, 0.0011, -2.49, 4.7461],
  [50, 2.5, 0, 50, 0, -2.5, 4.3065],
  [50, 2.5, 0, 73, 25, -18, 27.1492],
  [50, 2.5, 0, 61, -5, 29, 22.8977],
  [50, 2.5, 0, 56, -27, -3, 31.903],
  [50, 2.5, 0, 58, 24, 15, 19.4535],
  [50, 2.5, 0, 50, 3.1736, 0.5854, 1.0],
  [50, 2.5, 0, 50, 3.2972, 0, 1.0],
  [50, 2.5, 0, 50, 1.8634, 0.5757, 1.0],
  [50, 2.5, 0, 50, 3.2592, 0.335, 1.0],
  [60.2574, -34.0099, 36.2677, 60.4626, -34.1751, 39.4387, 1.2644],
  [63.0109, -31.0961, -5.8663, 62.8187, -29.7946, -4.0864, 1.263],
  [61.2901, 3.7196, -5.3901, 61.4292, 2.248, -4.962, 1.8731],
  [35.0831, -44.1164, 3.7933, 35.0232, -40.0716, 1.5901, 1.8645],
  [22.7233, 20.0904, -46.694, 23.0331, 14.973, -42.5619, 2.0373],
  [36.4612, 47.858, 18.3852, 36.2715, 50.5065, 21.2231, 1.4146],
  [90.8027, -2.0831, 1.441, 91.1528, -1.6435, 0.0447, 1.4441],
  [90.9257, -0.5406, -0.9208, 88.6381, -0.8985, -0.7239, 1.5381],
  [6.7747, -0.2908, -2.4247, 5.8714, -0.0985, -2.2286, 0.6377],
  [2.0776, 0.0795, -1.135, 0.9033, -0.0636, -0.5514, 0.9082],
];

const lab = (L: number, a: number, b: number) => ({ L, a, b });

describe("deltaE2000()", () => {
  SHARMA.forEach((p, i) => {
    it(`matches Sharma et al. (2005) pair ${i + 1} within 1e-4, both orders`, () => {
      const l1 = lab(p[0]!, p[1]!, p[2]!), l2 = lab(p[3]!, p[4]!, p[5]!);
      expect(Math.abs(deltaE2000(l1, l2) - p[6]!)).toBeLessThan(1e-4);
      expect(Math.abs(deltaE2000(l2, l1) - p[6]!)).toBeLessThan(1e-4);
    });
  });

  it("is exported from lib/mod.ts taking {L, a, b}", () => {
    expect(publicDeltaE2000(lab(50, 2.5, 0), lab(50, 0, -2.5))).toBeCloseTo(4.3065, 4);
  });

  it("identity: ΔE00(x, x) = 0", () => {
    expect(deltaE2000(lab(40, 30, -20), lab(40, 30, -20))).toBe(0);
  });

  it("XYZ → Lab → ΔE00 chain reproduces Sharma pairs 25 and 33 (CIE 142 / Luo, Cui & Rigg 2001, D65/10°)", () => {
    const white = { X: 94.811, Y: 100, Z: 107.304 };
    const p25 = deltaE2000(
      xyzToLab({ X: 19.41, Y: 28.41, Z: 11.5766 }, white),
      xyzToLab({ X: 19.5525, Y: 28.64, Z: 10.5791 }, white),
    );
    expect(Math.abs(p25 - 1.2644)).toBeLessThan(2e-3);
    const p33 = deltaE2000(
      xyzToLab({ X: 0.704, Y: 0.75, Z: 0.972 }, white),
      xyzToLab({ X: 0.613873, Y: 0.65, Z: 0.851025 }, white),
    );
    expect(Math.abs(p33 - 0.6377)).toBeLessThan(2e-3);
  });
});

describe("ΔE*ab, CIE94 and CMC(l:c)", () => {
  const ref = JSON.parse(
    Deno.readTextFileSync(new URL("../fixtures/colormath/reference.json", import.meta.url)),
  ) as {
    pairs: {
      lab1: number[];
      lab2: number[];
      dE76: number;
      dE94: number;
      cmc21: number;
      cmc11: number;
    }[];
  };

  it("match python3-colormath on 40 pairs within 1e-9 relative", () => {
    for (const p of ref.pairs) {
      const l1 = lab(p.lab1[0]!, p.lab1[1]!, p.lab1[2]!),
        l2 = lab(p.lab2[0]!, p.lab2[1]!, p.lab2[2]!);
      expect(deltaE76(l1, l2)).toBeCloseTo(p.dE76, 9);
      expect(deltaE94(l1, l2)).toBeCloseTo(p.dE94, 9);
      expect(deltaECmc(l1, l2, 2, 1)).toBeCloseTo(p.cmc21, 9);
      expect(deltaECmc(l1, l2, 1, 1)).toBeCloseTo(p.cmc11, 9);
    }
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { deltaE2000 as publicDeltaE2000 } from "../../lib/mod.ts";
import {
  deltaE2000,
  deltaE2000Many,
  deltaE76,
  deltaE94,
  deltaECmc,
  xyzToLab,
} from "../../lib/cie/mod.ts";
import {
  fillRotationTable,
  ROTATION_COEFFICIENTS,
  ROTATION_HALF_PER_UNIT,
  ROTATION_PIECES,
  ROTATION_SIDE_MASK,
  ROTATION_STRIDE,
  ROTATION_X0,
} from "../../lib/cie/_ciede2000_rotation.ts";

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

/**
 * Independent route: a literal implementation of Sharma, Wu & Dalal (2005) eq. 1–25 with one
 * trigonometric call per angle (the construction used before the allocation-free core).
 */
function literalDeltaE2000(
  l1: { L: number; a: number; b: number },
  l2: typeof l1,
  kL = 1,
  kC = 1,
  kH = 1,
): number {
  const DEG = Math.PI / 180;
  const c1 = Math.hypot(l1.a, l1.b), c2 = Math.hypot(l2.a, l2.b);
  const cBar7 = ((c1 + c2) / 2) ** 7;
  const g = 0.5 * (1 - Math.sqrt(cBar7 / (cBar7 + 25 ** 7)));
  const a1 = (1 + g) * l1.a, a2 = (1 + g) * l2.a;
  const cp1 = Math.hypot(a1, l1.b), cp2 = Math.hypot(a2, l2.b);
  const hue = (a: number, b: number) => {
    if (a === 0 && b === 0) return 0;
    const h = Math.atan2(b, a) / DEG;
    return h < 0 ? h + 360 : h;
  };
  const hp1 = hue(a1, l1.b), hp2 = hue(a2, l2.b);
  let dhp = 0;
  if (cp1 * cp2 !== 0) {
    dhp = hp2 - hp1;
    if (dhp > 180) dhp -= 360;
    else if (dhp < -180) dhp += 360;
  }
  const dHp = 2 * Math.sqrt(cp1 * cp2) * Math.sin((dhp / 2) * DEG);
  const lBar = (l1.L + l2.L) / 2, cBarP = (cp1 + cp2) / 2;
  let hBarP = hp1 + hp2;
  if (cp1 * cp2 !== 0) {
    if (Math.abs(hp1 - hp2) <= 180) hBarP = (hp1 + hp2) / 2;
    else hBarP = hp1 + hp2 < 360 ? (hp1 + hp2 + 360) / 2 : (hp1 + hp2 - 360) / 2;
  }
  const t = 1 - 0.17 * Math.cos((hBarP - 30) * DEG) + 0.24 * Math.cos(2 * hBarP * DEG) +
    0.32 * Math.cos((3 * hBarP + 6) * DEG) - 0.2 * Math.cos((4 * hBarP - 63) * DEG);
  const dTheta = 30 * Math.exp(-(((hBarP - 275) / 25) ** 2));
  const rC = 2 * Math.sqrt(cBarP ** 7 / (cBarP ** 7 + 25 ** 7));
  const l50 = (lBar - 50) ** 2;
  const sL = 1 + (0.015 * l50) / Math.sqrt(20 + l50);
  const sC = 1 + 0.045 * cBarP, sH = 1 + 0.015 * cBarP * t;
  const rT = -Math.sin(2 * dTheta * DEG) * rC;
  const tl = (l2.L - l1.L) / (kL * sL), tc = (cp2 - cp1) / (kC * sC), th = dHp / (kH * sH);
  return Math.sqrt(tl * tl + tc * tc + th * th + rT * tc * th);
}

/** Seeded uniform numbers (mulberry32), so a failure can be replayed. */
function seeded(seed: number) {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = Math.imul(s ^ (s >>> 15), 1 | s);
    t = (t + Math.imul(t ^ (t >>> 7), 61 | t)) ^ t;
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Pairs that stress the hue terms: general, Δh′ near 180°, mean hue near 0°/360° and 275°. */
function stressPairs(count: number) {
  const rnd = seeded(20260512);
  const polar = (L: number, c: number, hDeg: number) => ({
    L,
    a: c * Math.cos((hDeg * Math.PI) / 180),
    b: c * Math.sin((hDeg * Math.PI) / 180),
  });
  const pairs: [{ L: number; a: number; b: number }, { L: number; a: number; b: number }][] = [];
  for (let i = 0; i < count; i++) {
    const L1 = 100 * rnd(), L2 = 100 * rnd(), c1 = 120 * rnd() ** 2, c2 = 120 * rnd() ** 2;
    const h1 = 360 * rnd();
    const kind = i % 6;
    const h2 = kind === 0
      ? 360 * rnd()
      : kind === 1
      ? h1 + 180 + (rnd() - 0.5) * 1e-6 * 10 ** (-6 * rnd())
      : kind === 2
      ? -h1 + (rnd() - 0.5) * 1e-5 // mean hue at 0°/360°
      : kind === 3
      ? 550 - h1 + (rnd() - 0.5) * 20 // mean hue near 275°
      : kind === 4
      ? h1 + (rnd() - 0.5) * 1e-9 // nearly equal hues
      : h1 + 180 * (rnd() < 0.5 ? 1 : -1) + (rnd() - 0.5) * 60;
    const p1 = polar(L1, c1, h1), p2 = polar(L2, c2, h2);
    if (i % 50 === 0) p1.a = p1.b = 0; // neutral
    if (i % 77 === 0) p2.b = 0;
    pairs.push([p1, p2]);
  }
  return pairs;
}

describe("deltaE2000() allocation-free core", () => {
  it("equals the literal implementation of Sharma et al. (2005) eq. 1–25 within 1e-9 on 120,000 seeded pairs", () => {
    let worst = 0;
    for (const [p1, p2] of stressPairs(120_000)) {
      for (const [x, y] of [[p1, p2], [p2, p1]] as const) {
        worst = Math.max(worst, Math.abs(deltaE2000(x, y) - literalDeltaE2000(x, y)));
      }
    }
    expect(worst).toBeLessThan(1e-9);
  });

  it("equals the literal implementation on every Sharma et al. (2005) pair within 1e-12", () => {
    for (const p of SHARMA) {
      const l1 = lab(p[0]!, p[1]!, p[2]!), l2 = lab(p[3]!, p[4]!, p[5]!);
      expect(Math.abs(deltaE2000(l1, l2) - literalDeltaE2000(l1, l2))).toBeLessThan(1e-12);
    }
  });

  it("parametric factors: kL = 2 halves the lightness term (Sharma et al. eq. 22), pure ΔL gives ΔL/(2·SL)", () => {
    // closed form: equal a, b → ΔE00 = |ΔL′| / (kL·SL), SL = 1 + 0.015 (L̄ − 50)² / √(20 + (L̄ − 50)²)
    const d = deltaE2000(lab(40, 10, 10), lab(60, 10, 10), { kL: 2 });
    expect(d).toBeCloseTo(20 / 2, 12);
  });
});

/**
 * A million seeded pairs, a tenth of them of each kind: tolerancing pairs, any two colours, and
 * pairs on the branch edges of the formula and of the core (neutral colours, |Δh′| near 180° and
 * near the core's 151° switch, mean hue near 0°/360°, near 275°, at the edge where the rotation
 * term vanishes (275° − 25°·√40) and near 85°/265°, equal hues).
 */
function edgePairs(count: number) {
  const rnd = seeded(20261202);
  const polar = (L: number, c: number, hDeg: number) => ({
    L,
    a: c * Math.cos((hDeg * Math.PI) / 180),
    b: c * Math.sin((hDeg * Math.PI) / 180),
  });
  const near = (scale: number) => (rnd() - 0.5) * scale * 10 ** (-12 * rnd());
  const farEdge = 275 - 25 * Math.sqrt(40);
  const pairs: [{ L: number; a: number; b: number }, { L: number; a: number; b: number }][] = [];
  for (let i = 0; i < count; i++) {
    const L1 = 100 * rnd(), L2 = 100 * rnd(), c1 = 130 * rnd() ** 2, c2 = 130 * rnd() ** 2;
    const h1 = 360 * rnd();
    let p = polar(L1, c1, h1), q: typeof p;
    switch (i % 10) {
      case 0: {
        p = { L: 100 * rnd(), a: 256 * rnd() - 128, b: 256 * rnd() - 128 };
        q = { L: p.L + 8 * rnd() - 4, a: p.a + 12 * rnd() - 6, b: p.b + 12 * rnd() - 6 };
        break;
      }
      case 1:
        q = polar(L2, c2, 360 * rnd());
        break;
      case 2:
        q = polar(L2, c2, h1 + 180 + near(1)); // |Δh′| ≈ 180°
        break;
      case 3:
        q = polar(L2, c2, -h1 + near(10)); // h̄′ ≈ 0°/360°
        break;
      case 4:
        q = polar(L2, c2, 550 - h1 + (rnd() - 0.5) * 40); // h̄′ near 275°
        break;
      case 5:
        q = polar(L2, c2, 2 * farEdge - h1 + near(1)); // h̄′ at the rotation term's far edge
        break;
      case 6:
        q = polar(L2, c2, h1 + near(1)); // equal hues
        break;
      case 7: // neutral or nearly neutral
        p = polar(L1, rnd() < 0.5 ? 0 : c1 * 1e-6 * rnd(), h1);
        q = polar(L2, rnd() < 0.3 ? 0 : c2, 360 * rnd());
        break;
      case 8:
        q = polar(L2, c2, h1 + 180 * (rnd() < 0.5 ? 1 : -1) + (rnd() - 0.5) * 70); // |Δh′| ≈ 151°
        break;
      default:
        q = polar(L2, c2, 170 - h1 + near(10)); // h̄′ ≈ 85° or 265°
    }
    if (i % 97 === 0) p.b = 0;
    if (i % 89 === 0) q.a = 0;
    pairs.push(i % 2 ? [q, p] : [p, q]);
  }
  return pairs;
}

describe("deltaE2000() on the branch edges", () => {
  it("equals the literal implementation of Sharma et al. (2005) eq. 1–25 within 1e-12 on 1,000,000 seeded pairs", () => {
    let worst = 0;
    for (const [p1, p2] of edgePairs(1_000_000)) {
      worst = Math.max(worst, Math.abs(deltaE2000(p1, p2) - literalDeltaE2000(p1, p2)));
    }
    expect(worst).toBeLessThan(1e-12);
  });

  it("with parametric factors equals the literal implementation within 1e-12 on 20,000 pairs", () => {
    const rnd = seeded(7);
    let worst = 0;
    for (const [p1, p2] of edgePairs(20_000)) {
      const kL = 0.5 + 2 * rnd(), kC = 0.5 + 2 * rnd(), kH = 0.5 + 2 * rnd();
      const d = deltaE2000(p1, p2, { kL, kC, kH });
      worst = Math.max(worst, Math.abs(d - literalDeltaE2000(p1, p2, kL, kC, kH)));
    }
    expect(worst).toBeLessThan(1e-12);
  });

  it("the rotation term's hue factor table equals sin(2Δθ) of Sharma et al. (2005) eq. 18 within 1e-15", () => {
    // Evaluated here by Horner's rule on the stored coefficients, as 1 − cos(h̄′ − 275°) = v.
    fillRotationTable();
    const perUnit = 2 * ROTATION_HALF_PER_UNIT;
    let worst = 0;
    for (let k = 0; k < 200_000; k++) {
      // 90° … 360° (the core takes h̄′ within 1e-6° of 360° from the literal branches)
      const hBar = 90 + ((270 - 1e-6) * k) / 200_000;
      const v = 1 - Math.cos(((hBar - 275) * Math.PI) / 180);
      const x = v * perUnit + ROTATION_X0, piece = Math.floor(x), w = x - piece - 0.5;
      let poly = 0;
      for (let j = ROTATION_STRIDE - 1; j >= 0; j--) {
        poly = poly * w + ROTATION_COEFFICIENTS[piece * ROTATION_STRIDE + j]!;
      }
      const side = hBar >= 275 ? 1 : 0;
      const table = poly * ROTATION_SIDE_MASK[side * ROTATION_PIECES + piece]!;
      const dTheta = 30 * Math.exp(-(((hBar - 275) / 25) ** 2));
      // eq. 18; zero where h̄′ − 275° < −25·√40 (below 1e-16°), as the core does
      const published = hBar - 275 < -25 * Math.sqrt(40)
        ? 0
        : Math.sin((2 * dTheta * Math.PI) / 180);
      worst = Math.max(worst, Math.abs(table - published));
    }
    expect(worst).toBeLessThan(1e-15);
  });
});

describe("deltaE2000Many()", () => {
  it("gives the Sharma et al. (2005) Table 1 values and equals deltaE2000 pair by pair", () => {
    const l1 = new Float64Array(SHARMA.length * 3), l2 = new Float64Array(SHARMA.length * 3);
    SHARMA.forEach((p, i) => {
      l1.set([p[0]!, p[1]!, p[2]!], 3 * i);
      l2.set([p[3]!, p[4]!, p[5]!], 3 * i);
    });
    const out = deltaE2000Many(l1, l2, new Float64Array(SHARMA.length));
    SHARMA.forEach((p, i) => {
      expect(Math.abs(out[i]! - p[6]!)).toBeLessThan(1e-4);
      expect(out[i]).toBe(deltaE2000(lab(p[0]!, p[1]!, p[2]!), lab(p[3]!, p[4]!, p[5]!)));
    });
  });

  it("refuses lengths that are not equal multiples of 3 and a short output", () => {
    expect(() => deltaE2000Many(new Float64Array(4), new Float64Array(4))).toThrow(RangeError);
    expect(() => deltaE2000Many(new Float64Array(6), new Float64Array(3))).toThrow(RangeError);
    expect(() => deltaE2000Many(new Float64Array(6), new Float64Array(6), new Float64Array(1)))
      .toThrow(RangeError);
  });
});

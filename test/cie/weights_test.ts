import { describe, it } from "node:test";
import { expect } from "expect";
import {
  chooseMethod,
  GRID_LENGTH,
  type InterpolationMethod,
  resampleAdjoint,
  resampleTo1nm,
  transmittanceToXyz,
  tristimulusWeights,
} from "../../lib/cie/mod.ts";

const grid = (start: number, end: number, step: number) =>
  Float64Array.from({ length: Math.round((end - start) / step) + 1 }, (_, i) => start + i * step);

/**
 * The independent route (the construction used before the linear form): resample a unit
 * impulse at each data point and weight the 1 nm result — quadratic time, kept here as a check.
 */
function impulseWeights(nm: Float64Array, factors: ArrayLike<number>, method: InterpolationMethod) {
  const n = nm.length;
  const w = new Float64Array(n);
  const unit = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    unit.fill(0);
    unit[k] = 1;
    const r = resampleTo1nm(nm, unit, method).values;
    let s = 0;
    for (let g = 0; g < GRID_LENGTH; g++) if (r[g] !== 0) s += r[g]! * factors[g]!;
    w[k] = s;
  }
  return w;
}

// Grids as exported by instruments: uniform 0.5–20 nm, partial and over-wide ranges, odd starts.
const GRIDS: [string, Float64Array][] = [
  ["1 nm 360–830", grid(360, 830, 1)],
  ["1 nm 380–780", grid(380, 780, 1)],
  ["0.5 nm 380.5–779.5", grid(380.5, 779.5, 0.5)],
  ["2 nm 300–1100", grid(300, 1100, 2)],
  ["5 nm 380–780", grid(380, 780, 5)],
  ["5 nm 400–700", grid(400, 700, 5)],
  ["10 nm 360–830", grid(360, 830, 10)],
  ["10 nm 400–700", grid(400, 700, 10)],
  ["10 nm 500–520 (three points)", grid(500, 520, 10)],
  ["20 nm 380–780", grid(380, 780, 20)],
  ["3.3 nm 371.2–799.9 (Sprague, off-integer)", grid(371.2, 799.9, 3.3)],
  ["two points 450, 650 (linear)", Float64Array.of(450, 650)],
];

describe("tristimulusWeights() from the interpolation's linear form", () => {
  for (const [name, nm] of GRIDS) {
    it(`${name}: equals the impulse-response construction within 1e-12 (${chooseMethod(nm)})`, () => {
      for (const [ill, obs] of [["D65", "2"], ["A", "10"], ["F11", "2"]] as const) {
        const w = tristimulusWeights(nm, ill, obs);
        for (const [fast, factors] of [[w.wx, w.gridX], [w.wy, w.gridY], [w.wz, w.gridZ]]) {
          const slow = impulseWeights(nm, factors!, w.method);
          for (let k = 0; k < nm.length; k++) {
            expect(Math.abs(fast![k]! - slow[k]!)).toBeLessThan(1e-12);
          }
        }
      }
    });
  }

  it("linear method on an irregular grid equals the impulse-response construction within 1e-12", () => {
    const nm = Float64Array.of(355.5, 381.2, 399, 430.7, 431.1, 502, 610.9, 700, 845);
    const factors = tristimulusWeights(grid(360, 830, 1), "D65", "2").gridY;
    const fast = resampleAdjoint(nm, factors, "linear");
    const slow = impulseWeights(nm, factors, "linear");
    for (let k = 0; k < nm.length; k++) expect(Math.abs(fast[k]! - slow[k]!)).toBeLessThan(1e-12);
  });

  it("refuses PCHIP, which is not linear in the data", () => {
    expect(() => resampleAdjoint(grid(380, 780, 5), new Float64Array(GRID_LENGTH), "pchip"))
      .toThrow(RangeError);
  });

  it("a 200,000-point export (Sprague) gives the white of the perfect transmitter and the same colour as its 1 nm subset", () => {
    // identity: weights sum to the white; a smooth curve at 0.00235 nm and at 1 nm agree
    const nm = grid(360, 830, 470 / 199_999);
    expect(nm.length).toBe(200_000);
    const curve = (x: number) =>
      0.55 + 0.4 * Math.sin(x / 31) * Math.exp(-(((x - 560) / 150) ** 2));
    const w = tristimulusWeights(nm, "D65", "2");
    expect(w.method).toBe("sprague");
    expect(
      Math.abs(transmittanceToXyz(nm, new Float64Array(nm.length).fill(1), "D65", "2").Y - 100),
    )
      .toBeLessThan(1e-9);
    const fine = transmittanceToXyz(nm, nm.map(curve), "D65", "2");
    const nm1 = grid(360, 830, 1);
    const coarse = transmittanceToXyz(nm1, nm1.map(curve), "D65", "2");
    expect(Math.abs(fine.X - coarse.X)).toBeLessThan(1e-3);
    expect(Math.abs(fine.Y - coarse.Y)).toBeLessThan(1e-3);
    expect(Math.abs(fine.Z - coarse.Z)).toBeLessThan(1e-3);
  });

  it("a 200,000-point irregular pixel grid (PCHIP) resamples per spectrum and gives the white", () => {
    const nm = Float64Array.from(
      { length: 200_000 },
      (_, i) => 340 + i * 0.0026 + 1e-4 * Math.sin(i),
    );
    const w = tristimulusWeights(nm, "A", "10");
    expect(w.method).toBe("pchip");
    const white = transmittanceToXyz(nm, new Float64Array(nm.length).fill(1), "A", "10");
    expect(Math.abs(white.Y - 100)).toBeLessThan(1e-9);
  });
});

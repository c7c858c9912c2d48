import { describe, it } from "node:test";
import { expect } from "expect";
import { assignBands, BAND_CATALOGUE, type FittedBand } from "../../lib/bands/mod.ts";

function band(centerCm1: number, fwhmCm1: number): FittedBand {
  return {
    shape: "gaussian",
    centerCm1,
    centerCm1Sigma: 20,
    centerNm: 1e7 / centerCm1,
    centerNmSigma: (1e7 / centerCm1 ** 2) * 20,
    fwhmCm1,
    fwhmCm1Sigma: 50,
    height: 1,
    heightSigma: 0.01,
    area: fwhmCm1,
    areaSigma: 10,
  };
}

describe("band catalogue", () => {
  it("labels never repeat a word (no 'Fe3+ pair pair band')", () => {
    for (const e of BAND_CATALOGUE) {
      expect(`${e.ion} ${e.transition}`).not.toMatch(/\b(\w+) \1\b/);
    }
  });
  it("the Fe2+–Ti4+ charge transfer has one entry per polarisation, E∥c inside its own 700–720 nm note", () => {
    const feTi = BAND_CATALOGUE.filter((e) => e.ion === "Fe2+–Ti4+");
    const e = feTi.find((x) => x.ray === "e")!, o = feTi.find((x) => x.ray === "o")!;
    expect(1e7 / e.centerCm1).toBeGreaterThanOrEqual(700);
    expect(1e7 / e.centerCm1).toBeLessThanOrEqual(720);
    expect(1e7 / o.centerCm1).toBeGreaterThanOrEqual(565);
    expect(1e7 / o.centerCm1).toBeLessThanOrEqual(580);
  });
});

describe("assignBands()", () => {
  it("a from-memory entry never makes a hint on its own: a lone 14,100 cm⁻¹ band in an E∥c corundum spectrum gets no Fe2+–Ti4+ hint", () => {
    const a = assignBands([band(14100, 4500)], "corundum", 3, "e");
    expect(a.some((x) => x.status !== "published")).toBe(false);
    expect(a.some((x) => x.ion === "Fe2+–Ti4+")).toBe(false);
  });
  it("with the published Fe2+–Ti4+ band present, the broad band near 14,100 cm⁻¹ is hinted as its E∥c component, said to be from memory", () => {
    const a = assignBands([band(17700, 4500), band(14100, 4500)], "corundum");
    const top = a.filter((x) => x.bandIndex === 1)[0]!;
    expect(top.ion).toBe("Fe2+–Ti4+");
    expect(top.transition).toMatch(/E∥c/);
    expect(top.reason).toMatch(/from memory/);
  });
  it("the Ti3+ shoulder near 560 nm is hinted only beside the 490 nm band (Moulton et al. 2019)", () => {
    const withMain = assignBands([band(20400, 5000), band(17860, 3500)], "corundum");
    expect(withMain.some((x) => x.bandIndex === 1 && /upper component/.test(x.transition))).toBe(
      true,
    );
    const alone = assignBands([band(17860, 3500)], "corundum");
    expect(alone.some((x) => /upper component/.test(x.transition))).toBe(false);
  });
  it("entries for the other ray are left out of a polarised spectrum", () => {
    const a = assignBands([band(17700, 4500), band(14100, 4500)], "corundum", 5, "o");
    expect(a.some((x) => /E∥c/.test(x.transition))).toBe(false);
  });
});

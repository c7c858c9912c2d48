import { describe, it } from "node:test";
import { expect } from "expect";

describe("your own dispersion", () => {
  it("parseSellmeier reads B:C coefficients and reproduces the corundum o index", async () => {
    const { parseSellmeier, dispersionIndex } = await import("../../lib/optics/mod.ts");
    const d = parseSellmeier("1.4313493,0.65054713,5.3414021:0.0726631,0.1193242,18.028251");
    expect(dispersionIndex(d, 589.3)).toBeCloseTo(1.76808, 4);
    expect(() => parseSellmeier("1,2:3")).toThrow(SyntaxError);
  });
});

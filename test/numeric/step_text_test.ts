import { describe, it } from "node:test";
import { expect } from "expect";
import fc from "fast-check";
import { integersToText, textToIntegers } from "../../lib/numeric/step_text.ts";

describe("integers as step text (lib/numeric/step_text.ts)", () => {
  it("property: any list of safe integers comes back exactly (fast-check, seeded)", () => {
    fc.assert(
      fc.property(fc.array(fc.oneof(fc.integer(), fc.maxSafeInteger().map((v) => -v / 2))), (v) => {
        const ints = v.map((x) => Math.trunc(x));
        expect(textToIntegers(integersToText(ints))).toEqual(ints.map((x) => x || 0));
      }),
      { seed: 13, numRuns: 500 },
    );
  });

  it("uses one character below 16 either way, two below 512, and only URL-safe characters", () => {
    // the zig-zag map (0, −1, 1, −2 … → 0, 1, 2, 3 …) then 5 bits a character, as the module says
    expect(integersToText([0, -1, 1, 15, -16]).length).toBe(5);
    expect(integersToText([16, -17, 511, -512]).length).toBe(8);
    expect(integersToText([512]).length).toBe(3);
    expect(integersToText([0, -1, 1, 2])).toBe("ABCE");
    expect(integersToText([-1e12, 1e12, 123456789])).toMatch(/^[A-Za-z0-9_-]+$/);
  });

  it("refuses what is not a safe integer, and text that is not step text", () => {
    expect(() => integersToText([0.5])).toThrow(RangeError);
    expect(() => integersToText([2 ** 53])).toThrow(RangeError);
    expect(() => textToIntegers("AB+")).toThrow(/character "\+" at 2/);
    expect(() => textToIntegers("Ag")).toThrow(/ends inside a number/);
  });
});

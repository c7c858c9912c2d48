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

  it("writes each number in the width that makes the list shortest, six bits a character", () => {
    // 100 zeros: width 1, 100 bits → 17 characters after the width character
    expect(integersToText(new Array(100).fill(0)).length).toBe(1 + 17);
    // numbers −4 … 3 (zig-zag 0 … 7, all below the escape 2³ − 1 but 7): width 3 or 4
    const small = Array.from({ length: 60 }, (_, i) => (i % 7) - 3);
    expect(integersToText(small).length).toBe(1 + Math.ceil((60 * 3) / 6));
    // one large number among small ones takes the escape, the list keeps its small width
    expect(integersToText([...small, 1e9]).length).toBeLessThan(1 + 31 + 5 + 12);
    expect(textToIntegers(integersToText([...small, 1e9]))).toEqual([...small, 1e9]);
    expect(integersToText([0, -1, 1, 2])).toBe("DBU"); // width 3: 000 001 010 100
    expect(integersToText([-1e12, 1e12, 123456789])).toMatch(/^[A-Za-z0-9_-]+$/);
    expect(textToIntegers("")).toEqual([]);
  });

  it("refuses what is not a safe integer, and text that is not step text", () => {
    expect(() => integersToText([0.5])).toThrow(RangeError);
    expect(() => integersToText([2 ** 53])).toThrow(RangeError);
    expect(() => textToIntegers("AB+")).toThrow(/character "\+" at 2/);
    // width 1, an escape, a length of 10 and only 5 bits left
    expect(() => textToIntegers("Blf")).toThrow(/ends mid-number/);
    expect(() => textToIntegers("_A")).toThrow(/width 63/);
  });
});

describe("the width chosen for step text", () => {
  /** The bits of a list at width w, counted number by number from the module note. */
  const bitsAt = (zigzag: number[], w: number) => {
    const length = (z: number) => z === 0 ? 0 : z.toString(2).length;
    const escape = 2 ** w - 1;
    return zigzag.reduce((b, z) => b + (z < escape ? w : w + 6 + length(z - escape)), 0);
  };
  const zigzag = (v: number[]) => v.map((x) => x >= 0 ? 2 * x : -2 * x - 1);
  it("property: the width is the narrowest of the shortest, as counting every width gives (fast-check, seeded)", () => {
    // numbers near powers of two (all ones, one past) are where the count per width turns
    const near = fc.tuple(fc.integer({ min: 0, max: 40 }), fc.integer({ min: -2, max: 2 }))
      .map(([e, d]) => Math.trunc((2 ** e + d) / 2) * (e % 2 ? 1 : -1));
    fc.assert(
      fc.property(
        fc.array(fc.oneof(near, fc.integer({ min: -300, max: 300 }), fc.integer()), {
          minLength: 1,
          maxLength: 60,
        }),
        (v) => {
          const z = zigzag(v);
          const longest = Math.max(1, ...z.map((x) => x.toString(2).length * (x > 0 ? 1 : 0)));
          let width = 1, bits = Infinity;
          for (let w = 1; w <= Math.min(24, longest); w++) {
            const b = bitsAt(z, w);
            if (b < bits) [width, bits] = [w, b];
          }
          const text = integersToText(v);
          expect(text.charCodeAt(0) - 65).toBe(width); // widths below 26 are A…Z
          expect(text.length).toBe(1 + Math.ceil(bits / 6));
        },
      ),
      { seed: 29, numRuns: 2000 },
    );
  });
});

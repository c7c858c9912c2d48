import { describe, it } from "node:test";
import { expect } from "expect";
import Color from "color";
import { hexOf } from "../../lib/cie/swatch.ts";

describe("hexOf", () => {
  it("writes what the color package writes (lower case) for every byte on each channel", () => {
    // reference: color@5 (Color.rgb(bytes).hex()), the formatter the swatches used before
    for (let v = 0; v < 256; v++) {
      for (const bytes of [[v, 0, 0], [0, v, 0], [0, 0, v], [v, 255 - v, (v * 7) % 256]]) {
        const rgb = bytes.map((b) => b / 255) as [number, number, number];
        expect(hexOf(rgb)).toBe(Color.rgb(bytes).hex().toLowerCase());
      }
    }
  });
  it("clips encoded values to 0..1 and rounds to the nearest of 255 steps", () => {
    // identity: 0.5 · 255 = 127.5 rounds up (Math.round), as the 8-bit encoding of IEC 61966-2-1
    expect(hexOf([-0.2, 0.5, 1.3])).toBe("#0080ff");
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { checkTarget } from "../../lib/dopant/mod.ts";

describe("target check", () => {
  it("passes inside the tolerance and says the direction of a miss", () => {
    expect(checkTarget({ L: 50, a: 30, b: 10 }, { L: 50, a: 30, b: 10 }).words).toBe("on target");
    const miss = checkTarget({ L: 44, a: 22, b: 14 }, { L: 50, a: 30, b: 10 }, 2);
    expect(miss.pass).toBe(false);
    expect(miss.words).toMatch(/darker/);
    expect(miss.words).toMatch(/less chroma/);
    expect(miss.words).toMatch(/hue toward yellow/);
  });
});

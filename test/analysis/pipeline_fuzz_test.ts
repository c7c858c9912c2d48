import { describe, it } from "node:test";
import { expect } from "expect";
import { fuzzPipeline } from "./_pipeline_fuzz.ts";

describe("the whole pipeline is total (read → analyse)", () => {
  it("mutated exports: only InputError when unreadable, and only finite numbers in results", () => {
    // 300 cases here; `deno task fuzz` runs 100,000 (seeded, same generator)
    const report = fuzzPipeline(300, 20261202);
    expect(report.untyped).toEqual([]);
    expect(report.nonFinite).toEqual([]);
    expect(report.read).toBeGreaterThan(50); // the mutations leave many files readable
    expect(report.refused).toBeGreaterThan(20); // and break many others
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { makeLot, runCli } from "../_run_cli.ts";
import { readResultsJson } from "../_results_json.ts";

/** The keys every colour row carries (the `color` command's machine contract). */
const ROW_KEYS = ["sample", "file", "illuminant", "observer", "pathMm", "X", "Y", "Z", "x", "y"]
  .concat(["L", "a", "b", "C", "h"]);

describe("batch --plain-json", () => {
  it("writes every record out in full, numbers unrounded, and the page re-renders from it byte for byte", async () => {
    const lot = await makeLot(4);
    const packedOut = await Deno.makeTempDir(), plainOut = await Deno.makeTempDir();
    expect((await runCli("batch", lot, "--out", packedOut, "--quiet")).code).toBe(2);
    const r = await runCli("batch", lot, "--out", plainOut, "--quiet", "--plain-json");
    expect(r.code).toBe(2); // the lot holds one broken file
    const text = await Deno.readTextFile(`${plainOut}/results.json`);
    const plain = JSON.parse(text);
    expect(text).not.toContain('"shared"');
    expect(plain.errors).toHaveLength(1);
    expect(Object.keys(plain.errors[0])).toEqual(expect.arrayContaining(["file", "message"]));
    expect(plain.samples).toHaveLength(4);
    for (const s of plain.samples) {
      expect(Array.isArray(s.color)).toBe(true);
      for (const row of s.color) expect(Object.keys(row)).toEqual(expect.arrayContaining(ROW_KEYS));
      expect(Array.isArray(s.bands.bands)).toBe(true);
      // the charted curves and their axes are lists of numbers too
      for (const list of [s.plot.nm, s.plot.t, s.bands.curve.nm, s.bands.curve.data]) {
        expect(Array.isArray(list) && list.every((v: unknown) => typeof v === "number")).toBe(true);
      }
      expect(s.plot.t.length).toBe(s.plot.nm.length);
    }
    // the packed file holds the same samples, to its 9 significant digits
    const packed = await readResultsJson(`${packedOut}/results.json`);
    const byName = new Map(packed.samples.map((s: { sample: string }) => [s.sample, s]));
    for (const s of plain.samples) {
      const p = byName.get(s.sample) as { color: Record<string, number>[] };
      s.color.forEach((row: Record<string, number>, k: number) => {
        for (const key of ["X", "Y", "Z", "L", "a", "b", "C", "h"]) {
          expect(Math.abs(p.color[k]![key]! - row[key]!)).toBeLessThanOrEqual(
            5e-9 * Math.abs(row[key]!) + 1e-300,
          );
        }
      });
    }
    const again = await Deno.makeTempDir();
    expect((await runCli("report", `${plainOut}/results.json`, "--out", again)).code).toBe(0);
    expect(
      await Deno.readTextFile(`${again}/index.html`) ===
        await Deno.readTextFile(`${plainOut}/index.html`),
    ).toBe(true);
  });
});

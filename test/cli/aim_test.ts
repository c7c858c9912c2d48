import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT, runCli } from "../_run_cli.ts";

const stone = `${ROOT}test/fixtures/colour/cr_corundum_1nm.csv`;

describe("crystint aim: exit codes and level units", () => {
  it("exits 2 when the target is unreachable, still printing the closest result", async () => {
    // a saturated yellow-green cannot be made from a chromium band pair (purple-red only)
    const r = await runCli(
      "aim",
      "--target",
      "90,-60,80",
      "--path",
      "2",
      "--dopant",
      `Cr=${stone}`,
      "--thickness",
      "2",
      "--json",
    );
    expect(r.code).toBe(2);
    const out = JSON.parse(r.stdout);
    expect(out.reachable).toBe(false);
    expect(out.observer).toBe("2");
    expect(out.illuminant).toBe("D65");
    expect(r.stderr).toMatch(/not reachable/);
  });

  it("a target equal to the slab's own colour is reached at level 1 × unit spectrum (exit 0)", async () => {
    // identity: α from the 2 mm slab, path 2 mm, no surfaces → exp(−α·d) is the measured T
    const [own] = JSON.parse(
      (await runCli("color", stone, "--thickness", "2", "--illuminant", "D65", "--json")).stdout,
    );
    const target = `${own.L},${own.a},${own.b}`;
    const r = await runCli(
      "aim",
      "--target",
      target,
      "--path",
      "2",
      "--dopant",
      `Cr=${stone}`,
      "--thickness",
      "2",
      "--json",
    );
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout);
    expect(out.levels.Cr).toBeCloseTo(1, 2);
    expect(out.levelUnits.Cr).toBe(`× unit spectrum ${stone}`);

    // the same slab declared as measured at 0.08 wt%: the level comes out in wt%
    const scaled = await runCli(
      "aim",
      "--target",
      target,
      "--path",
      "2",
      "--dopant",
      `Cr=${stone}@0.08wt%`,
      "--thickness",
      "2",
      "--json",
    );
    expect(scaled.code).toBe(0);
    const s = JSON.parse(scaled.stdout);
    expect(s.levels.Cr).toBeCloseTo(0.08, 3);
    expect(s.levelUnits.Cr).toBe("wt%");
  });

  it("a malformed @LEVEL is a usage error", async () => {
    const r = await runCli(
      "aim",
      "--target",
      "50,0,0",
      "--path",
      "2",
      "--dopant",
      `Cr=${stone}@0`,
    );
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/level after @/);
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT, runCli } from "../_run_cli.ts";

const fixture = (p: string) => `${ROOT}test/fixtures/${p}`;
const run = runCli;

describe("crystint change (machine contract)", () => {
  it("--json rows carry sample, file, from, to, observer, dE00, dEab, dL, dC, dh", async () => {
    const r = await run(
      "change",
      fixture("colour/colour_change_5nm.csv"),
      "--from",
      "D65",
      "--to",
      "A",
      "--observer",
      "10",
      "--json",
    );
    expect(r.code).toBe(0);
    const [row] = JSON.parse(r.stdout);
    for (
      const k of ["sample", "file", "from", "to", "observer", "dE00", "dEab", "dL", "dC", "dh"]
    ) expect(row).toHaveProperty(k);
    expect(row.from).toBe("D65");
    expect(row.to).toBe("A");
    expect(row.observer).toBe("10");
    expect(row.dh).toBeGreaterThan(-180);
    expect(row.dh).toBeLessThanOrEqual(180);
  });
  it("--adapt takes cat16 or bradford; anything else is a usage error", async () => {
    expect((await run("change", fixture("colour/ramp_2nm.csv"), "--adapt", "cat16", "--json")).code)
      .toBe(0);
    expect((await run("change", fixture("colour/ramp_2nm.csv"), "--adapt", "vonkries")).code).toBe(
      1,
    );
  });
  it("color --reflection host without a host says it uses corundum; with a host it runs", async () => {
    const bare = await run(
      "color",
      fixture("colour/ramp_2nm.csv"),
      "--reflection",
      "host",
      "--thickness",
      "2",
      "--json",
    );
    expect(bare.code).toBe(0);
    expect(bare.stderr).toMatch(/using corundum indices/);
    const r = await run(
      "color",
      fixture("colour/ramp_2nm.csv"),
      "--thickness",
      "2",
      "--path",
      "5",
      "--host",
      "spinel",
      "--json",
    );
    expect(r.code).toBe(0);
    expect(JSON.parse(r.stdout)[0].pathMm).toBe(5);
  });
});

describe("crystint pleochroism and metamerism", () => {
  it("pleochroism of two files: o, e, unpolarised colours and dE00oe; missing thickness is a usage error", async () => {
    const o = fixture("colour/cr_corundum_1nm.csv"), e = fixture("colour/colour_change_5nm.csv");
    const r = await run("pleochroism", o, e, "--thickness", "2", "--path", "4", "--json");
    expect(r.code).toBe(0);
    const rows = JSON.parse(r.stdout);
    expect(rows.length).toBe(2);
    for (const k of ["Lo", "ao", "bo", "Le", "ae", "be", "Lu", "au", "bu", "dE00oe"]) {
      expect(rows[0]).toHaveProperty(k);
    }
    expect(rows[0].dE00oe).toBeGreaterThan(1);
    expect((await run("pleochroism", o, e, "--path", "4")).code).toBe(1);
  });
  it("metamerism index is 0 for a specimen against itself", async () => {
    const a = fixture("colour/ti_blue_2nm.csv");
    const r = await run("metamerism", a, a, "--test", "A,F11", "--json");
    expect(r.code).toBe(0);
    const rows = JSON.parse(r.stdout);
    expect(rows.map((x: { test: string }) => x.test)).toEqual(["A", "F11"]);
    expect(rows[0].index00).toBe(0);
  });
  it("--sellmeier gives your own dispersion for the surfaces", async () => {
    const r = await run(
      "color",
      fixture("colour/ramp_2nm.csv"),
      "--thickness",
      "2",
      "--path",
      "4",
      "--sellmeier",
      "1.43,0.65,5.34:0.0727,0.119,18.03",
      "--json",
    );
    expect(r.code).toBe(0);
  });
});

describe("crystint series", () => {
  it("--json gives the points, the path of maximum chroma and the path to a target L*", async () => {
    const r = await run(
      "series",
      fixture("colour/cr_corundum_1nm.csv"),
      "--thickness",
      "2",
      "--from",
      "1",
      "--to",
      "20",
      "--steps",
      "19",
      "--target-l",
      "50",
      "--json",
    );
    expect(r.code).toBe(0);
    const [s] = JSON.parse(r.stdout);
    expect(s.points.length).toBe(20);
    expect(s.points[0].pathMm).toBe(1);
    expect(s.maxChromaPathMm).toBeGreaterThan(1);
    expect(s.targetLightnessPathMm).toBeGreaterThan(1);
    expect(
      (await run("series", fixture("colour/cr_corundum_1nm.csv"), "--from", "5", "--to", "2")).code,
    ).toBe(1);
  });
});

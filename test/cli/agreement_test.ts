import { describe, it } from "node:test";
import { expect } from "expect";
import { readResultsJson } from "../_results_json.ts";
import { ROOT, runCli } from "../_run_cli.ts";

const stone = `${ROOT}test/fixtures/colour/cr_corundum_1nm.csv`;
const common = ["--thickness", "2", "--path", "6", "--host", "corundum"];

interface Lab {
  L: number;
  a: number;
  b: number;
}

async function json(...args: string[]) {
  const r = await runCli(...args);
  expect(r.code).toBe(0);
  return JSON.parse(r.stdout);
}

describe("every command gives the same stone the same L*a*b* under the same condition", () => {
  it("color, series, change, pleochroism and batch agree at D65, 2° (the default observer), 6 mm", async () => {
    const [color] = await json("color", stone, ...common, "--illuminant", "D65", "--json");
    expect(color.observer).toBe("2");
    const series = (await json(
      "series",
      stone,
      "--thickness",
      "2",
      "--path",
      "6",
      "--host",
      "corundum",
      "--json",
    ))[0];
    expect(series.observer).toBe("2");
    expect(series.illuminant).toBe("D65");
    const [change] = await json("change", stone, ...common, "--json");
    expect(change.observer).toBe("2");
    // the same file as o and e: o, e and unpolarised must all be the stone's own colour
    const [pleo] = await json("pleochroism", stone, stone, ...common, "--json");
    expect(pleo.observer).toBe("2");
    const found: Record<string, Lab> = {
      series: series.points[0],
      change: { L: change.L1, a: change.a1, b: change.b1 },
      "pleochroism o": { L: pleo.Lo, a: pleo.ao, b: pleo.bo },
    };
    for (const [what, lab] of Object.entries(found)) {
      // identity: one colour computation, so agreement to rounding of the JSON numbers
      expect({ what, L: lab.L.toFixed(6), a: lab.a.toFixed(6), b: lab.b.toFixed(6) }).toEqual({
        what,
        L: color.L.toFixed(6),
        a: color.a.toFixed(6),
        b: color.b.toFixed(6),
      });
    }
    expect(series.points[0].pathMm).toBe(6);
    // batch, with the same stone, path and surfaces from its settings
    const dir = await Deno.makeTempDir();
    await Deno.writeTextFile(
      `${dir}/lot.yaml`,
      "illuminants: [D65]\npathMm: 6\nthicknessMm: 2\nreflection: host\nhost: corundum\n",
    );
    await Deno.mkdir(`${dir}/in`);
    await Deno.copyFile(stone, `${dir}/in/stone.csv`);
    const batch = await runCli(
      "batch",
      `${dir}/in`,
      "--settings",
      `${dir}/lot.yaml`,
      "--out",
      `${dir}/out`,
      "--quiet",
    );
    expect(batch.code).toBe(0);
    const results = await readResultsJson(`${dir}/out/results.json`);
    const row = results.samples[0].color.find((r: { illuminant: string; observer: string }) =>
      r.illuminant === "D65" && r.observer === "2"
    );
    expect([row.L, row.a, row.b].map((v: number) => v.toFixed(6))).toEqual(
      [color.L, color.a, color.b].map((v: number) => v.toFixed(6)),
    );
    // the batch's change uses the same default observer
    expect(results.samples[0].change.observer).toBe("2");
    expect(results.samples[0].change.dE00.toFixed(6)).toBe(change.dE00.toFixed(6));
  });

  it("with --reflection none, the same file as o and e gives unpolarised = o = color", async () => {
    // with host reflections the e file takes n_e, so only without surfaces are o and e the same
    const none = ["--thickness", "2", "--path", "6", "--reflection", "none"];
    const [color] = await json("color", stone, ...none, "--illuminant", "D65", "--json");
    const [pleo] = await json(
      "pleochroism",
      stone,
      stone,
      ...none,
      "--illuminant",
      "D65",
      "--json",
    );
    for (
      const lab of [[pleo.Lo, pleo.ao, pleo.bo], [pleo.Le, pleo.ae, pleo.be], [
        pleo.Lu,
        pleo.au,
        pleo.bu,
      ]]
    ) {
      expect(lab.map((v: number) => v.toFixed(6))).toEqual(
        [color.L, color.a, color.b].map((v: number) => v.toFixed(6)),
      );
    }
    expect(pleo.dE00oe).toBe(0);
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT, runCli } from "../_run_cli.ts";

const base = (await Deno.readTextFile(`${ROOT}test/fixtures/colour/cr_corundum_1nm.csv`))
  .trim().split("\n").slice(1);
const spinel = (await Deno.readTextFile(`${ROOT}test/fixtures/colour/co_spinel_1nm.csv`))
  .trim().split("\n").slice(1);

/**
 * An export as a spectrometer in a decimal-comma locale writes it: semicolons, a preamble with
 * the sample, polarisation and thickness, values with decimal commas (invented layout).
 */
async function export_(dir: string, name: string, pol: string, rows: string[]): Promise<string> {
  const path = `${dir}/${name}.csv`;
  const body = rows.map((l) => l.split(",").map((v) => v.replace(".", ",")).join(";"));
  await Deno.writeTextFile(
    path,
    [`Sample;${name}`, `Polarisation;${pol}`, "Thickness (mm);2,0", "Wavelength (nm);T", ...body]
      .join("\r\n") + "\r\n",
  );
  return path;
}

describe("crystint pleochroism checks the files' polarisation against the argument order", () => {
  it("refuses e before o unless --force-order; the right order runs", async () => {
    const dir = await Deno.makeTempDir();
    const o = await export_(dir, "R1-o", "o", base);
    const e = await export_(dir, "R1-e", "e", spinel);
    const wrong = await runCli("pleochroism", e, o, "--json");
    expect(wrong.code).toBe(1);
    expect(wrong.stderr).toMatch(/R1-e\.csv says polarisation e/);
    expect(wrong.stderr).toMatch(/--force-order/);
    expect(wrong.stdout).toBe("");

    const forced = await runCli("pleochroism", e, o, "--force-order", "--json");
    expect(forced.code).toBe(0);
    expect(forced.stderr).toMatch(/--force-order keeps the order given/);
    const [f] = JSON.parse(forced.stdout);
    expect(f.sampleO).toBe("R1-e");

    const right = await runCli("pleochroism", o, e, "--json");
    expect(right.code).toBe(0);
    const [r] = JSON.parse(right.stdout);
    expect(r.sampleO).toBe("R1-o");
    expect(r.sampleE).toBe("R1-e");
    // swapping o and e swaps their colours: the o row of one is the e row of the other
    expect(r.Lo).toBeCloseTo(f.Le, 9);
    expect(r.dE00oe).toBeCloseTo(f.dE00oe, 9);
  });

  it("one file saying e given first, the other unlabelled, is refused too", async () => {
    const dir = await Deno.makeTempDir();
    const e = await export_(dir, "S-e", "E", base);
    const plain = `${ROOT}test/fixtures/colour/co_spinel_1nm.csv`;
    const r = await runCli("pleochroism", e, plain, "--thickness", "2");
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/says polarisation e/);
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT, runCli } from "../_run_cli.ts";

const stone = `${ROOT}test/fixtures/colour/cr_corundum_1nm.csv`;

/** An invented α spectrum (cm⁻¹): two Gaussian bands in wavenumber on a small ramp, with noise. */
function alphaRows(scale: number): string[] {
  const rows: string[] = [];
  let seed = 7;
  const noise = () => ((seed = (seed * 16807) % 2147483647) / 2147483647 - 0.5) * 0.004;
  for (let nm = 360; nm <= 830; nm += 2) {
    const cm1 = 1e7 / nm;
    const alpha = 0.05 + 2.2 * Math.exp(-(((cm1 - 18000) / 1300) ** 2)) +
      1.4 * Math.exp(-(((cm1 - 24800) / 1500) ** 2)) + noise();
    rows.push(`${nm}\t${(alpha * scale).toFixed(6)}`);
  }
  return rows;
}

describe("--alpha-base", () => {
  it("decadic α read with --alpha-base 10 gives the colour of the same α in natural units", async () => {
    const dir = await Deno.makeTempDir();
    // the same absorption written both ways: α10 = αe / ln 10 (A = α10·d = αe·d / ln 10)
    await Deno.writeTextFile(
      `${dir}/natural.txt`,
      "# alpha (1/cm), natural log\nnm\talpha\n" + alphaRows(1).join("\n") + "\n",
    );
    await Deno.writeTextFile(
      `${dir}/decadic.txt`,
      "# alpha (1/cm), decadic\nnm\talpha\n" + alphaRows(1 / Math.LN10).join("\n") + "\n",
    );
    const run = async (file: string, ...extra: string[]) => {
      const r = await runCli(
        "color",
        file,
        "--ordinate",
        "alpha",
        "--path",
        "3",
        "--illuminant",
        "D65",
        "--json",
        ...extra,
      );
      expect(r.code).toBe(0);
      return JSON.parse(r.stdout)[0];
    };
    const natural = await run(`${dir}/natural.txt`);
    const decadicRead = await run(`${dir}/decadic.txt`, "--alpha-base", "10");
    const decadicMisread = await run(`${dir}/decadic.txt`);
    // identity up to the 6 decimals the files were written with
    expect(decadicRead.L).toBeCloseTo(natural.L, 3);
    expect(decadicRead.a).toBeCloseTo(natural.a, 3);
    expect(decadicRead.b).toBeCloseTo(natural.b, 3);
    // read as natural, the decadic file is 2.3× too weak an absorber: visibly lighter
    expect(decadicMisread.L - natural.L).toBeGreaterThan(5);
  });

  it("an unknown base is a usage error", async () => {
    const r = await runCli("color", stone, "--alpha-base", "2");
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/--alpha-base "2"/);
  });
});

describe("--reflection none when rescaling a slab", () => {
  it("says once that surface losses are scaled with the path, with the Fresnel factor", async () => {
    const r = await runCli(
      "color",
      stone,
      stone,
      "--thickness",
      "2",
      "--path",
      "6",
      "--reflection",
      "none",
      "--host",
      "corundum",
    );
    expect(r.code).toBe(0);
    const notes = r.stderr.split("\n").filter((l) => l.includes("surface losses"));
    expect(notes.length).toBe(1);
    // sapphire n_o ≈ 1.768 at 589 nm (Malitson 1962, from memory): R = ((n−1)/(n+1))² ≈ 0.0770,
    // (1−R)² ≈ 0.852, raised to 6/2 − 1 = 2 → ≈ 0.726 (Fresnel, normal incidence)
    const pair = Number(/\(1−R\)² = ([\d.]+)/.exec(notes[0]!)![1]);
    const off = Number(/×([\d.]+)/.exec(notes[0]!)![1]);
    expect(pair).toBeCloseTo(0.852, 2);
    expect(off).toBeCloseTo(pair ** 2, 3);
  });

  it("is quiet with host reflections (the default once a host is named) and at the measured path", async () => {
    const host = await runCli(
      "color",
      stone,
      "--thickness",
      "2",
      "--path",
      "6",
      "--host",
      "corundum",
    );
    expect(host.stderr).not.toMatch(/surface losses/);
    const same = await runCli("color", stone, "--thickness", "2", "--path", "2");
    expect(same.stderr).not.toMatch(/surface losses/);
    const plain = await runCli("color", stone, "--thickness", "2", "--path", "6");
    expect(plain.stderr).toMatch(/surface losses.*e\.g\. corundum/);
  });
});

import { describe, it } from "node:test";
import { expect } from "expect";
import { parse } from "csv-parse/sync";
import { ROOT, runCli } from "../_run_cli.ts";

/**
 * A generic instrument export (invented layout): a `#` header naming the columns, space
 * separated, no ordinate word the reader can trust.
 */
async function datLot(): Promise<string> {
  const dir = await Deno.makeTempDir({ prefix: "crystint-dat-" });
  const rows = (await Deno.readTextFile(`${ROOT}test/fixtures/colour/cr_corundum_5nm.csv`))
    .trim().split("\n").slice(1).map((l) => l.replace(",", " "));
  await Deno.mkdir(`${dir}/in`);
  for (const name of ["s01", "s02"]) {
    await Deno.writeTextFile(`${dir}/in/${name}.dat`, ["# Wavelength(nm) T", ...rows].join("\n"));
  }
  return dir;
}

describe("crystint batch: reading options and empty inputs", () => {
  it("accepts --ordinate and --axis and reads exports it otherwise cannot", async () => {
    const dir = await datLot();
    const without = await runCli("batch", `${dir}/in`, "--out", `${dir}/a`, "--quiet");
    expect(without.code).toBe(2);
    const r = await runCli(
      "batch",
      `${dir}/in`,
      "--out",
      `${dir}/b`,
      "--quiet",
      "--ordinate",
      "transmittance",
      "--axis",
      "nm",
      "--workers",
      "1",
    );
    expect(r.code).toBe(0);
    const rows = parse(await Deno.readTextFile(`${dir}/b/results.csv`), { columns: true });
    expect(new Set(rows.map((x: Record<string, string>) => x["sample"]))).toEqual(
      new Set(["s01", "s02"]),
    );
  });

  it("an unknown --ordinate is a usage error worded like every other command's", async () => {
    const dir = await datLot();
    const r = await runCli("batch", `${dir}/in`, "--out", `${dir}/c`, "--ordinate", "weird");
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/Unknown --ordinate "weird"/);
  });

  it("no input matched: exit 1, 'no files matched', nothing written", async () => {
    const dir = await Deno.makeTempDir();
    const r = await runCli("batch", `${dir}/nothing/*.csv`, "--out", `${dir}/out`);
    expect(r.code).toBe(1);
    expect(r.stderr).toMatch(/no files matched/);
    await expect(Deno.stat(`${dir}/out`)).rejects.toThrow(Deno.errors.NotFound);
  });
});

/**
 * `crystint color` reads a wide table a stretch of rows at a time (`colorStreamed`); its output
 * must be the output of reading the file whole (`readSpectrumFile` + `fileColorRows`), byte for
 * byte, in CSV and JSON. Identities: the whole-file route is the reference.
 */
import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT, runCli } from "../_run_cli.ts";
import { COLOR_EXTRA_KEYS, COLOR_KEYS, colorStreamed, fileColorRows } from "../../cli/color.ts";
import { toCsv } from "../../cli/_shared.ts";
import { readSpectrumFile } from "../../lib/io/read_file.ts";
import { conditionsOf, spectraXyzRows } from "../../lib/cie/spectra_color_many.ts";
import type { ReflectionSettings } from "../../lib/optics/path_transmittance.ts";
import type { ReadOptions } from "../../lib/io/read_spectra.ts";
import { readerWarnings } from "../../lib/io/reader_warnings.ts";
import { seededNormal } from "../_random.ts";

const conditions = conditionsOf(["D65", "A"], ["2", "10"]);
const KEYS = [...COLOR_KEYS, ...COLOR_EXTRA_KEYS];

/** The rows of both routes, and whether the stretch route took the file. */
async function bothRoutes(
  file: string,
  read: ReadOptions,
  pathMm: number | undefined,
  reflection: ReflectionSettings,
) {
  const spectra = await readSpectrumFile(file, read);
  const whole = fileColorRows(spectra, conditions, pathMm, reflection);
  const streamed = await colorStreamed(file, read, "e", conditions, pathMm, reflection);
  if (!streamed) return { whole, streamedRows: undefined };
  const labels = {
    samples: streamed.spectra.map((s) => s.meta.sample),
    pathMm: pathMm ?? streamed.spectra[0]!.thicknessMm ?? null,
    file,
  };
  const streamedRows = spectraXyzRows(streamed.result, labels, 0, streamed.spectra.length);
  expect(readerWarnings(streamed.spectra)).toEqual(readerWarnings(spectra));
  return { whole, streamedRows };
}

/** A wide, messy table of `count` spectra: preamble, header, noise clipped at 0 and 1, footer. */
function wideTable(count: number, seed: number, delimiter: string, crlf: boolean): string {
  const noise = seededNormal(seed);
  const lines = ["Mode: Transmittance", "Thickness (mm): 1.5", "# measured by hand"];
  lines.push(
    ["wavelength_nm", ...Array.from({ length: count }, (_, k) => `s${k}`)].join(delimiter),
  );
  for (let nm = 360; nm <= 830; nm += 5) {
    const row = [String(nm)];
    for (let k = 0; k < count; k++) {
      const t = 0.5 + 0.5 * Math.sin(nm / (30 + k)) + 0.004 * noise();
      row.push(t.toFixed(k % 3 === 0 ? 4 : 6));
    }
    lines.push(row.join(delimiter));
  }
  lines.push("", "End of data");
  return lines.join(crlf ? "\r\n" : "\n") + "\n";
}

describe("crystint color: a wide table read a stretch at a time", () => {
  it("gives the rows of the whole-file route on every good export fixture", async () => {
    const dir = `${ROOT}test/fixtures/exports/good/`;
    let taken = 0;
    for (const entry of Deno.readDirSync(dir)) {
      const file = dir + entry.name;
      for (const read of [{}, { ordinate: "transmittance" as const, thicknessMm: 2 }]) {
        let both;
        try {
          both = await bothRoutes(file, read, undefined, { reflection: "none" });
        } catch {
          continue; // the file needs options these reads do not give
        }
        if (!both.streamedRows) continue;
        taken++;
        expect([entry.name, JSON.stringify(both.streamedRows)])
          .toEqual([entry.name, JSON.stringify(both.whole)]);
      }
    }
    expect(taken).toBeGreaterThan(10);
  });

  it("gives the rows of the whole-file route at another path and with surfaces", async () => {
    const dir = await Deno.makeTempDir({ prefix: "crystint-stream-" });
    try {
      const file = `${dir}/wide.csv`;
      await Deno.writeTextFile(file, wideTable(40, 5, ";", true));
      for (
        const [pathMm, reflection] of [
          [undefined, { reflection: "none" }],
          [3, { reflection: "none" }],
          [3, { reflection: "host", host: "corundum" }],
          [undefined, { reflection: "host", n: 1.7 }],
        ] as [number | undefined, ReflectionSettings][]
      ) {
        const both = await bothRoutes(file, {}, pathMm, reflection);
        expect(both.streamedRows).toBeDefined();
        expect(JSON.stringify(both.streamedRows)).toBe(JSON.stringify(both.whole));
      }
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  });

  it("prints byte-identical --csv and --json, and reports a bad cell as before", async () => {
    const dir = await Deno.makeTempDir({ prefix: "crystint-stream-" });
    try {
      const file = `${dir}/wide.csv`;
      const text = wideTable(1500, 11, ",", false);
      await Deno.writeTextFile(file, text);
      const whole = fileColorRows(await readSpectrumFile(file), conditions, undefined, {
        reflection: "none",
      });
      const args = ["color", file, "--illuminant", "D65,A", "--observer", "2,10"];
      const csv = await runCli(...args, "--csv");
      expect(csv.code).toBe(0);
      expect(csv.stdout).toBe(toCsv(whole as never, KEYS));
      const json = await runCli(...args, "--json");
      expect(json.stdout).toBe(JSON.stringify(whole, null, 2) + "\n");
      expect(json.stderr).toBe(csv.stderr);
      // a bad cell deep in the table: the message and line of reading the file whole
      const lines = text.split("\n");
      lines[60] = lines[60]!.replace(/,0\.[0-9]+,/, ",0.5x,");
      await Deno.writeTextFile(file, lines.join("\n"));
      let message = "";
      await readSpectrumFile(file).catch((e) => message = (e as Error).message);
      expect(message).toMatch(/wide.csv:61: Cell "0.5x" is not a number/);
      const bad = await runCli(...args, "--csv");
      expect(bad.code).toBe(2);
      expect(bad.stderr).toContain(message);
      expect(bad.stdout.split("\n").length).toBe(2); // the header line only
    } finally {
      await Deno.remove(dir, { recursive: true });
    }
  });
});

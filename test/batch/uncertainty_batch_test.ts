// Uncertainties end to end in a batch: the settings block and the sheet's thickness_sd/path_sd
// columns reach results.json, results.csv and the report (± cells, verdicts, the a*b*
// ellipse), and the report re-renders from results.json alone.
import { describe, it } from "node:test";
import { expect } from "expect";
import { readResultsJson } from "../_results_json.ts";
import { pathVertices } from "../report/_svg_path.ts";
import { parse } from "csv-parse/sync";
import { makeLot, runCli } from "../_run_cli.ts";
import { readSpectrumFile } from "../../lib/io/read_file.ts";
import { spectrumColor } from "../../lib/cie/spectrum_color.ts";
import { deltaE2000 } from "../../lib/cie/delta_e.ts";
import { coverageEllipse } from "../../lib/report/ellipse.ts";
import { reportDetail } from "../../lib/report/report_data.ts";
import type { SampleResult } from "../../lib/analysis/sample_result.ts";
import {
  parseManifest,
  resolveSettings,
  SettingsError,
  settingsForSample,
} from "../../lib/batch/mod.ts";

const THICKNESS = 2, PATH = 6;

/** L* of a stone's file at PATH under D65/2° with the measured thickness set to `d` mm. */
async function lightnessAt(file: string, d: number): Promise<{ L: number; a: number; b: number }> {
  const [s] = await readSpectrumFile(file);
  const [row] = spectrumColor({ ...s!, thicknessMm: d }, {
    pathMm: PATH,
    illuminants: ["D65"],
    observers: ["2"],
  });
  return { L: row!.L, a: row!.a, b: row!.b };
}

describe("uncertainties in a batch", () => {
  it("σ per colour row in results.json and results.csv, the sheet's sd columns overriding the settings, a verdict per target, ± and ellipses in the report", async () => {
    const lot = await makeLot(3, false);
    const out = await Deno.makeTempDir();
    const files = [`${lot}/sub/stone-000.csv`, `${lot}/stone-001.csv`, `${lot}/stone-002.csv`];
    const lab = await Promise.all(files.map((f) => lightnessAt(f, THICKNESS)));
    // targets: the stone's own colour (pass), 25 L* away (fail), and one whose ΔE00 is the
    // tolerance (on the boundary: probability about one half, JCGM 106:2012 — undecided)
    const shifted = { ...lab[2]!, L: lab[2]!.L + 1.5 };
    const edge = deltaE2000(lab[2]!, shifted);
    const t = (x: { L: number; a: number; b: number }, tol: number) =>
      `{ L: ${x.L}, a: ${x.a}, b: ${x.b}, illuminant: D65, observer: "2", toleranceDE00: ${tol} }`;
    const settings = `${out}/s.yaml`;
    await Deno.writeTextFile(
      settings,
      `illuminants: [D65, A]\nobservers: ["2"]\n` +
        `uncertainty: { noiseSd: 0.003, thicknessSdMm: 0.02, pathSdMm: 0.06 }\n` +
        `targets:\n  own: ${t(lab[0]!, 2)}\n  far: ${t({ ...lab[1]!, L: lab[1]!.L - 25 }, 2)}\n` +
        `  edge: ${t(shifted, edge)}\n`,
    );
    const sheet = `${out}/sheet.csv`;
    await Deno.writeTextFile(
      sheet,
      "file,sample,thickness_mm,path_mm,thickness_sd,path_sd,target\n" +
        `stone-000.csv,<b>A&1</b>,${THICKNESS},${PATH},"0,05",0,own\n` +
        `stone-001.csv,B2,${THICKNESS},${PATH},,,far\n` +
        `stone-002.csv,C3,${THICKNESS},${PATH},,,edge\n`,
    );
    const r = await runCli(
      "batch",
      lot,
      "--out",
      out,
      "--settings",
      settings,
      "--manifest",
      sheet,
      "--quiet",
    );
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const doc = await readResultsJson(`${out}/results.json`);
    const bySample = (name: string) =>
      doc.samples.find((s: SampleResult) => s.sample === name) as SampleResult;
    const [a, b, c] = [bySample("<b>A&1</b>"), bySample("B2"), bySample("C3")];
    // the sources as stated: the sheet's 0.05 mm outranks the settings' 0.02 mm
    expect(a.uncertainty!.sources).toMatchObject({
      noiseSource: "given",
      noiseSd: 0.003,
      thicknessSdMm: 0.05,
      pathSdMm: 0,
    });
    expect(b.uncertainty!.sources).toMatchObject({ thicknessSdMm: 0.02, pathSdMm: 0.06 });
    for (const s of [a, b, c]) {
      expect(s.uncertainty!.rows.length).toBe(s.color.length);
      for (const u of s.uncertainty!.rows) {
        expect(u.LSd).toBeGreaterThan(0);
        // results.json keeps 9 significant digits (lib/analysis/results_packing.ts)
        expect(Math.abs(u.labCovariance[0]![0]! - u.LSd ** 2)).toBeLessThan(1e-8 * u.LSd ** 2);
      }
      expect(s.uncertainty!.changeDE00Sd).toBeGreaterThan(0);
    }
    // first-order propagation of the thickness alone (GUM eq. 10): the thickness part of
    // Var(L*) is (∂L*/∂d · σ_d)²; ∂L*/∂d by a central difference through the colour route.
    // Stones A and B differ only in σ_d (0.05 vs 0.02 mm) and σ_path (0 vs 0.06 mm), and share
    // the noise, so Var_A − Var_B = (∂L/∂d)²(0.05² − 0.02²) − (∂L/∂p)²·0.06²; the path part is
    // checked the same way from the closed form L(p) at fixed d.
    const h = 1e-4;
    const dLdd = ((await lightnessAt(files[0]!, THICKNESS + h)).L -
      (await lightnessAt(files[0]!, THICKNESS - h)).L) / (2 * h);
    // with Beer–Lambert, T_path = T^(p/d): L depends on p/d, so ∂L/∂p = −(d/p)·∂L/∂d
    const dLdp = -(THICKNESS / PATH) * dLdd;
    const varA = a.uncertainty!.rows[0]!.LSd ** 2, varB = b.uncertainty!.rows[0]!.LSd ** 2;
    const expected = dLdd ** 2 * (0.05 ** 2 - 0.02 ** 2) - dLdp ** 2 * 0.06 ** 2;
    // the stones' files differ at one point by 0.1 %: their noise parts agree to well under 1 %
    expect(Math.abs(varA - varB - expected)).toBeLessThan(0.02 * varA);
    // verdicts per target, with their probabilities (levels 0.95 and 0.05 by default)
    expect(a.target!.verdict).toBe("pass");
    expect(a.target!.passProbability).toBeGreaterThan(0.95);
    expect(b.target!.verdict).toBe("fail");
    expect(b.target!.passProbability).toBeLessThan(0.05);
    expect(c.target!.verdict).toBe("undecided");
    expect(c.target!.passProbability).toBeGreaterThan(0.3);
    expect(c.target!.passProbability).toBeLessThan(0.7);
    expect(a.target!.rule).toMatch(/≥ 95 %.*≤ 5 %/);

    // results.csv: the same numbers, rounded to 4 decimals, per colour row
    const rows = parse(await Deno.readTextFile(`${out}/results.csv`), {
      columns: true,
    }) as Record<string, string>[];
    expect(rows.length).toBe(3 * 2);
    for (const s of [a, b, c]) {
      const mine = rows.filter((x) => x.file === s.file);
      expect(mine.length).toBe(2);
      mine.forEach((row, i) => {
        const u = s.uncertainty!.rows[i]!;
        expect(row.illuminant).toBe(u.illuminant);
        expect(Number(row["L* sd"])).toBeCloseTo(u.LSd, 4);
        expect(Number(row["a* sd"])).toBeCloseTo(u.aSd, 4);
        expect(Number(row["b* sd"])).toBeCloseTo(u.bSd, 4);
        expect(Number(row["C*ab sd"])).toBeCloseTo(u.CSd, 4);
        expect(Number(row["h_ab sd (deg)"])).toBeCloseTo(u.hSd!, 4);
        expect(Number(row["change dE00 sd"])).toBeCloseTo(s.uncertainty!.changeDE00Sd!, 4);
        expect(Number(row["target pass probability"])).toBeCloseTo(s.target!.passProbability!, 4);
        expect(row["target verdict"]).toBe(s.target!.verdict);
      });
    }

    // the report: ± in the summary, the verdict with its probability in the tooltip, the rule
    // once under Methods, the ellipse on each printed a*b* chart; names escaped
    const html = await Deno.readTextFile(`${out}/index.html`);
    expect(html).not.toContain("<b>A&1</b>");
    expect(html).toContain("&lt;b&gt;A&amp;1&lt;/b&gt;");
    const sdL = a.uncertainty!.rows[0]!.LSd;
    const cA = a.change;
    expect(html).toContain(`${cA.labFrom.L.toFixed(1)} ± ${sdL.toFixed(1)} · `);
    expect(html).toContain(
      `${(Math.round(cA.dE00 * 100) / 100).toFixed(2)} ± ${
        (Math.round(a.uncertainty!.changeDE00Sd! * 100) / 100).toFixed(2)
      }</td>`,
    );
    expect(html).toContain('<span class="undecided">undecided</span>');
    expect(html).toContain(
      "target met by 2 of 3 (with uncertainty: 1 pass, 1 undecided, 1 fail)",
    );
    expect(html).toContain(
      "uncertainty: noise σ 0.003, level σ 0, wavelength σ 0 nm, thickness σ 0.02 mm, path σ 0.06 mm",
    );
    expect(html).toMatch(/probability of passing \d+\.\d %/);
    expect(html.split("Verdict: conformance probability").length - 1).toBe(1);
    for (const [i, s] of [a, b, c].entries()) {
      const page = html.slice(html.indexOf(`id="stone-${i}"`));
      const ab = page.slice(
        page.indexOf(`aria-label="a*b* shift`),
        page.indexOf("</svg>", page.indexOf(`aria-label="a*b* shift`)),
      );
      // two dashed polylines (one per light), each the closed 48-segment ellipse drawn to the
      // printing tolerance (so at most its 49 vertices)
      const ellipses = [...ab.matchAll(/<path[^>]*stroke-dasharray="3 2" d="([^"]+)"/g)];
      expect(ellipses.length).toBe(2);
      const vertices = pathVertices(ellipses[0]![1]!);
      expect(vertices.length).toBeLessThanOrEqual(49);
      expect(vertices[0]).toEqual(vertices[vertices.length - 1]);
      // the ellipse is JCGM 102's from the a*, b* block of the from-light's covariance
      const u = s.uncertainty!.rows.find((x) => x.illuminant === s.change.from)!;
      const m = u.labCovariance;
      const want = coverageEllipse([s.change.labFrom.a, s.change.labFrom.b], [
        [m[1]![1]!, m[1]![2]!],
        [m[2]![1]!, m[2]![2]!],
      ]);
      const got = reportDetail(s).ellipseFrom!;
      got.forEach(([x, y], k) => {
        expect(Math.abs(x - want[k]![0])).toBeLessThan(0.006);
        expect(Math.abs(y - want[k]![1])).toBeLessThan(0.006);
      });
    }

    // the page depends on results.json alone
    const again = await Deno.makeTempDir();
    expect((await runCli("report", `${out}/results.json`, "--out", again)).code).toBe(0);
    expect(await Deno.readTextFile(`${again}/index.html`)).toBe(html);
  });

  it("enabled: false computes none, and the columns stay blank", async () => {
    const lot = await makeLot(1, false);
    const out = await Deno.makeTempDir();
    const settings = `${out}/s.yaml`;
    await Deno.writeTextFile(settings, `uncertainty: { enabled: false, noiseSd: 0.01 }\n`);
    const r = await runCli("batch", lot, "--out", out, "--settings", settings, "--quiet");
    expect(r.code).toBe(0);
    const doc = await readResultsJson(`${out}/results.json`);
    expect(doc.samples[0].uncertainty).toBeNull();
    const rows = parse(await Deno.readTextFile(`${out}/results.csv`), {
      columns: true,
    }) as Record<string, string>[];
    expect(rows[0]!["L* sd"]).toBe("");
    expect(rows[0]!["change dE00 sd"]).toBe("");
    const html = await Deno.readTextFile(`${out}/index.html`);
    expect(html).not.toContain("Uncertainties: standard uncertainties");
    expect(html).not.toContain('stroke-dasharray="3 2"');
  });
});

describe("uncertainty settings and sheet columns", () => {
  it("defaults: noise estimated, other σ 0, levels 0.95 and 0.05; the sheet's sd columns reach the sample", () => {
    const s = resolveSettings({ uncertainty: {} });
    expect(s.uncertainty).toEqual({
      offsetSd: 0,
      wavelengthSdNm: 0,
      thicknessSdMm: 0,
      pathSdMm: 0,
      passAt: 0.95,
      failAt: 0.05,
    });
    expect(resolveSettings({}).uncertainty).toBeUndefined();
    expect(resolveSettings({ uncertainty: { enabled: false } }).uncertainty).toBeUndefined();
    const [row] = parseManifest('file,thickness_sd,path_sd (mm)\na.csv,"0,03",0.1\n', "s.csv");
    const one = settingsForSample(
      resolveSettings({ uncertainty: { thicknessSdMm: 0.5, offsetSd: "0,002", passAt: 0.9 } }),
      row,
    );
    expect(one.uncertainty).toEqual({
      sources: { offsetSd: 0.002, wavelengthSdNm: 0, thicknessSdMm: 0.03, pathSdMm: 0.1 },
      passAt: 0.9,
      failAt: 0.05,
    });
    expect("noiseSd" in one.uncertainty!.sources).toBe(false);
    expect(settingsForSample(resolveSettings({}), row).uncertainty).toBeUndefined();
  });

  it("refuses negative σ, levels outside (0, 1) and failAt ≥ passAt, naming the setting", () => {
    const bad: [unknown, RegExp][] = [
      [{ thicknessSdMm: -0.01 }, /uncertainty\.thicknessSdMm/],
      [{ noiseSd: -1 }, /uncertainty\.noiseSd/],
      [{ wavelengthSdNm: "x" }, /uncertainty\.wavelengthSdNm/],
      [{ passAt: 1 }, /uncertainty\.passAt/],
      [{ failAt: 0 }, /uncertainty\.failAt/],
      [{ passAt: 0.5, failAt: 0.6 }, /failAt must be below passAt/],
      [{ passAt: 0.5, failAt: 0.5 }, /failAt must be below passAt/],
      [{ failAt: 0.97 }, /failAt must be below passAt/],
      [{ enabled: "yes" }, /uncertainty\.enabled/],
    ];
    for (const [u, message] of bad) {
      expect(() => resolveSettings({ uncertainty: u })).toThrow(SettingsError);
      expect(() => resolveSettings({ uncertainty: u })).toThrow(message);
    }
    expect(() => resolveSettings({ alphaBase: "2" })).toThrow(/alphaBase/);
    expect(resolveSettings({ alphaBase: 10 }).alphaBase).toBe("10");
    expect(resolveSettings({}).alphaBase).toBe("e");
  });

  it("sheet sd and alpha_base cells are checked with their line", () => {
    expect(() => parseManifest("file,thickness_sd\na.csv,0.1\nb.csv,-0.1\n", "s.csv")).toThrow(
      /s\.csv:3: thickness_sd must be a standard uncertainty/,
    );
    expect(() => parseManifest("file,path_sd\na.csv,abc\n", "s.csv")).toThrow(/s\.csv:2: path_sd/);
    expect(() => parseManifest("file,alpha_base\na.csv,2\n", "s.csv")).toThrow(
      /s\.csv:2: alpha_base must be e or 10/,
    );
    expect(parseManifest("file,alpha_base\na.csv,10\n", "s.csv")[0]!.alphaBase).toBe("10");
  });
});

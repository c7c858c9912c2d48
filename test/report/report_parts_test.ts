import { describe, it } from "node:test";
import { expect } from "expect";
import { cssString, fileLabel, MARKS } from "../../lib/report/mod.ts";
import { scriptHash } from "../../lib/report/script_hash.ts";
import { niceTicks, svgChart } from "../../lib/report/svg_chart.ts";
import { resolveSettings, SettingsError } from "../../lib/batch/settings_schema.ts";

describe("report parts", () => {
  it("scriptHash() is the CSP hash source: base64 SHA-256 of the exact text", async () => {
    // FIPS 180-4 test vector: SHA-256("abc") = ba7816bf 8f01cfea 414140de 5dae2223 …
    expect(scriptHash("abc")).toBe("'sha256-ungWv48Bz+pBQUDeXa4iI7ADYaOWF3qctBD/YfIAFa0='");
    const text = "console.log('é')";
    const digest = new Uint8Array(
      await crypto.subtle.digest("SHA-256", new TextEncoder().encode(text)),
    );
    expect(scriptHash(text)).toBe(`'sha256-${btoa(String.fromCharCode(...digest))}'`);
  });

  it("cssString() quotes any text so it cannot leave the string or the style element", () => {
    const css = cssString(`a"b\\c</style><script>x</script>\n`);
    expect(css).not.toMatch(/<|>|\n/);
    expect(css.slice(1, -1)).not.toContain('"');
    expect(css).toBe(
      '"a\\22 b\\5c c\\3c \\2f style\\3e \\3c script\\3e x\\3c \\2f script\\3e \\a "',
    );
    expect(cssString("Lot 7, 2026-12")).toBe('"Lot 7, 2026-12"');
  });

  it("fileLabel() keeps the file name alone (POSIX and Windows paths)", () => {
    expect(fileLabel("/home/lab/runs/2026/stone-001.csv")).toBe("stone-001.csv");
    expect(fileLabel("C:\\data\\run 4\\R-01.jdx")).toBe("R-01.jdx");
    expect(fileLabel("plain.csv")).toBe("plain.csv");
  });

  it("niceTicks() steps by 1, 2 or 5 times a power of ten (common practice)", () => {
    expect(niceTicks(0, 1)).toEqual([0, 0.2, 0.4, 0.6, 0.8, 1]);
    expect(niceTicks(380, 830)).toEqual([400, 500, 600, 700, 800]);
    // range 60 over about 5 ticks: 12 rounds up to the next 1-2-5 step, 20
    expect(niceTicks(-30, 30)).toEqual([-20, 0, 20]);
  });

  it("svgChart() escapes its labels and draws nothing for non-finite points", () => {
    const svg = svgChart({
      id: "t",
      title: `<b>"x"</b>`,
      xLabel: "<x>",
      yLabel: "y",
      x: [0, 1],
      y: [0, 1],
      series: [{ points: [[0.5, NaN], [0.2, 0.2]], color: "#000", kind: "points", label: "<p>" }],
    });
    expect(svg).not.toMatch(/<b>|<x>|<p>/);
    expect(svg.match(/<circle/g)?.length).toBe(2); // one point, one legend mark
  });

  it("the marks are the ones the legend explains", () => {
    expect(MARKS.outOfGamut.symbol).toBe("◆");
    expect(MARKS.outOfGamut.text).toMatch(/outside sRGB/);
  });
});

describe("report settings", () => {
  it("accept text fields, a date and an audience", () => {
    const s = resolveSettings({
      report: { title: "Lot 7", lab: "Lab", client: 42, date: "2026-11-30", audience: "client" },
    });
    expect(s.report).toEqual({
      title: "Lot 7",
      lab: "Lab",
      client: "42",
      date: "2026-11-30",
      audience: "client",
    });
  });
  it("refuse a wrong audience, an unknown key, a non-text field and a too long title", () => {
    expect(() => resolveSettings({ report: { audience: "public" } })).toThrow(
      /report.audience must be internal or client/,
    );
    expect(() => resolveSettings({ report: { titel: "x" } })).toThrow(
      /Unknown setting "report.titel"/,
    );
    expect(() => resolveSettings({ report: { lab: { a: 1 } } })).toThrow(SettingsError);
    expect(() => resolveSettings({ report: { title: "x".repeat(201) } })).toThrow(/at most 200/);
    expect(() => resolveSettings({ report: "Lot 7" })).toThrow(/must be a mapping/);
  });
});

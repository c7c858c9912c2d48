/// <reference lib="dom" />
import { describe, it } from "node:test";
import { expect } from "expect";
import { ROOT, runCli } from "../_run_cli.ts";

const CHROMIUM = "/usr/bin/chromium";
const haveChromium = (() => {
  try {
    return Deno.statSync(CHROMIUM).isFile;
  } catch {
    return false;
  }
})();
const PAYLOAD = `<img src=x onerror="window.__pwned=1"><script>window.__pwned=2</script>`;

async function openReport(htmlPath: string, screenshot: string) {
  const puppeteer = (await import("puppeteer-core")).default;
  const profile = await Deno.makeTempDir({ prefix: "crystint-chromium-" });
  const browser = await puppeteer.launch({
    executablePath: CHROMIUM,
    headless: true,
    userDataDir: profile,
    args: [
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
    ],
  });
  try {
    const page = await browser.newPage();
    const problems: string[] = [];
    page.on("console", (m) => {
      if (m.type() === "error") problems.push(m.text());
    });
    page.on("pageerror", (e) => problems.push(String(e)));
    page.on("dialog", (d) => {
      problems.push(`dialog: ${d.message()}`);
      d.dismiss();
    });
    await page.setViewport({ width: 1300, height: 2200 });
    await page.goto(`file://${htmlPath}`, { waitUntil: "load" });
    await new Promise((r) => setTimeout(r, 300));
    const facts = await page.evaluate(() => {
      const canvases = [...document.querySelectorAll("canvas")].filter((c) =>
        !c.closest("[hidden]")
      );
      const blank = canvases.filter((c) => {
        const ctx = c.getContext("2d")!;
        const d = ctx.getImageData(0, 0, c.width, c.height).data;
        let painted = 0;
        for (let i = 3; i < d.length; i += 4 * 7) if (d[i]! > 0) painted++;
        return painted < 50;
      }).map((c) => c.id);
      return {
        canvases: canvases.map((c) => c.id),
        blank,
        rows: document.querySelectorAll("#summary tbody tr").length,
        firstCell: document.querySelector("#summary tbody tr td")?.textContent ?? "",
        pwned: (window as unknown as { __pwned?: number }).__pwned ?? 0,
        injectedImages: document.querySelectorAll("img").length,
      };
    });
    // sorting: a click on the ΔE00 header orders the rows by that column
    const sorted = await page.evaluate(() => {
      const th = [...document.querySelectorAll("#summary th")].find((h) =>
        h.textContent!.startsWith("ΔE00")
      )!;
      const col = [...th.parentElement!.children].indexOf(th);
      (th as HTMLElement).click();
      const values = [...document.querySelectorAll("#summary tbody tr")].map((tr) =>
        // the sort key: data-value, or the text where the two are the same
        Number(
          (tr as HTMLTableRowElement).cells[col]!.getAttribute("data-value") ??
            (tr as HTMLTableRowElement).cells[col]!.textContent!.trim(),
        )
      );
      return values.every((v, i) => i === 0 || v >= values[i - 1]!);
    });
    // sorting by dopant: numbers ascending, samples without an estimate last
    const dopant = await page.evaluate(() => {
      (document.querySelector('#summary th[data-key="dopant"]') as HTMLElement).click();
      const values = [...document.querySelectorAll("#summary tbody tr")].map((tr) =>
        (tr as HTMLTableRowElement).cells[8]!.getAttribute("data-value")!
      );
      const firstEmpty = values.indexOf("");
      const numbers = values.filter((v) => v !== "").map(Number);
      return {
        count: numbers.length,
        ascending: numbers.every((v, i) => i === 0 || v >= numbers[i - 1]!),
        emptiesLast: firstEmpty === -1 || values.slice(firstEmpty).every((v) => v === ""),
      };
    });
    const caution = await page.$eval(".caution", (el) => el.textContent!);
    await Deno.mkdir(`${ROOT}test/output`, { recursive: true });
    await page.screenshot({ path: screenshot, fullPage: false });
    return { ...facts, sorted, dopant, caution, problems };
  } finally {
    await browser.close();
    await Deno.remove(profile, { recursive: true }).catch(() => {});
  }
}

describe(
  "the HTML report in headless Chromium",
  { skip: !haveChromium && !Deno.env.get("CI") },
  () => {
    it("the demo report: no console errors, every chart painted, one row per sample", async () => {
      const out = await Deno.makeTempDir();
      // the demo settings take the calibration from reports/demo, as `deno task demo` makes it
      await Deno.mkdir(`${ROOT}reports/demo`, { recursive: true });
      const cal = await runCli(
        "calibrate",
        `${ROOT}spectra/standards/standards.csv`,
        "--out",
        `${ROOT}reports/demo/cr-calibration.json`,
      );
      expect(cal.code).toBe(0);
      const r = await runCli(
        "batch",
        `${ROOT}spectra/demo`,
        "--manifest",
        `${ROOT}spectra/demo/manifest.csv`,
        "--settings",
        `${ROOT}spectra/demo/settings.yaml`,
        "--out",
        out,
        "--quiet",
      );
      expect(r.code).toBe(2);
      const results = JSON.parse(await Deno.readTextFile(`${out}/results.json`));
      const seen = await openReport(`${out}/index.html`, `${ROOT}test/output/demo-report.png`);
      expect(seen.problems).toEqual([]);
      expect(seen.rows).toBe(results.samples.length);
      expect(seen.rows).toBeGreaterThanOrEqual(20);
      expect(seen.canvases.length).toBeGreaterThanOrEqual(6);
      expect(seen.blank).toEqual([]);
      expect(seen.dopant.count).toBeGreaterThan(0); // the demo places stones on its calibration
      expect(seen.dopant.ascending).toBe(true);
      expect(seen.dopant.emptiesLast).toBe(true);
      expect(seen.caution).toContain("HF"); // internal audience (the default): workshop hazards
    });

    it("a sample name carrying HTML and script is shown as text and nothing runs", async () => {
      const dir = await Deno.makeTempDir();
      const base = await Deno.readTextFile(`${ROOT}test/fixtures/colour/colour_change_5nm.csv`);
      await Deno.writeTextFile(
        `${dir}/evil.csv`,
        base.replace(
          "wavelength_nm,T",
          `wavelength_nm,"${PAYLOAD.replaceAll('"', '""')} transmittance"`,
        ),
      );
      await Deno.writeTextFile(
        `${dir}/sheet.csv`,
        `file,thickness_mm,notes\nevil.csv,2,"${PAYLOAD.replaceAll('"', '""')}"\n`,
      );
      const out = `${dir}/out`;
      const r = await runCli(
        "batch",
        `${dir}/evil.csv`,
        "--manifest",
        `${dir}/sheet.csv`,
        "--out",
        out,
        "--quiet",
      );
      expect(r.stderr).toBe("");
      expect(r.code).toBe(0);
      const seen = await openReport(`${out}/index.html`, `${ROOT}test/output/escaping.png`);
      expect(seen.pwned).toBe(0);
      expect(seen.injectedImages).toBe(0);
      expect(seen.problems).toEqual([]);
      expect(seen.firstCell).toContain("<img src=x");
    });
  },
);

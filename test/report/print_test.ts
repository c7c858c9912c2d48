/// <reference lib="dom" />
// The report as people read, print and send it, checked in headless Chromium: widths, the
// printed PDF (cover + one page per stone), filter and sort, the 10°-only chromaticity, the
// audience's caution, escaping of the report settings, and the strict script CSP.
import { describe, it } from "node:test";
import { expect } from "expect";
import { makeLot, ROOT, runCli } from "../_run_cli.ts";

const CHROMIUM = "/usr/bin/chromium";
const haveChromium = (() => {
  try {
    return Deno.statSync(CHROMIUM).isFile;
  } catch {
    return false;
  }
})();
const PAYLOAD = `<img src=x onerror="window.__pwned=1"><script>window.__pwned=2</script>`;
const yamlText = (s: string) => JSON.stringify(s); // a JSON string is a YAML double-quoted scalar

type Page = import("puppeteer-core").Page;

/** Opens a page in a fresh headless Chromium, collecting console errors and page errors. */
async function withPage<T>(htmlPath: string, f: (page: Page, problems: string[]) => Promise<T>) {
  const puppeteer = (await import("puppeteer-core")).default;
  const profile = await Deno.makeTempDir({ prefix: "crystint-chromium-" });
  const browser = await puppeteer.launch({
    executablePath: CHROMIUM,
    headless: true,
    pipe: true,
    userDataDir: profile,
    args: ["--no-sandbox", "--disable-gpu", "--no-first-run", "--disable-background-networking"],
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
    await page.setViewport({ width: 1400, height: 1000 });
    await page.goto(`file://${htmlPath}`, { waitUntil: "load" });
    return await f(page, problems);
  } finally {
    await browser.close();
    await Deno.remove(profile, { recursive: true }).catch(() => {});
  }
}

/** Runs a batch of `count` generated stones with the given settings text; returns the page. */
async function lotReport(count: number, settings: string): Promise<{ lot: string; html: string }> {
  const lot = await makeLot(count, false);
  const dir = await Deno.makeTempDir();
  await Deno.writeTextFile(`${dir}/settings.yaml`, settings);
  const r = await runCli(
    "batch",
    lot,
    "--settings",
    `${dir}/settings.yaml`,
    "--out",
    `${dir}/out`,
    "--quiet",
  );
  expect(r.stderr).toBe("");
  expect(r.code).toBe(0);
  return { lot, html: `${dir}/out/index.html` };
}

/** Pixels painted by the data marks of each SVG chart (axes, grid and labels removed). */
function dataPixelsInPage(selector: string): Promise<number[]> {
  const svgs = [...document.querySelectorAll(selector)] as SVGSVGElement[];
  return Promise.all(svgs.map(async (svg) => {
    const copy = svg.cloneNode(true) as SVGSVGElement;
    for (const child of [...copy.children]) {
      if (child.tagName !== "defs" && !child.hasAttribute("clip-path")) child.remove();
    }
    copy.setAttribute("width", "360");
    copy.setAttribute("height", "250");
    const img = new Image();
    img.src = "data:image/svg+xml;charset=utf-8," +
      encodeURIComponent(new XMLSerializer().serializeToString(copy));
    await img.decode();
    const canvas = document.createElement("canvas");
    canvas.width = 360;
    canvas.height = 250;
    const ctx = canvas.getContext("2d")!;
    ctx.drawImage(img, 0, 0);
    const d = ctx.getImageData(0, 0, 360, 250).data;
    let painted = 0;
    for (let i = 3; i < d.length; i += 4) if (d[i]! > 0) painted++;
    return painted;
  }));
}

/** Pages in a PDF: its page objects (PDF 1.7, ISO 32000-1 §7.7.3.3, /Type /Page). */
function pdfPageCount(pdf: Uint8Array): number {
  const text = new TextDecoder("latin1").decode(pdf);
  return (text.match(/\/Type\s*\/Page(?![s\w])/g) ?? []).length;
}

const havePdftotext = (() => {
  try {
    return Deno.statSync("/usr/bin/pdftotext").isFile;
  } catch {
    return false;
  }
})();

describe(
  "the report read, printed and sent",
  { skip: !haveChromium && !Deno.env.get("CI") },
  () => {
    it("30 stones: fits 1400 px and 390 px, prints a cover and one page per stone, filters and sorts", async () => {
      const { lot, html } = await lotReport(
        30,
        `report:\n  title: "Lot 7 colour statement"\n  lab: "Workshop lab"\n  audience: client\n` +
          `target: { L: 60.904, a: 13.49, b: -20.66, toleranceDE00: 0.01, observer: "10" }\n`,
      );
      const text = await Deno.readTextFile(html);
      // no folder of this machine in the page (file names alone)
      expect(text).not.toContain(lot);
      expect(text).toContain("stone-001.csv");
      // strict script policy: hashes, no 'unsafe-inline' for scripts
      const csp = text.match(/Content-Security-Policy" content="([^"]+)"/)![1]!;
      expect(csp).toMatch(/script-src 'sha256-[A-Za-z0-9+/=]+' 'sha256-[A-Za-z0-9+/=]+';/);
      expect(csp).not.toMatch(/script-src[^;]*unsafe-inline/);

      await withPage(html, async (page, problems) => {
        for (const width of [1400, 390]) {
          await page.setViewport({ width, height: 1200 });
          await new Promise((r) => setTimeout(r, 150));
          const fit = await page.evaluate(() => ({
            scroll: document.documentElement.scrollWidth,
            inner: innerWidth,
            // elements sticking out, outside the summary's own scrolling box
            wide: [...document.querySelectorAll("body *")].filter((el) =>
              !el.closest(".table-box") && el.getBoundingClientRect().right > innerWidth + 0.5
            ).map((el) => el.tagName),
          }));
          expect(fit.scroll).toBeLessThanOrEqual(fit.inner);
          expect(fit.wide).toEqual([]);
          await page.screenshot({ path: `${ROOT}test/output/lot30-${width}.png` });
        }
        await page.setViewport({ width: 1400, height: 1000 });

        // filter: "stone-02" leaves stone-020 … stone-029
        const filtered = await page.evaluate(() => {
          const box = document.getElementById("filter") as HTMLInputElement;
          box.value = "stone-02";
          box.dispatchEvent(new Event("input"));
          const shown = [...document.querySelectorAll<HTMLTableRowElement>("#summary tbody tr")]
            .filter((tr) => !tr.hidden).map((tr) => tr.cells[0]!.textContent!.trim());
          const count = document.getElementById("filter-count")!.textContent;
          box.value = "";
          box.dispatchEvent(new Event("input"));
          return { shown, count };
        });
        expect(filtered.shown.sort()).toEqual(
          Array.from({ length: 10 }, (_, i) => `stone-02${i}`),
        );
        expect(filtered.count).toBe("10 of 30 shown");

        // sorting by sample (twice: descending), by ΔE00, and by the target verdict
        const sorted = await page.evaluate(() => {
          const rows =
            () => [...document.querySelectorAll<HTMLTableRowElement>("#summary tbody tr")];
          const click = (key: string) =>
            (document.querySelector(`#summary th[data-key="${key}"]`) as HTMLElement).click();
          click("sample");
          click("sample");
          const names = rows().map((tr) => tr.cells[0]!.textContent!.trim());
          click("dE00");
          // the sort key: data-value, or the text where the two are the same
          const dE = rows().map((tr) =>
            Number(tr.cells[5]!.getAttribute("data-value") ?? tr.cells[5]!.textContent!.trim())
          );
          click("target");
          const verdicts = rows().map((tr) => tr.cells[7]!.textContent!.trim().split(" ")[0]!);
          const targetDe = rows().map((tr) =>
            Number(tr.cells[7]!.textContent!.trim().split(" ")[1])
          );
          return { names, dE, verdicts, targetDe };
        });
        expect(sorted.names[0]).toBe("stone-029");
        expect(sorted.names[29]).toBe("stone-000");
        expect(sorted.dE.every((v, i) => i === 0 || v >= sorted.dE[i - 1]!)).toBe(true);
        const firstFail = sorted.verdicts.indexOf("fail");
        // the target is the first stones' colour, so some pass and some fail
        expect(firstFail).toBeGreaterThan(0);
        expect(sorted.verdicts.slice(firstFail === -1 ? 30 : firstFail)).not.toContain("pass");
        const passes = sorted.targetDe.slice(0, firstFail === -1 ? 30 : firstFail);
        expect(passes.every((v, i) => i === 0 || v >= passes[i - 1]!)).toBe(true);

        // the lot a*b* chart: no arrows until a stone is hovered or opened
        const arrows = await page.evaluate(() => {
          const chart = (window as unknown as {
            Chart: {
              getChart(c: Element): { options: { plugins: { abArrows: { pairs: unknown[] } } } };
            };
          }).Chart.getChart(document.getElementById("ab-all")!);
          const opened = chart.options.plugins.abArrows.pairs.length;
          [...document.querySelectorAll<HTMLElement>("#summary tbody tr")].find((tr) =>
            tr.dataset.index !== "0"
          )!.dispatchEvent(
            new MouseEvent("mouseover", { bubbles: true }),
          );
          const hovered = chart.options.plugins.abArrows.pairs as unknown[][];
          return { opened, hovered: hovered.length, label: hovered[hovered.length - 1]![5] };
        });
        expect(arrows.opened).toBe(1); // the first stone's details are open
        expect(arrows.hovered).toBe(2);
        expect(String(arrows.label)).toMatch(/^stone-0\d\d$/);

        // the client caution only
        const caution = await page.$eval(".caution", (el) => el.textContent!);
        expect(caution).toContain("measurement aid");
        expect(caution).not.toContain("HF");

        // print: one page per stone with its name, swatches and painted charts
        await page.emulateMediaType("print");
        const stones = await page.evaluate(async (pixels: string) => {
          const count = new Function("selector", `return (${pixels})(selector)`) as (
            s: string,
          ) => Promise<number[]>;
          const out = [];
          for (const s of document.querySelectorAll<HTMLElement>(".stone")) {
            out.push({
              name: s.querySelector(".stone-name")!.textContent!,
              visible: s.getBoundingClientRect().height > 0,
              swatches: s.querySelectorAll(".swatch").length,
              painted: await count(`#${s.id} svg.plot`),
            });
          }
          return out;
        }, dataPixelsInPage.toString());
        expect(stones.length).toBe(30);
        for (const s of stones) {
          expect(s.visible).toBe(true);
          expect(s.name).toMatch(/^stone-0\d\d /);
          expect(s.swatches).toBeGreaterThanOrEqual(2);
          expect(s.painted.filter((p) => p > 40).length).toBeGreaterThanOrEqual(2);
        }
        const pdf = await page.pdf({ preferCSSPageSize: true, printBackground: true });
        const pdfPath = `${ROOT}test/output/lot30.pdf`;
        await Deno.mkdir(`${ROOT}test/output`, { recursive: true });
        await Deno.writeFile(pdfPath, pdf);
        expect(pdfPageCount(pdf)).toBeGreaterThanOrEqual(31);
        if (havePdftotext) {
          // each stone's name on a page of its own, in order, after the cover
          const pages = new TextDecoder().decode(
            (await new Deno.Command("/usr/bin/pdftotext", { args: ["-layout", pdfPath, "-"] })
              .output()).stdout,
          ).split("\f");
          const stonePages = pages.filter((p) =>
            /^\s*Lot 7 colour statement[\s\S]*\n\s*stone-0\d\d\s+stone-0\d\d\.csv/.test(p)
          );
          expect(stonePages.length).toBe(30);
          // axis titles and tick labels drawn by reference (<use> of the page's shared
          // definitions) are printed on every stone page
          for (const p of stonePages) {
            expect(p).toContain("wavelength (nm)");
            expect(p).toContain("transmittance");
            expect(p).toMatch(/\b600\b/);
          }
          expect(pages.filter((p) => /page \d+ of \d+/.test(p)).length).toBe(pdfPageCount(pdf));
        }
        expect(problems).toEqual([]);
      });
    });

    it("only the 10° observer: the chromaticity charts draw their points and say which observer", async () => {
      const { html } = await lotReport(
        3,
        `observers: ["10"]\nchange: { from: D65, to: A, observer: "10" }\n`,
      );
      await withPage(html, async (page, problems) => {
        const seen = await page.evaluate(() => {
          const Chart = (window as unknown as {
            Chart: {
              getChart(c: Element): { data: { datasets: { label: string; data: unknown[] }[] } };
            };
          }).Chart;
          const sets = Chart.getChart(document.getElementById("xy-all")!).data.datasets;
          const canvas = document.getElementById("xy-all") as HTMLCanvasElement;
          const d = canvas.getContext("2d")!.getImageData(0, 0, canvas.width, canvas.height).data;
          let painted = 0;
          for (let i = 3; i < d.length; i += 4) if (d[i]! > 0) painted++;
          return {
            points: sets.filter((s) => s.label.startsWith("under ")).map((s) => s.data.length),
            locus: sets.some((s) => s.label.includes("10°")),
            painted,
            titles: [...document.querySelectorAll("h3, figcaption")].map((h) => h.textContent!)
              .filter((t) => t.startsWith("Chromaticity")),
          };
        });
        expect(seen.points).toEqual([3, 3]); // three stones under D65 and under A
        expect(seen.locus).toBe(true);
        expect(seen.painted).toBeGreaterThan(500);
        expect(seen.titles.length).toBeGreaterThanOrEqual(3);
        for (const t of seen.titles) expect(t).toContain("10° observer");
        await page.emulateMediaType("print");
        const printed = await page.$$eval("svg[aria-label^=chromaticity] circle", (c) => c.length);
        expect(printed).toBeGreaterThanOrEqual(3 * 2 * 2); // stone pages: a point and a white per light
        expect(problems).toEqual([]);
      });
    });

    it("title, lab, client, operator and note carrying HTML are shown as text and nothing runs", async () => {
      const p = yamlText(PAYLOAD);
      const { html } = await lotReport(
        2,
        `report:\n  title: ${p}\n  lab: ${p}\n  client: ${p}\n  operator: ${p}\n  note: ${p}\n` +
          `  date: ${yamlText(`2026-12-01 ${PAYLOAD}`)}\n`,
      );
      await withPage(html, async (page, problems) => {
        await page.emulateMediaType("print");
        const seen = await page.evaluate(() => ({
          pwned: (window as unknown as { __pwned?: number }).__pwned ?? 0,
          images: document.querySelectorAll("img").length,
          title: document.querySelector("header.lot h1")!.textContent,
          who: document.querySelector("dl.who")!.textContent,
          note: document.querySelector("header.lot .note")!.textContent,
          scripts: document.querySelectorAll("script").length,
        }));
        expect(seen.pwned).toBe(0);
        expect(seen.images).toBe(0);
        expect(seen.scripts).toBe(3); // data, chart.js, the report's own
        expect(seen.title).toBe(PAYLOAD);
        expect(seen.note).toBe(PAYLOAD);
        expect(seen.who!.split(PAYLOAD).length - 1).toBe(4); // lab, client, operator, date
        const pdf = await page.pdf({ preferCSSPageSize: true });
        expect(pdfPageCount(pdf)).toBeGreaterThanOrEqual(3);
        expect(problems).toEqual([]);
      });
    });

    it("a long lot: the table shows pages of 250 rows, the filter and the sort act on all rows, print shows all", async () => {
      // 620 samples: three stones' results repeated under new names (the page is built from
      // results.json alone, so this is the page a 620-stone batch writes)
      const { html } = await lotReport(3, "");
      const dir = html.replace(/\/index\.html$/, "");
      const doc = JSON.parse(await Deno.readTextFile(`${dir}/results.json`));
      const base = doc.samples as { sample: string; file: string }[];
      doc.samples = Array.from({ length: 620 }, (_, i) => ({
        ...structuredClone(base[i % 3]!),
        sample: `long-${String(i).padStart(3, "0")}`,
        file: `long-${String(i).padStart(3, "0")}.csv`,
      }));
      const long = await Deno.makeTempDir();
      await Deno.writeTextFile(`${long}/results.json`, JSON.stringify(doc));
      const r = await runCli("report", `${long}/results.json`, "--out", `${long}/out`);
      expect(r.code).toBe(0);
      await withPage(`${long}/out/index.html`, async (page, problems) => {
        const state = () =>
          page.evaluate(() => {
            const rows = [...document.querySelectorAll<HTMLTableRowElement>("#summary tbody tr")];
            const seen = rows.filter((tr) => getComputedStyle(tr).display !== "none");
            return {
              rows: rows.length,
              seen: seen.map((tr) => tr.cells[0]!.textContent!.trim()),
              // the two pagers (above and below the table) always agree
              info: [...document.querySelectorAll(".page-info")].map((x) => x.textContent)
                .join(" | "),
              prev: [...document.querySelectorAll<HTMLButtonElement>(".page-prev")]
                .map((b) => b.disabled).join(),
              next: [...document.querySelectorAll<HTMLButtonElement>(".page-next")]
                .map((b) => b.disabled).join(),
            };
          });
        let s = await state();
        expect(s.rows).toBe(620);
        expect(s.seen.length).toBe(250);
        expect(s.seen[0]).toBe("long-000");
        expect(s.info).toBe("rows 1–250 of 620 | rows 1–250 of 620");
        expect([s.prev, s.next]).toEqual(["true,true", "false,false"]);
        await page.click(".page-next"); // above the table
        await page.click(".table-box + .tools .page-next"); // below it
        s = await state();
        expect(s.seen.length).toBe(120);
        expect(s.seen[0]).toBe("long-500");
        expect(s.info).toBe("rows 501–620 of 620 | rows 501–620 of 620");
        expect([s.prev, s.next]).toEqual(["false,false", "true,true"]);
        // the filter finds rows on any page and starts again at the first page
        await page.evaluate(() => {
          const box = document.getElementById("filter") as HTMLInputElement;
          box.value = "long-61";
          box.dispatchEvent(new Event("input"));
        });
        s = await state();
        expect(s.seen).toEqual(Array.from({ length: 10 }, (_, i) => `long-61${i}`));
        expect(s.info).toBe("rows 1–10 of 10 | rows 1–10 of 10");
        // sorting by sample, descending: the first page starts with the last name
        await page.evaluate(() => {
          const box = document.getElementById("filter") as HTMLInputElement;
          box.value = "";
          box.dispatchEvent(new Event("input"));
        });
        await page.click('th[data-key="sample"]');
        await page.click('th[data-key="sample"]');
        s = await state();
        expect(s.seen.length).toBe(250);
        expect(s.seen[0]).toBe("long-619");
        // print media shows every row
        await page.emulateMediaType("print");
        const printed = await page.evaluate(() =>
          [...document.querySelectorAll<HTMLTableRowElement>("#summary tbody tr")]
            .filter((tr) => getComputedStyle(tr).display !== "none").length
        );
        expect(printed).toBe(620);
        expect(problems).toEqual([]);
      });
    });
  },
);

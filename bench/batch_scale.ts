/// <reference lib="dom" />
/**
 * Batch at scale (issue 13, goal 4): `deno run -A bench/batch_scale.ts N [--browser] [--keep]`.
 * Writes N small single-spectrum exports (1 nm, 360–830 nm, invented smooth spectra with noise,
 * four layouts) to a temp folder, runs `crystint batch` on them as a child process twice (cold,
 * then cached) and prints files/s, peak RSS (VmHWM of the child polled from /proc), results.json
 * bytes per sample and the index.html size. With --browser, opens index.html in headless
 * Chromium (puppeteer-core) and times navigation → first row of the summary table visible.
 * A script, not a `deno bench` file: one run takes from seconds to many minutes.
 *
 * @module
 */
import puppeteer from "puppeteer-core";

const n = Number(Deno.args.find((a) => /^\d+$/.test(a)) ?? 1000);
const browser = Deno.args.includes("--browser");
const keep = Deno.args.includes("--keep");
const dir = await Deno.makeTempDir({ prefix: "crystint-batch-scale-" });
const input = `${dir}/in`, out = `${dir}/out`;
await Deno.mkdir(input);

/** Seeded uniform numbers (LCG), so every run writes the same files. */
let seed = 2026;
const rnd = () => {
  seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
  return seed / 4294967296;
};
/** Invented smooth transmittance: a broad band or two on a flat level, noise growing as T falls. */
const transmittance = (k: number): number[] => {
  const c1 = 420 + 300 * rnd(), w1 = 40 + 80 * rnd(), d1 = 0.2 + 1.2 * rnd();
  const c2 = 380 + 400 * rnd(), w2 = 20 + 60 * rnd(), d2 = (k % 3) * 0.3 * rnd();
  const level = 0.7 + 0.15 * rnd();
  const t: number[] = [];
  for (let nm = 360; nm <= 830; nm++) {
    const a = d1 * Math.exp(-0.5 * ((nm - c1) / w1) ** 2) +
      d2 * Math.exp(-0.5 * ((nm - c2) / w2) ** 2);
    const clean = level * 10 ** -a;
    t.push(Math.max(0, clean + (0.002 / Math.sqrt(clean + 0.01)) * (rnd() - 0.5)));
  }
  return t;
};
const LAYOUTS = ["csv", "semicolon", "tsv", "txt"] as const;
const encoder = new TextEncoder();
const t0Gen = performance.now();
let inputBytes = 0;
for (let k = 0; k < n; k++) {
  const t = transmittance(k), layout = LAYOUTS[k % LAYOUTS.length]!;
  const name = `S${String(k).padStart(6, "0")}`;
  let text: string, file: string;
  if (layout === "csv") {
    // percent transmittance, ascending
    text = `Wavelength (nm),${name} %T\n` +
      t.map((v, i) => `${360 + i},${(100 * v).toFixed(3)}`).join("\n") + "\n";
    file = `${name}.csv`;
  } else if (layout === "semicolon") {
    // metadata block, decimal commas, fraction T
    text = `Sample;${name}\nThickness (mm);${(1 + (k % 5) * 0.5).toFixed(2).replace(".", ",")}\n` +
      `Operator;bench\n\nWavelength (nm);T\n` +
      t.map((v, i) => `${360 + i},0;${v.toFixed(5).replace(".", ",")}`).join("\n") + "\n";
    file = `${name}_scan.txt`;
  } else if (layout === "tsv") {
    // absorbance, descending scan, comment line
    text = `# descending scan\nnm\tAbsorbance\n` +
      t.map((_, i) => {
        const v = t[t.length - 1 - i]!;
        return `${830 - i}.0\t${(-Math.log10(Math.max(v, 1e-6))).toFixed(5)}`;
      }).join("\n") + "\n";
    file = `${name}.tsv`;
  } else {
    // two plain columns with a header naming the quantity
    text = `wavelength_nm,transmittance\n` +
      t.map((v, i) => `${360 + i},${v.toFixed(5)}`).join("\n") + "\n";
    file = `${name}.csv`;
  }
  const bytes = encoder.encode(text);
  inputBytes += bytes.length;
  await Deno.writeFile(`${input}/${file}`, bytes);
}
console.log(
  `generated ${n} files (${(inputBytes / 1e6).toFixed(1)} MB) in ${
    ((performance.now() - t0Gen) / 1000).toFixed(1)
  } s into ${input}`,
);

const main = new URL("../cli/main.ts", import.meta.url).pathname;
const loadAverage = () => Deno.readTextFileSync("/proc/loadavg").split(" ").slice(0, 3).join(" ");

/** Runs the batch as a child, polling VmHWM of the child every 50 ms. */
async function runBatch(label: string) {
  const load = loadAverage();
  const t0 = performance.now();
  const child = new Deno.Command(Deno.execPath(), {
    args: [
      "run",
      // as `deno task crystint` runs it: young generations of 1 MB keep each V8 heap at about
      // 20 MB instead of letting it grow toward 100 MB over thousands of files, and a full
      // collection once the heap grows 20 % past its live size keeps garbage from piling up
      "--v8-flags=--max-semi-space-size=1,--heap-growing-percent=20",
      "--allow-read",
      "--allow-write",
      "--allow-env=LOG_TOKENS,LOG_STREAM",
      "--allow-sys=cpus,osRelease",
      main,
      "batch",
      input,
      "--out",
      out,
      "--quiet",
    ],
    stdout: "null",
    stderr: "piped",
    // as `deno task crystint` runs it: two malloc arenas instead of one per thread (glibc's
    // default lets the workers' freed typed-array stores pile up in arenas of their own)
    env: { DENO_NO_UPDATE_CHECK: "1", MALLOC_ARENA_MAX: "2" },
  }).spawn();
  let hwmKb = 0;
  const rssOverTime: [number, number][] = [];
  const poll = setInterval(() => {
    try {
      const status = Deno.readTextFileSync(`/proc/${child.pid}/status`);
      const m = /VmHWM:\s+(\d+)/.exec(status), r = /VmRSS:\s+(\d+)/.exec(status);
      if (m) hwmKb = Math.max(hwmKb, Number(m[1]));
      if (r) rssOverTime.push([performance.now() - t0, Number(r[1])]);
    } catch { /* exited */ }
  }, 50);
  const status = await child.output();
  clearInterval(poll);
  const seconds = (performance.now() - t0) / 1000;
  if (status.code !== 0) {
    console.log(new TextDecoder().decode(status.stderr).slice(-2000));
    throw new Error(`${label}: crystint batch exited ${status.code}`);
  }
  console.log(
    `${label}: ${seconds.toFixed(1)} s, ${(n / seconds).toFixed(0)} files/s, ` +
      `peak RSS ≥ ${(hwmKb / 1024).toFixed(0)} MB (VmHWM polled), load average before ${load}`,
  );
  // the RSS curve: resident size at each tenth of the run's time (MB)
  const tenths = Array.from({ length: 10 }, (_, k) => {
    const until = ((k + 1) / 10) * seconds * 1000;
    const inside = rssOverTime.filter(([t]) => t <= until && t > (k / 10) * seconds * 1000);
    return inside.length ? Math.max(...inside.map(([, kb]) => kb)) / 1024 : NaN;
  });
  console.log(
    `${label}: RSS by tenth of the run (MB): ${tenths.map((v) => v.toFixed(0)).join(" ")}`,
  );
  return seconds;
}

{
  const t0 = performance.now();
  await new Deno.Command("sh", { args: ["-c", `cat "${input}"/* > /dev/null`] }).output();
  console.log(`cat of all inputs: ${((performance.now() - t0) / 1000).toFixed(2)} s`);
}
await runBatch("cold batch");
const json = await Deno.stat(`${out}/results.json`), html = await Deno.stat(`${out}/index.html`);
const results = JSON.parse(await Deno.readTextFile(`${out}/results.json`));
const samples = results.samples?.length ?? 0, errors = results.errors?.length ?? 0;
console.log(
  `results.json ${(json.size / 1e6).toFixed(1)} MB for ${samples} samples (${errors} errors): ` +
    `${(json.size / Math.max(samples, 1) / 1000).toFixed(2)} KB a sample; ` +
    `index.html ${(html.size / 1e6).toFixed(1)} MB`,
);
if (errors > 0) console.log("first error:", JSON.stringify(results.errors[0]));
await runBatch("cached rerun");

if (browser) {
  const profile = await Deno.makeTempDir({ prefix: "crystint-chromium-" });
  const b = await puppeteer.launch({
    executablePath: "/usr/bin/chromium",
    args: [
      "--headless",
      "--no-sandbox",
      "--disable-gpu",
      "--disable-quic",
      "--no-first-run",
      "--disable-background-networking",
      "--disable-component-update",
      "--disable-sync",
      `--user-data-dir=${profile}`,
    ],
  });
  try {
    const page = await b.newPage();
    const load = loadAverage();
    const t0 = performance.now();
    // The row may be painted while the parser is still reading the rest of the page, so the
    // selector is awaited alongside the navigation; DOMContentLoaded is when scripts can run.
    let contentLoaded = NaN;
    const navigation = page.goto(`file://${out}/index.html`, {
      waitUntil: "domcontentloaded",
      timeout: 120_000,
    }).then(() => contentLoaded = (performance.now() - t0) / 1000);
    await page.waitForSelector("#summary tbody tr", { visible: true, timeout: 120_000 });
    const visible = (performance.now() - t0) / 1000;
    await navigation;
    await page.waitForNetworkIdle({ idleTime: 200, timeout: 120_000 }).catch(() => {});
    const settled = (performance.now() - t0) / 1000;
    const rows = await page.$$eval("#summary tbody tr", (r) => r.length);
    // interactive: the filter answers for a sample far down the table (timed from its input)
    const wanted = `S${String(Math.max(0, n - 1)).padStart(6, "0")}`;
    const t1 = performance.now();
    await page.evaluate((name) => {
      const box = document.getElementById("filter") as HTMLInputElement;
      box.value = name;
      box.dispatchEvent(new Event("input"));
    }, wanted);
    await page.waitForFunction(
      () => /^\d+ of /.test(document.getElementById("filter-count")?.textContent ?? ""),
      { timeout: 60_000 },
    );
    const filterMs = performance.now() - t1;
    console.log(
      `index.html in Chromium: first summary row visible after ${visible.toFixed(2)} s, ` +
        `DOMContentLoaded after ${contentLoaded.toFixed(2)} s, idle after ${
          settled.toFixed(2)
        } s, ` +
        `${rows} rows in the DOM, the filter answered in ${
          filterMs.toFixed(0)
        } ms, load average before ${load}`,
    );
  } finally {
    await b.close();
    await Deno.remove(profile, { recursive: true }).catch(() => {});
  }
}

if (keep) console.log(`kept ${dir}`);
else await Deno.remove(dir, { recursive: true });

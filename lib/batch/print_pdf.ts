/**
 * Prints a report page to PDF with the installed Chromium, headless, through puppeteer-core
 * (the page's own print stylesheet lays out the cover and one page per stone).
 *
 * @module
 */
import { SettingsError } from "./settings_schema.ts";
import { TEMP_PREFIX } from "./atomic_write.ts";

/** Where Chromium or Chrome is usually installed (Debian, Ubuntu, Fedora, snap, macOS). */
export const CHROMIUM_PLACES = [
  "/usr/bin/chromium",
  "/usr/bin/chromium-browser",
  "/usr/bin/google-chrome",
  "/usr/bin/google-chrome-stable",
  "/snap/bin/chromium",
  "/Applications/Chromium.app/Contents/MacOS/Chromium",
  "/Applications/Google Chrome.app/Contents/MacOS/Google Chrome",
];

/** The first Chromium found among `places`, or null. */
export function findChromium(places: string[] = CHROMIUM_PLACES): string | null {
  for (const p of places) {
    try {
      if (Deno.statSync(p).isFile) return p;
    } catch {
      // not there (or not allowed to look): try the next place
    }
  }
  return null;
}

/** How to print. */
export interface PrintOptions {
  /** Chromium to use (default: the first of {@linkcode CHROMIUM_PLACES} found). */
  chromium?: string;
}

/**
 * Prints `htmlPath` to `pdfPath` (A4, the page's own margins, page numbers and title);
 * writes through a temporary file so a failed print leaves no half PDF.
 *
 * @throws {SettingsError} When no Chromium is found, it may not be started, or printing fails.
 */
export async function printPdf(
  htmlPath: string,
  pdfPath: string,
  options: PrintOptions = {},
): Promise<void> {
  const chromium = options.chromium ?? findChromium();
  if (!chromium) {
    throw new SettingsError(
      `No Chromium found to print the PDF (looked at ${
        CHROMIUM_PLACES.join(", ")
      }); install it (Debian: apt-get install chromium) or name it with --chromium PATH`,
    );
  }
  if (options.chromium && !findChromium([options.chromium])) {
    throw new SettingsError(`No Chromium at ${options.chromium} (give the browser's program file)`);
  }
  const allowed = await Deno.permissions.query({ name: "run", command: chromium });
  if (allowed.state !== "granted") {
    throw new SettingsError(
      `Printing the PDF starts ${chromium}: run crystint with --allow-run=${chromium}`,
    );
  }
  const puppeteer = (await import("puppeteer-core")).default;
  const profile = await Deno.makeTempDir({ prefix: "crystint-print-" });
  const cut = pdfPath.lastIndexOf("/");
  const tmp = `${pdfPath.slice(0, cut + 1)}${TEMP_PREFIX}${
    pdfPath.slice(cut + 1)
  }-${crypto.randomUUID()}`;
  let browser: Awaited<ReturnType<typeof puppeteer.launch>> | undefined;
  try {
    browser = await puppeteer.launch({
      executablePath: chromium,
      headless: true,
      pipe: true,
      userDataDir: profile,
      args: [
        "--no-sandbox",
        "--disable-gpu",
        "--no-first-run",
        "--disable-background-networking",
        "--disable-component-update",
        "--disable-sync",
      ],
    });
    const page = await browser.newPage();
    const url = new URL(`file://${htmlPath.startsWith("/") ? "" : Deno.cwd() + "/"}${htmlPath}`);
    await page.goto(url.href, { waitUntil: "load" });
    const pdf = await page.pdf({ preferCSSPageSize: true, printBackground: true });
    await Deno.writeFile(tmp, pdf);
    await Deno.rename(tmp, pdfPath);
  } catch (e) {
    await Deno.remove(tmp).catch(() => {});
    if (e instanceof SettingsError) throw e;
    const why = e instanceof Deno.errors.NotCapable || e instanceof Deno.errors.PermissionDenied
      ? `run crystint with --allow-run=${chromium} (${(e as Error).message})`
      : (e as Error).message;
    throw new SettingsError(`Cannot print ${htmlPath} to PDF with ${chromium}: ${why}`);
  } finally {
    await browser?.close().catch(() => {});
    await Deno.remove(profile, { recursive: true }).catch(() => {});
  }
}

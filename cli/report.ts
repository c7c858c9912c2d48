/**
 * `crystint report`: re-render index.html from a saved results.json.
 *
 * @module
 */
import { reportFromResults } from "../lib/batch/report_from_results.ts";
import { SettingsError } from "../lib/batch/settings_schema.ts";
import { printPdf } from "../lib/batch/print_pdf.ts";
import { EXIT, parseCommandArgs, UsageError } from "./_shared.ts";

export const REPORT_HELP = `crystint report — re-render the HTML report from results.json

Usage:
  crystint report results.json --out DIR [--pdf FILE] [--chromium PATH]

Options:
  --pdf FILE        also print the page to FILE (cover, then one page per stone) with the
                    installed Chromium, headless
  --chromium PATH   the Chromium or Chrome to print with (default: found in the usual places)

Example:
  crystint report reports/demo/results.json --out reports/demo-copy --pdf reports/lot.pdf
`;

/** Runs the command; returns the exit code. */
export async function reportCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    out: { type: "string" },
    pdf: { type: "string" },
    chromium: { type: "string" },
    help: { type: "boolean", short: "h" },
  });
  if (values.help) {
    console.log(REPORT_HELP);
    return EXIT.ok;
  }
  if (positionals.length !== 1) throw new UsageError("Give exactly one results.json");
  if (!values.out) throw new UsageError("Option --out DIR is required");
  try {
    const page = await reportFromResults(positionals[0]!, values.out);
    console.log(page);
    if (values.pdf) {
      await printPdf(page, values.pdf, values.chromium ? { chromium: values.chromium } : {});
      console.log(values.pdf);
    }
  } catch (e) {
    if (e instanceof SettingsError) throw new UsageError(e.message);
    throw e;
  }
  return EXIT.ok;
}

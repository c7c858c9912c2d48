/**
 * `crystint report`: re-render index.html from a saved results.json, and print it to PDF.
 *
 * @module
 */
import { reportFromResults } from "../lib/batch/report_from_results.ts";
import { SettingsError } from "../lib/batch/mod.ts";
import { printPdf } from "../lib/batch/print_pdf.ts";
import type { CommandSpec } from "./_command.ts";
import { EXIT, UsageError } from "./_shared.ts";

/** The command table of `crystint report`. */
export const REPORT_COMMAND: CommandSpec = {
  name: "report",
  summary: "re-render the HTML report from a saved results.json (and print it to PDF)",
  usage: ["results.json --out DIR [--pdf FILE] [--chromium PATH]"],
  positionals: 'results.json written by "crystint batch".',
  options: [
    { name: "out", type: "string", arg: "DIR", help: "output folder (required)" },
    {
      name: "pdf",
      type: "string",
      arg: "FILE",
      help:
        "also print the page to FILE (cover, then one page per stone) with the installed Chromium, headless",
    },
    {
      name: "chromium",
      type: "string",
      arg: "PATH",
      help: "the Chromium or Chrome to print with",
      default: "found in the usual places",
    },
  ],
  examples: ["reports/demo/results.json --out reports/demo-copy --pdf reports/lot.pdf"],
  async run(args) {
    if (args.positionals.length !== 1) throw new UsageError("Give exactly one results.json");
    const out = args.string("out");
    if (!out) throw new UsageError("Option --out DIR is required");
    const pdf = args.string("pdf"), chromium = args.string("chromium");
    try {
      const page = await reportFromResults(args.positionals[0]!, out);
      console.log(page);
      if (pdf) {
        await printPdf(page, pdf, chromium ? { chromium } : {});
        console.log(pdf);
      }
    } catch (e) {
      if (e instanceof SettingsError) throw new UsageError(e.message);
      throw e;
    }
    return EXIT.ok;
  },
};

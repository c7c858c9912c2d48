/**
 * `crystint report`: re-render index.html from a saved results.json.
 *
 * @module
 */
import { reportFromResults } from "../lib/batch/report_from_results.ts";
import { SettingsError } from "../lib/batch/mod.ts";
import type { CommandSpec } from "./_command.ts";
import { EXIT, UsageError } from "./_shared.ts";

/** The command table of `crystint report`. */
export const REPORT_COMMAND: CommandSpec = {
  name: "report",
  summary: "re-render the HTML report from a saved results.json",
  usage: ["results.json --out DIR"],
  positionals: 'results.json written by "crystint batch".',
  options: [{ name: "out", type: "string", arg: "DIR", help: "output folder (required)" }],
  examples: ["reports/demo/results.json --out reports/demo-copy"],
  async run(args) {
    if (args.positionals.length !== 1) throw new UsageError("Give exactly one results.json");
    const out = args.string("out");
    if (!out) throw new UsageError("Option --out DIR is required");
    try {
      console.log(await reportFromResults(args.positionals[0]!, out));
    } catch (e) {
      if (e instanceof SettingsError) throw new UsageError(e.message);
      throw e;
    }
    return EXIT.ok;
  },
};

/**
 * `crystint watch`: keep a report up to date while the spectrometer exports into a folder.
 *
 * @module
 */
import { watchFolder } from "../lib/batch/watch_folder.ts";
import { NoInputsError } from "../lib/batch/run_batch.ts";
import { SettingsError } from "../lib/batch/settings_schema.ts";
import { OutputError } from "../lib/batch/output_error.ts";
import { OutputLockedError } from "../lib/batch/output_lock.ts";
import { escapeControls } from "../lib/batch/escape_controls.ts";
import { EXIT, log, positiveNumber, UsageError } from "./_shared.ts";
import type { CommandSpec, OptionSpec, ParsedArgs } from "./_command.ts";

const OPTIONS: OptionSpec[] = [
  { name: "out", type: "string", arg: "DIR", help: "output folder (required)" },
  {
    name: "manifest",
    type: "string",
    arg: "FILE",
    help: "sample sheet (CSV), re-read at each update",
  },
  {
    name: "settings",
    type: "string",
    arg: "FILE",
    help: "settings in JSON or YAML, re-read at each update",
  },
  {
    name: "poll",
    type: "string",
    arg: "SECONDS",
    help: "how often DIR is looked at",
    default: "0.5",
  },
  {
    name: "settle",
    type: "string",
    arg: "SECONDS",
    help: "how long a file must stay unchanged to count as written",
    default: "1",
  },
  { name: "workers", type: "string", arg: "N", help: "number of worker threads" },
  {
    name: "plain-json",
    type: "boolean",
    help:
      "results.json with every record written out in full (a list of objects per sample, numbers unrounded) instead of packed; larger, but readable without crystint (jq, a spreadsheet plug-in)",
  },
  {
    name: "quiet",
    type: "boolean",
    help: "no line per processed file (errors are still shown)",
  },
];

/** Runs the command; returns the exit code. */
async function watch(args: ParsedArgs): Promise<number> {
  const positionals = args.positionals;
  const values = {
    out: args.string("out"),
    manifest: args.string("manifest"),
    settings: args.string("settings"),
    poll: args.string("poll"),
    settle: args.string("settle"),
    workers: args.string("workers"),
    quiet: args.flag("quiet"),
    plainJson: args.flag("plain-json"),
  };
  if (positionals.length !== 1) throw new UsageError("Give exactly one folder to watch");
  if (!values.out) throw new UsageError("Option --out DIR is required");
  const dir = positionals[0]!;
  const info = await Deno.stat(dir).catch(() => undefined);
  if (!info?.isDirectory) throw new UsageError(`${escapeControls(dir)}: not a folder`);
  const poll = positiveNumber(values.poll, "poll") ?? 0.5;
  const settle = positiveNumber(values.settle, "settle") ?? 1;
  const workers = positiveNumber(values.workers, "workers");
  const quiet = values.quiet ?? false;
  const stop = new AbortController();
  const onSignal = () => stop.abort();
  const signals: Deno.Signal[] = ["SIGINT", "SIGTERM"];
  for (const s of signals) Deno.addSignalListener(s, onSignal);
  try {
    await watchFolder({
      dir,
      outDir: values.out,
      ...(values.manifest ? { manifestPath: values.manifest } : {}),
      ...(values.settings ? { settingsPath: values.settings } : {}),
      ...(workers ? { workers: Math.round(workers) } : {}),
      ...(values.plainJson ? { plainJson: true } : {}),
      pollMs: poll * 1000,
      settleMs: settle * 1000,
      signal: stop.signal,
      onFile: (o) => {
        if (o.error) log(`crystint: ${escapeControls(o.error.message)}`);
        else if (!quiet) {
          log(
            `crystint: ${escapeControls(o.file)}: ${o.samples ?? "?"} sample(s)${
              o.cached ? " (from cache)" : ""
            }`,
          );
        }
      },
      log: (m) => log(escapeControls(m)),
    });
    return EXIT.ok;
  } catch (e) {
    if (e instanceof SettingsError) throw new UsageError(escapeControls(e.message));
    if (
      e instanceof NoInputsError || e instanceof OutputError || e instanceof OutputLockedError
    ) {
      log(`crystint watch: ${escapeControls(e.message)}`);
      return EXIT.usage;
    }
    throw e;
  } finally {
    for (const s of signals) Deno.removeSignalListener(s, onSignal);
  }
}

/** The command table of `crystint watch`. */
export const WATCH_COMMAND: CommandSpec = {
  name: "watch",
  summary: "process an export folder, then every new export as it lands (batch, continuously)",
  usage: ["DIR --out OUT [--manifest SAMPLES.csv] [--settings FILE] [--quiet]"],
  positionals: "DIR the folder the spectrometer exports into (searched recursively).",
  options: OPTIONS,
  notes: [
    "What is in DIR is processed first; then each new or changed export is added once it is " +
    "completely written (size and modification time unchanged for --settle seconds). OUT gets " +
    'results.csv, results.json and index.html as "crystint batch" writes them, with the same ' +
    "cache, and they are replaced atomically after each addition. A malformed export is listed " +
    "in the errors and the watch goes on. Ctrl-C (SIGINT) or SIGTERM ends the watch after the " +
    "write in progress, with exit code 0.",
  ],
  examples: ["exports/ --out reports/today --manifest exports/samples.csv"],
  run: watch,
};

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
import { EXIT, log, parseCommandArgs, positiveNumber, UsageError } from "./_shared.ts";

export const WATCH_HELP =
  `crystint watch — process an export folder now and every new export as it lands

Usage:
  crystint watch DIR --out OUT [--manifest SAMPLES.csv] [--settings FILE] [--quiet]

What is in DIR (searched recursively) is processed first; then each new or changed export is
added once it is completely written (size and modification time unchanged for --settle
seconds). OUT gets results.csv, results.json and index.html as "crystint batch" writes them,
with the same cache, and they are replaced atomically after each addition. A malformed export
is listed in the errors and the watch goes on. Ctrl-C (SIGINT) or SIGTERM ends the watch after
the write in progress, with exit code 0.

Options:
  --out DIR           output folder (required)
  --manifest FILE     sample sheet (CSV), re-read at each update
  --settings FILE     settings in JSON or YAML, re-read at each update
  --poll SECONDS      how often DIR is looked at (default 0.5)
  --settle SECONDS    how long a file must stay unchanged to count as written (default 1)
  --workers N         number of worker threads
  --quiet             no line per processed file (errors are still shown)
  -h, --help          show this help

Example:
  crystint watch exports/ --out reports/today --manifest exports/samples.csv
`;

/** Runs the command; returns the exit code. */
export async function watchCommand(args: string[]): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    out: { type: "string" },
    manifest: { type: "string" },
    settings: { type: "string" },
    poll: { type: "string" },
    settle: { type: "string" },
    workers: { type: "string" },
    quiet: { type: "boolean" },
    help: { type: "boolean", short: "h" },
  });
  if (values.help) {
    console.log(WATCH_HELP);
    return EXIT.ok;
  }
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

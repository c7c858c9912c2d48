/**
 * crystint command-line entry point: dispatches to one command table per command, loading only
 * the table of the command that runs (`command_index.ts`).
 *
 * @module
 */
import { runCommand, wrap } from "./_command.ts";
import { COMMAND_INDEX } from "./command_index.ts";
import { EXIT, log, UsageError, withFlagHint } from "./_shared.ts";
import { OBSERVER_NOTE } from "./_options.ts";

/** The main help, with the command list generated from the command tables. */
export function mainHelp(): string {
  const width = Math.max(...COMMAND_INDEX.map((c) => c.name.length)) + 2;
  return [
    "crystint — colour, bands and dopant levels of doped crystals from their spectra",
    "",
    "Usage:",
    "  crystint <command> [options]",
    "",
    "Commands:",
    ...COMMAND_INDEX.map((c) => `  ${c.name.padEnd(width)}${c.summary}`),
    "",
    'Run "crystint <command> --help" for the options of a command.',
    ...wrap(OBSERVER_NOTE, 100, ""),
    "Colour numbers are measurement aids, not a grading or appraisal.",
    "",
  ].join("\n");
}

/** Runs crystint with the given arguments and returns the exit code. */
export async function main(args: string[]): Promise<number> {
  const [name, ...rest] = args;
  if (name === undefined || name === "--help" || name === "-h" || name === "help") {
    console.log(mainHelp());
    return name === undefined ? EXIT.usage : EXIT.ok;
  }
  const entry = COMMAND_INDEX.find((c) => c.name === name);
  if (!entry) {
    log(`crystint: unknown command "${name}"\n\n${mainHelp()}`);
    return EXIT.usage;
  }
  try {
    return await runCommand(await entry.load(), rest);
  } catch (e) {
    if (e instanceof UsageError) {
      log(`crystint ${name}: ${e.message}\nRun "crystint ${name} --help" for usage.`);
      return EXIT.usage;
    }
    if ((e as { need?: unknown }).need !== undefined) {
      log(`crystint ${name}: ${withFlagHint(e)}`);
      return EXIT.usage;
    }
    log(`crystint ${name}: ${(e as Error).stack ?? e}`);
    return EXIT.usage;
  }
}

if (import.meta.main) Deno.exit(await main(Deno.args));

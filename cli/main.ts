/**
 * crystint command-line entry point: dispatches to one module per command.
 *
 * @module
 */
import { colorCommand } from "./color.ts";
import { changeCommand } from "./change.ts";
import { batchCommand } from "./batch.ts";
import { reportCommand } from "./report.ts";
import { bandsCommand } from "./bands.ts";
import { calibrateCommand } from "./calibrate.ts";
import { predictCommand } from "./predict.ts";
import { aimCommand } from "./aim.ts";
import { segregationCommand } from "./segregation.ts";
import { metamerismCommand, pleochroismCommand } from "./pleochroism.ts";
import { seriesCommand } from "./series.ts";
import { watchCommand } from "./watch.ts";
import { EXIT, log, UsageError } from "./_shared.ts";

const HELP = `crystint — colour, bands and dopant levels of doped crystals from their spectra

Usage:
  crystint <command> [options]

Commands:
  color     CIE colour (XYZ, xy, L*a*b*, LCh, swatches) of spectra under chosen illuminants
  change    colour change between two illuminants (ΔE00, ΔL*, ΔC*, Δh)
  series    colour against path length: maximum chroma, path to a target L*
  pleochroism  colours of an o/e pair, unpolarised colour, ΔE00 between o and e
  metamerism   CIE special metamerism index of two specimens for a change of illuminant
  bands     detect and fit absorption bands in wavenumber, with assignment hints
  calibrate straight-line calibration of a band response against analysed standards
  predict   dopant concentration of samples from a saved calibration
  aim       dopant levels (and path) that put the colour on a target
  segregation  Scheil fit of k_eff and C0 along a boule
  batch     process folders of exports into results.csv, results.json and an HTML report
  watch     process an export folder, then every new export as it lands (batch, continuously)
  report    re-render the HTML report from a saved results.json

Run "crystint <command> --help" for the options of a command.
Colour numbers are measurement aids, not a grading or appraisal.
`;

const COMMANDS: Record<string, (args: string[]) => Promise<number>> = {
  color: colorCommand,
  change: changeCommand,
  batch: batchCommand,
  report: reportCommand,
  bands: bandsCommand,
  calibrate: calibrateCommand,
  predict: predictCommand,
  aim: aimCommand,
  segregation: segregationCommand,
  pleochroism: pleochroismCommand,
  metamerism: metamerismCommand,
  series: seriesCommand,
  watch: watchCommand,
};

/** Runs crystint with the given arguments and returns the exit code. */
export async function main(args: string[]): Promise<number> {
  const [name, ...rest] = args;
  if (name === undefined || name === "--help" || name === "-h" || name === "help") {
    console.log(HELP);
    return name === undefined ? EXIT.usage : EXIT.ok;
  }
  const command = COMMANDS[name];
  if (!command) {
    log(`crystint: unknown command "${name}"\n\n${HELP}`);
    return EXIT.usage;
  }
  try {
    return await command(rest);
  } catch (e) {
    if (e instanceof UsageError) {
      log(`crystint ${name}: ${e.message}\nRun "crystint ${name} --help" for usage.`);
      return EXIT.usage;
    }
    log(`crystint ${name}: ${(e as Error).stack ?? e}`);
    return EXIT.usage;
  }
}

if (import.meta.main) Deno.exit(await main(Deno.args));

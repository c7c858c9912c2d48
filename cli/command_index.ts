/**
 * The commands by name, each with its one-line summary and a loader of its table: the main
 * program imports only the command it runs, so a `color` run does not load the batch, the
 * report or their libraries (start-up time). A test checks this index against `commands.ts`.
 *
 * @module
 */
import type { CommandSpec } from "./_command.ts";

/** One command as the main help lists it, and how to load its table. */
export interface CommandEntry {
  name: string;
  summary: string;
  load: () => Promise<CommandSpec>;
}

/** Every command crystint has, in the order of `commands.ts`. */
export const COMMAND_INDEX: CommandEntry[] = [
  {
    name: "color",
    summary: "CIE colour (XYZ, xy, L*a*b*, LCh, swatches) of spectra under chosen illuminants",
    load: async () => (await import("./color.ts")).COLOR_COMMAND,
  },
  {
    name: "change",
    summary: "colour change between two illuminants (ΔE00, ΔL*, ΔC*, Δh)",
    load: async () => (await import("./change.ts")).CHANGE_COMMAND,
  },
  {
    name: "series",
    summary: "colour against path length: maximum chroma, path to a target L*",
    load: async () => (await import("./series.ts")).SERIES_COMMAND,
  },
  {
    name: "pleochroism",
    summary: "colours of an o/e pair, unpolarised colour, ΔE00 between o and e",
    load: async () => (await import("./pleochroism.ts")).PLEOCHROISM_COMMAND,
  },
  {
    name: "metamerism",
    summary: "CIE special metamerism index of two specimens for a change of illuminant",
    load: async () => (await import("./metamerism.ts")).METAMERISM_COMMAND,
  },
  {
    name: "bands",
    summary: "detect and fit absorption bands in wavenumber, with assignment hints",
    load: async () => (await import("./bands.ts")).BANDS_COMMAND,
  },
  {
    name: "calibrate",
    summary: "straight-line calibration of a band response against analysed standards",
    load: async () => (await import("./calibrate.ts")).CALIBRATE_COMMAND,
  },
  {
    name: "predict",
    summary: "dopant concentration of samples from a saved calibration",
    load: async () => (await import("./predict.ts")).PREDICT_COMMAND,
  },
  {
    name: "aim",
    summary: "dopant levels (and path) that put the colour on a target",
    load: async () => (await import("./aim.ts")).AIM_COMMAND,
  },
  {
    name: "segregation",
    summary: "Scheil fit of k_eff and C0 along a boule",
    load: async () => (await import("./segregation.ts")).SEGREGATION_COMMAND,
  },
  {
    name: "batch",
    summary: "process folders of exports into results.csv, results.json and an HTML report",
    load: async () => (await import("./batch.ts")).BATCH_COMMAND,
  },
  {
    name: "watch",
    summary: "process an export folder, then every new export as it lands (batch, continuously)",
    load: async () => (await import("./watch.ts")).WATCH_COMMAND,
  },
  {
    name: "report",
    summary: "re-render the HTML report from a saved results.json (and print it to PDF)",
    load: async () => (await import("./report.ts")).REPORT_COMMAND,
  },
  {
    name: "convert",
    summary: "rewrite spectra as CSV or JCAMP-DX, with another ordinate, axis or grid",
    load: async () => (await import("./convert.ts")).CONVERT_COMMAND,
  },
];

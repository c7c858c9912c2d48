/**
 * The command tables, in the order the main help lists them.
 *
 * @module
 */
import type { CommandSpec } from "./_command.ts";
import { COLOR_COMMAND } from "./color.ts";
import { CHANGE_COMMAND } from "./change.ts";
import { SERIES_COMMAND } from "./series.ts";
import { PLEOCHROISM_COMMAND } from "./pleochroism.ts";
import { METAMERISM_COMMAND } from "./metamerism.ts";
import { BANDS_COMMAND } from "./bands.ts";
import { CALIBRATE_COMMAND } from "./calibrate.ts";
import { PREDICT_COMMAND } from "./predict.ts";
import { AIM_COMMAND } from "./aim.ts";
import { SEGREGATION_COMMAND } from "./segregation.ts";
import { BATCH_COMMAND } from "./batch.ts";
import { REPORT_COMMAND } from "./report.ts";
import { CONVERT_COMMAND } from "./convert.ts";
import { WATCH_COMMAND } from "./watch.ts";

/** Every command crystint has. */
export const COMMANDS: CommandSpec[] = [
  COLOR_COMMAND,
  CHANGE_COMMAND,
  SERIES_COMMAND,
  PLEOCHROISM_COMMAND,
  METAMERISM_COMMAND,
  BANDS_COMMAND,
  CALIBRATE_COMMAND,
  PREDICT_COMMAND,
  AIM_COMMAND,
  SEGREGATION_COMMAND,
  BATCH_COMMAND,
  WATCH_COMMAND,
  REPORT_COMMAND,
  CONVERT_COMMAND,
];

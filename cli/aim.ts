/**
 * `crystint aim`: dopant levels (and optionally path) that put the colour on a target.
 *
 * @module
 */
import { alphaOf } from "../lib/dopant/response_metric.ts";
import { aimDoping, type AimProblem, type AimTarget } from "../lib/dopant/aim_doping.ts";
import { surfaceReflectance } from "../lib/optics/path_transmittance.ts";
import { resampleLinear } from "../lib/spectrum/linear_resample.ts";
import type { CommandSpec, ParsedArgs } from "./_command.ts";
import {
  EXIT,
  log,
  outputFormat,
  positiveNumber,
  round,
  toCsv,
  toTable,
  UsageError,
  withFlagHint,
  writeStdout,
} from "./_shared.ts";
import {
  ALPHA_NOTE,
  DEFAULT_OBSERVER,
  illuminantOption,
  OBSERVER_NOTE,
  observerOption,
  OPTICS_OPTIONS,
  OUTPUT_OPTIONS,
  READING_OPTIONS,
} from "./_options.ts";
import {
  checkObservers,
  readWithOptions,
  reflectionFrom,
  resolveIlluminants,
} from "./_spectrum_options.ts";

function parseLab(text: string, what: string) {
  const parts = text.split(/[,;\s]+/).filter(Boolean).map(Number);
  if (parts.length !== 3 || parts.some((v) => !Number.isFinite(v))) {
    throw new UsageError(`${what} needs L,a,b, got "${text}"`);
  }
  return { L: parts[0]!, a: parts[1]!, b: parts[2]! };
}

/** A `--dopant` argument: `NAME=FILE` or `NAME=FILE@LEVEL[UNIT]`. */
export interface DopantArgument {
  name: string;
  file: string;
  /** The level the file's spectrum was measured at; α is divided by it. */
  level?: number;
  /** Unit of `level` when given after the number (e.g. `0.12wt%`). */
  unit?: string;
}

/** Parses `NAME=FILE[@LEVEL[UNIT]]`. */
export function parseDopantArgument(text: string): DopantArgument {
  const eq = text.indexOf("=");
  if (eq <= 0 || eq === text.length - 1) {
    throw new UsageError(`--dopant needs NAME=FILE or NAME=FILE@LEVEL, got "${text}"`);
  }
  const name = text.slice(0, eq), rest = text.slice(eq + 1);
  const at = /^(.*)@\s*([0-9]+(?:[.,][0-9]+)?(?:e[-+]?[0-9]+)?)\s*(.*)$/i.exec(rest);
  if (!at) return { name, file: rest };
  const level = Number(at[2]!.replace(",", "."));
  if (!(level > 0) || !at[1]) {
    throw new UsageError(`--dopant ${name}: the level after @ must be a positive number`);
  }
  return { name, file: at[1], level, ...(at[3] ? { unit: at[3].trim() } : {}) };
}

/** What one unit of a dopant's level means, as printed beside the level. */
export function levelUnit(d: DopantArgument): string {
  if (d.level === undefined) return `× unit spectrum ${d.file}`;
  return d.unit ? d.unit : `× (${d.file} / ${d.level})`;
}

async function readAlpha(file: string, args: ParsedArgs) {
  try {
    const [s] = await readWithOptions(file, args);
    return { s: s!, alpha: alphaOf(s!) };
  } catch (e) {
    throw new UsageError(`${file}: ${withFlagHint(e)}`);
  }
}

/** The command table of `crystint aim`. */
export const AIM_COMMAND: CommandSpec = {
  name: "aim",
  summary: "dopant levels (and path) that put the colour on a target",
  usage: [
    "--target L,a,b --path MM --dopant NAME=FILE[@LEVEL] [--dopant …] [options]",
    "--target L,a,b --path-range MIN-MAX --dopant NAME=FILE[@LEVEL] … [options]",
  ],
  options: [
    { name: "target", type: "string", arg: "L,a,b", help: "target CIELAB colour (required)" },
    illuminantOption("D65", false),
    observerOption(false),
    {
      name: "dopant",
      type: "string",
      arg: "NAME=FILE[@LEVEL]",
      multiple: true,
      help: "a dopant and its spectrum: a unit spectrum (α per unit level), or with @LEVEL a " +
        "measured slab at that level (e.g. Cr=slab.csv@0.12wt%), whose α is divided by LEVEL " +
        "so the level comes out in LEVEL's unit",
    },
    { name: "base", type: "string", arg: "FILE", help: "the host's own absorption (α) to add" },
    {
      name: "path-range",
      type: "string",
      arg: "MIN-MAX",
      help: "free the path within these bounds, mm (instead of --path)",
    },
    {
      name: "also",
      type: "string",
      arg: "ILLUMINANT=L,a,b",
      multiple: true,
      help: "a further target under another illuminant, with equal weight",
    },
    {
      name: "reachable",
      type: "string",
      arg: "DE00",
      help: "largest ΔE00 still called on target (common practice)",
      default: "1.0",
    },
    ...READING_OPTIONS,
    ...OPTICS_OPTIONS,
    ...OUTPUT_OPTIONS,
  ],
  notes: [
    "Each dopant FILE holds α (cm⁻¹) per unit level — a calibration's unit spectrum, or a slab " +
    "of known level given as FILE@LEVEL; a T or A file needs its thickness. Levels are printed " +
    'with their unit: "× unit spectrum FILE" for a unit spectrum, LEVEL\'s unit (or ' +
    '"× (FILE / LEVEL)") for a slab.',
    "--json prints {levels: {NAME: value}, levelUnits: {NAME: text}, pathMm, L, a, b, dE00, " +
    "illuminant, observer, sensitivity: {NAME: ΔE00 per unit level}, reachable, message}; " +
    "--csv one row per dopant. Exit code 2 when the target is not reachable (ΔE00 above " +
    "--reachable); the closest result is still printed.",
    OBSERVER_NOTE,
    ALPHA_NOTE,
  ],
  examples: [
    "--target 40,45,15 --illuminant D65 --path 6 --dopant Cr=unit/cr.csv --dopant Ti=unit/ti.csv " +
    "--reflection host --host corundum --json",
    "--target 40,45,15 --path 6 --dopant Cr=slabs/R07.csv@0.08wt% --thickness 2",
  ],
  async run(args) {
    const targetText = args.string("target");
    if (!targetText) throw new UsageError("Option --target L,a,b is required");
    const dopantArgs = args.strings("dopant").map(parseDopantArgument);
    if (dopantArgs.length === 0) throw new UsageError("Give at least one --dopant NAME=FILE");
    const format = outputFormat(args.flag("json"), args.flag("csv"));
    const [observer] = checkObservers([args.string("observer") ?? DEFAULT_OBSERVER]);
    const [illuminant] = await resolveIlluminants([args.string("illuminant") ?? "D65"]);
    const targets: AimTarget[] = [{
      lab: parseLab(targetText, "--target"),
      illuminant: illuminant!.name,
      observer: observer!,
    }];
    for (const extra of args.strings("also")) {
      const [name, lab] = extra.split("=");
      if (!name || !lab) throw new UsageError(`--also needs ILLUMINANT=L,a,b, got "${extra}"`);
      const [ill] = await resolveIlluminants([name]);
      targets.push({ lab: parseLab(lab, "--also"), illuminant: ill!.name, observer: observer! });
    }
    const dopants = [];
    for (const d of dopantArgs) {
      const { s, alpha } = await readAlpha(d.file, args);
      const perUnit = d.level === undefined ? alpha : alpha.map((v) => v / d.level!);
      dopants.push({ ...d, s, alpha: perUnit });
    }
    const grid = dopants[0]!.s.wavelengthNm;
    const problem: AimProblem = {
      wavelengthNm: grid,
      dopants: dopants.map((d) => ({
        name: d.name,
        alphaPerUnit: resampleLinear(d.s.wavelengthNm, d.alpha, grid),
      })),
      path: 0,
      targets,
    };
    const baseFile = args.string("base");
    if (baseFile) {
      const b = await readAlpha(baseFile, args);
      problem.baseAlpha = resampleLinear(b.s.wavelengthNm, b.alpha, grid);
    }
    const fixed = positiveNumber(args.string("path"), "path");
    const range = args.string("path-range");
    if (range) {
      const m = /^(\d+(?:\.\d+)?)\s*-\s*(\d+(?:\.\d+)?)$/.exec(range);
      if (!m || !(Number(m[2]) > Number(m[1]))) {
        throw new UsageError(`Option --path-range needs MIN-MAX in mm, got "${range}"`);
      }
      problem.path = { minMm: Number(m[1]), maxMm: Number(m[2]) };
    } else if (fixed !== undefined) {
      problem.path = fixed;
    } else {
      throw new UsageError("Give --path MM or --path-range MIN-MAX");
    }
    const reflection = reflectionFrom(args);
    if (reflection.reflection === "host") {
      problem.surfaceReflectance = surfaceReflectance(grid, reflection).r;
    }
    const limit = positiveNumber(args.string("reachable"), "reachable");
    if (limit !== undefined) problem.reachableDE00 = limit;
    const result = aimDoping(problem);
    const levelUnits = Object.fromEntries(dopantArgs.map((d) => [d.name, levelUnit(d)]));
    const out = {
      ...result,
      levelUnits,
      illuminant: illuminant!.name,
      observer: observer!,
    };
    if (format === "json") console.log(JSON.stringify(out, null, 2));
    else {
      const rows = Object.entries(result.levels).map(([name, level]) => ({
        dopant: name,
        level,
        levelUnit: levelUnits[name],
        sensitivity: result.sensitivity[name],
        pathMm: result.pathMm,
        L: result.L,
        a: result.a,
        b: result.b,
        dE00: result.dE00,
        illuminant: out.illuminant,
        observer: out.observer,
        reachable: result.reachable,
      }));
      if (format === "csv") writeStdout(toCsv(rows, Object.keys(rows[0]!)));
      else {
        console.log(
          toTable(
            rows.map((r) => ({
              ...r,
              level: round(r.level, 5),
              sensitivity: round(r.sensitivity, 3),
            })),
            ["dopant", "level", "levelUnit", "sensitivity"],
          ),
        );
        console.log(
          `path ${round(result.pathMm, 3)} mm · under ${out.illuminant}, ${out.observer}° ` +
            `observer: L* ${round(result.L, 2)} a* ${round(result.a, 2)} b* ${
              round(result.b, 2)
            } · ΔE00 ${round(result.dE00, 3)} · ${result.message}`,
        );
      }
    }
    if (!result.reachable) {
      log(`crystint aim: target not reachable (ΔE00 ${round(result.dE00, 2)}); closest shown`);
      return EXIT.someFailed;
    }
    return EXIT.ok;
  },
};

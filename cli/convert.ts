/**
 * `crystint convert`: rewrites spectrum exports as CSV or JCAMP-DX, optionally with another
 * ordinate, axis unit or an even grid; one output per spectrum, written atomically, never over
 * an input and never over an existing file without --force.
 *
 * @module
 */
import { convertSpectrum, type SpectralGrid } from "../lib/analysis/convert_spectrum.ts";
import { writeTextAtomic } from "../lib/batch/atomic_write.ts";
import { axisFromText, ordinateFromText, type OrdinateKind } from "../lib/io/header_units.ts";
import { readSpectrumFile } from "../lib/io/read_file.ts";
import type { ReadOptions } from "../lib/io/read_spectra.ts";
import { type AlphaBase, quantityOfOrdinate } from "../lib/io/spectrum_columns.ts";
import { writeJcamp } from "../lib/io/write_jcamp.ts";
import { writeSpectrumCsv } from "../lib/io/write_spectrum_csv.ts";
import type { AxisUnit } from "../lib/spectrum/axis.ts";
import type { Spectrum } from "../lib/spectrum/spectrum.ts";
import { VERSION } from "../lib/version.ts";
import { EXIT, log, positiveNumber, reportFailure, UsageError } from "./_shared.ts";
import type { CommandSpec, OptionSpec, ParsedArgs } from "./_command.ts";

const OPTIONS: OptionSpec[] = [
  {
    name: "to",
    type: "string",
    arg: "FORMAT",
    help: "csv (Key: value preamble, then x,y) or jcamp (JCAMP-DX 4.24)",
  },
  {
    name: "out",
    type: "string",
    arg: "FILE",
    help: "the output file (one input holding one spectrum)",
  },
  {
    name: "out-dir",
    type: "string",
    arg: "DIR",
    help:
      "one output per spectrum: DIR/<input stem>.<csv|jdx>, or DIR/<input stem>-<sample>.<ext> when a file holds several",
  },
  {
    name: "force",
    type: "boolean",
    help: "replace existing outputs (an input is never replaced)",
  },
  {
    name: "ordinate",
    type: "string",
    arg: "KIND",
    help:
      "ordinate to write: transmittance | percent | absorbance | alpha | reflectance | percent-reflectance; T, A and alpha convert into each other by Beer–Lambert (alpha needs the thickness; surface reflections are not removed)",
    default: "the measured quantity",
  },
  {
    name: "alpha-base",
    type: "string",
    arg: "e|10",
    help:
      "napierian (default: A = α·d / ln 10, the physics convention) or decadic (A = α·d) absorption coefficient for the output",
    default: "e",
  },
  {
    name: "axis",
    type: "string",
    arg: "UNIT",
    help: "x axis to write: nm | um | cm-1 | ev",
    default: "nm",
  },
  {
    name: "grid",
    type: "string",
    arg: "A:B:STEP",
    help:
      "resample onto A, A+STEP, …, B in the --axis unit, with the method CIE 167 recommends for the data's spacing (named in the output)",
  },
  {
    name: "form",
    type: "string",
    arg: "FORM",
    help: "JCAMP-DX ordinates: difdup (with Y-checks) or affn",
    default: "difdup",
  },
  {
    name: "digits",
    type: "string",
    arg: "N",
    help: "at most N significant digits for the ordinate; fewer when the data carry fewer",
    default: "7",
  },
  {
    name: "thickness",
    type: "string",
    arg: "MM",
    help: "thickness of the measured slab (overrides the file's metadata)",
  },
  {
    name: "host",
    type: "string",
    arg: "NAME",
    help: "host crystal, recorded in the output's metadata",
  },
  {
    name: "in-ordinate",
    type: "string",
    arg: "KIND",
    help: "what the input values are, when the file does not say",
  },
  {
    name: "in-axis",
    type: "string",
    arg: "UNIT",
    help: "the input's x axis unit, when the file does not say",
  },
];

/** What to write, decided from the options before any file is read. */
interface Plan {
  format: "csv" | "jcamp";
  ordinate?: OrdinateKind;
  alphaBase: AlphaBase;
  axis: AxisUnit;
  grid?: SpectralGrid;
  form: "affn" | "difdup";
  digits: number;
  host?: string;
}

/** One output to write. */
interface Job {
  input: string;
  path: string;
  text: string;
}

function ordinateOption(value: string | undefined, option: string): OrdinateKind | undefined {
  if (value === undefined) return undefined;
  const kind = ordinateFromText(value);
  if (!kind) {
    throw new UsageError(
      `Unknown --${option} "${value}": use transmittance, percent, absorbance, alpha, reflectance or percent-reflectance`,
    );
  }
  return kind;
}

function axisOption(value: string | undefined, option: string): AxisUnit | undefined {
  if (value === undefined) return undefined;
  const axis = axisFromText(value);
  if (!axis) throw new UsageError(`Unknown --${option} "${value}": use nm, um, cm-1 or ev`);
  return axis;
}

function gridOption(value: string | undefined, axis: AxisUnit): SpectralGrid | undefined {
  if (value === undefined) return undefined;
  const parts = value.split(":").map((p) => Number(p.trim()));
  if (parts.length !== 3 || !parts.every(Number.isFinite)) {
    throw new UsageError(`Option --grid needs START:STOP:STEP, got "${value}"`);
  }
  const [start, stop, step] = parts as [number, number, number];
  if (!(step > 0) || !(stop > start)) {
    throw new UsageError(`Option --grid needs START < STOP and STEP > 0, got "${value}"`);
  }
  const count = Math.round((stop - start) / step);
  if (Math.abs(start + count * step - stop) > 1e-6 * step) {
    throw new UsageError(`Option --grid: STOP must be START + k·STEP, got "${value}"`);
  }
  return { start, stop, step, axis };
}

function planFrom(values: Record<string, string | boolean | undefined>): Plan {
  const format = values["to"];
  if (format !== "csv" && format !== "jcamp") {
    throw new UsageError(`Option --to needs csv or jcamp${format ? `, got "${format}"` : ""}`);
  }
  const alphaBase = (values["alpha-base"] as string | undefined) ?? "e";
  if (alphaBase !== "e" && alphaBase !== "10") {
    throw new UsageError(`Option --alpha-base needs e or 10, got "${alphaBase}"`);
  }
  const ordinate = ordinateOption(values["ordinate"] as string | undefined, "ordinate");
  if (values["alpha-base"] !== undefined && ordinate !== undefined && ordinate !== "alpha") {
    throw new UsageError("Option --alpha-base applies only to an alpha ordinate");
  }
  const form = (values["form"] as string | undefined) ?? "difdup";
  if (form !== "affn" && form !== "difdup") {
    throw new UsageError(`Option --form needs affn or difdup, got "${form}"`);
  }
  const digitsText = values["digits"] as string | undefined;
  const digits = digitsText === undefined ? 7 : Number(digitsText);
  if (!Number.isInteger(digits) || digits < 1 || digits > 15) {
    throw new UsageError(`Option --digits needs a whole number from 1 to 15, got "${digitsText}"`);
  }
  const axis = axisOption(values["axis"] as string | undefined, "axis") ?? "nm";
  const plan: Plan = { format, alphaBase, axis, form, digits };
  if (ordinate) plan.ordinate = ordinate;
  const grid = gridOption(values["grid"] as string | undefined, axis);
  if (grid) plan.grid = grid;
  if (typeof values["host"] === "string") plan.host = values["host"];
  return plan;
}

function baseName(path: string): string {
  return path.split(/[\\/]/).pop() ?? path;
}

function stem(path: string): string {
  const name = baseName(path);
  return name.replace(/\.[^.]+$/, "") || name;
}

function safeName(text: string): string {
  return text.replace(/[^A-Za-z0-9._-]+/g, "_").replace(/^[._]+|_+$/g, "") || "spectrum";
}

function hostOf(spectrum: Spectrum, plan: Plan): string | undefined {
  if (plan.host) return plan.host;
  const fields = spectrum.meta.fields ?? {};
  const key = Object.keys(fields).find((k) => /^\$?host$/i.test(k.trim()));
  return key === undefined ? undefined : fields[key];
}

/** The text of one output file for one spectrum. */
function outputText(spectrum: Spectrum, input: string, plan: Plan): string {
  const quantity = plan.ordinate ? quantityOfOrdinate(plan.ordinate) : spectrum.quantity;
  const converted = convertSpectrum(
    spectrum,
    plan.grid ? { quantity, grid: plan.grid } : { quantity },
  );
  if (plan.alphaBase !== "e" && converted.spectrum.quantity !== "alpha") {
    throw new RangeError(
      `Cannot write "${spectrum.meta.sample}" with --alpha-base ${plan.alphaBase}: it holds ${converted.spectrum.quantity} (give --ordinate alpha)`,
    );
  }
  const records: Record<string, string> = {
    "Source file": baseName(input),
    "Converted by": `crystint ${VERSION}`,
    Resampling: converted.notes.resampling,
  };
  if (converted.notes.conversion) records["Conversion"] = converted.notes.conversion;
  const host = hostOf(spectrum, plan);
  const common = {
    axis: plan.axis,
    alphaBase: converted.spectrum.quantity === "alpha" ? plan.alphaBase : "e" as AlphaBase,
    ySignificantDigits: plan.digits,
    records,
    ...(plan.ordinate ? { ordinate: plan.ordinate } : {}),
    ...(host ? { host } : {}),
  };
  return plan.format === "jcamp"
    ? writeJcamp(converted.spectrum, { ...common, form: plan.form })
    : writeSpectrumCsv(converted.spectrum, common);
}

/** Real path of a file that may not exist yet (its folder must). */
async function resolvedPath(path: string): Promise<string> {
  try {
    return await Deno.realPath(path);
  } catch {
    const slash = Math.max(path.lastIndexOf("/"), path.lastIndexOf("\\"));
    const dir = slash >= 0 ? path.slice(0, slash) || "/" : ".";
    try {
      return `${await Deno.realPath(dir)}/${path.slice(slash + 1)}`;
    } catch {
      return path;
    }
  }
}

async function exists(path: string): Promise<boolean> {
  try {
    await Deno.lstat(path);
    return true;
  } catch {
    return false;
  }
}

/** Output paths for the spectra of one input in --out-dir, unique within the run. */
function namesFor(
  input: string,
  spectra: Spectrum[],
  dir: string,
  ext: string,
  taken: Set<string>,
) {
  return spectra.map((s, i) => {
    const base = spectra.length === 1 ? stem(input) : `${stem(input)}-${safeName(s.meta.sample)}`;
    let name = `${base}.${ext}`;
    for (let k = 2; taken.has(name); k++) {
      name = `${base}-${spectra.length === 1 ? k : `${i + 1}-${k}`}.${ext}`;
    }
    taken.add(name);
    return `${dir.replace(/[\\/]+$/, "") || "/"}/${name}`;
  });
}

/** Runs the command; returns the exit code. */
async function convert(args: ParsedArgs): Promise<number> {
  const positionals = args.positionals;
  const values = {
    to: args.string("to"),
    out: args.string("out"),
    "out-dir": args.string("out-dir"),
    force: args.flag("force"),
    ordinate: args.string("ordinate"),
    "alpha-base": args.string("alpha-base"),
    axis: args.string("axis"),
    grid: args.string("grid"),
    form: args.string("form"),
    digits: args.string("digits"),
    thickness: args.string("thickness"),
    host: args.string("host"),
    "in-ordinate": args.string("in-ordinate"),
    "in-axis": args.string("in-axis"),
  };
  if (positionals.length === 0) {
    throw new UsageError("No input files: give one or more spectrum files");
  }
  if ((values.out === undefined) === (values["out-dir"] === undefined)) {
    throw new UsageError("Give exactly one of --out FILE and --out-dir DIR");
  }
  if (values.out !== undefined && positionals.length > 1) {
    throw new UsageError(`${positionals.length} inputs: use --out-dir DIR for one output each`);
  }
  const plan = planFrom(values);
  const readOptions: ReadOptions = {};
  const inOrdinate = ordinateOption(values["in-ordinate"], "in-ordinate");
  if (inOrdinate) readOptions.ordinate = inOrdinate;
  const inAxis = axisOption(values["in-axis"], "in-axis");
  if (inAxis) readOptions.axis = inAxis;
  const thickness = positiveNumber(values.thickness, "thickness");
  if (thickness !== undefined) readOptions.thicknessMm = thickness;

  const ext = plan.format === "jcamp" ? "jdx" : "csv";
  const taken = new Set<string>();
  const jobs: Job[] = [];
  let failed = 0;
  for (const input of positionals) {
    try {
      const spectra = await readSpectrumFile(input, readOptions);
      for (const s of spectra) {
        for (const w of s.meta.warnings ?? []) log(`crystint: ${input}: ${s.meta.sample}: ${w}`);
      }
      if (values.out !== undefined && spectra.length > 1) {
        throw new UsageError(
          `${input} holds ${spectra.length} spectra: use --out-dir DIR for one output each`,
        );
      }
      const texts = spectra.map((s) => outputText(s, input, plan));
      const paths = values.out !== undefined
        ? [values.out]
        : namesFor(input, spectra, values["out-dir"]!, ext, taken);
      paths.forEach((path, i) => jobs.push({ input, path, text: texts[i]! }));
    } catch (e) {
      if (e instanceof UsageError) throw e;
      failed++;
      reportFailure(e, input);
    }
  }

  // Every check before the first write: a refused run leaves every file as it was.
  if (values["out-dir"] !== undefined) await Deno.mkdir(values["out-dir"], { recursive: true });
  const inputs = new Set(await Promise.all(positionals.map(resolvedPath)));
  for (const job of jobs) {
    if (inputs.has(await resolvedPath(job.path))) {
      log(`crystint convert: refusing to write ${job.path}: it is an input`);
      return EXIT.usage;
    }
    if (!values.force && await exists(job.path)) {
      log(`crystint convert: ${job.path} exists; give --force to replace it`);
      return EXIT.usage;
    }
  }
  for (const job of jobs) {
    try {
      await writeTextAtomic(job.path, job.text);
      log(`crystint: ${job.input} → ${job.path}`);
    } catch (e) {
      failed++;
      log(`crystint: cannot write ${job.path}: ${(e as Error).message}`);
    }
  }
  if (failed > 0) log(`crystint: ${failed} of ${positionals.length} file(s) failed`);
  return failed > 0 ? EXIT.someFailed : EXIT.ok;
}

/** The command table of `crystint convert`. */
export const CONVERT_COMMAND: CommandSpec = {
  name: "convert",
  summary: "rewrite spectra as CSV or JCAMP-DX, with another ordinate, axis or grid",
  usage: ["IN… --to csv|jcamp (--out FILE | --out-dir DIR) [options]"],
  positionals: "Spectrum exports (any layout crystint reads, JCAMP-DX included).",
  options: OPTIONS,
  notes: [
    "Exit codes: 0 all done, 1 usage error or an output that exists (nothing is written), 2 some inputs failed (the others are written).",
  ],
  examples: [
    "exports/ruby-03.csv --to jcamp --ordinate absorbance --grid 380:780:5 --out-dir archive/",
  ],
  run: convert,
};

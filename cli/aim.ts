/**
 * `crystint aim`: dopant levels (and optionally path) that put the colour on a target.
 *
 * @module
 */
import { readSpectrumFile } from "../lib/io/read_file.ts";
import { alphaOf } from "../lib/dopant/response_metric.ts";
import { aimDoping, type AimProblem, type AimTarget } from "../lib/dopant/aim_doping.ts";
import { surfaceReflectance } from "../lib/optics/path_transmittance.ts";
import { resampleLinear } from "../lib/spectrum/linear_resample.ts";
import { EXIT, parseCommandArgs, positiveNumber, round, toTable, UsageError } from "./_shared.ts";
import { checkObservers, reflectionFrom, resolveIlluminants } from "./_spectrum_options.ts";

export const AIM_HELP = `crystint aim — dopant levels that hit a target colour

Usage:
  crystint aim --target L,a,b --illuminant D65 --observer 10 --path MM
               --dopant NAME=FILE [--dopant NAME=FILE …] [--base FILE]
               [--path-range MIN-MAX] [--also ILLUMINANT=L,a,b] [--reflection none|host --host NAME | --n V]
               [--reachable DE00] [--json]

Each dopant FILE holds α (cm⁻¹) per unit level — e.g. a slab of known level divided by it, or
a calibration's unit spectrum; a T or A file needs its thickness. --base adds the host's own
absorption. --path-range frees the path within bounds. --also adds a second target (e.g. the
colour under A) to the objective with equal weight.

Prints {levels: {NAME: value}, pathMm, L, a, b, dE00, sensitivity: {NAME: ΔE00 per unit level},
reachable, message}. "reachable" means ΔE00 ≤ --reachable (default 1.0, common practice).

Example:
  crystint aim --target 40,45,15 --illuminant D65 --observer 10 --path 6 \\
    --dopant Cr=unit/cr.csv --dopant Ti=unit/ti.csv --reflection host --host corundum --json
`;

function parseLab(text: string, what: string) {
  const parts = text.split(/[,;\s]+/).filter(Boolean).map(Number);
  if (parts.length !== 3 || parts.some((v) => !Number.isFinite(v))) {
    throw new UsageError(`${what} needs L,a,b, got "${text}"`);
  }
  return { L: parts[0]!, a: parts[1]!, b: parts[2]! };
}

/** Runs the command; returns the exit code. */
export async function aimCommand(args: string[]): Promise<number> {
  const { values } = parseCommandArgs(args, {
    target: { type: "string" },
    illuminant: { type: "string" },
    observer: { type: "string" },
    path: { type: "string" },
    "path-range": { type: "string" },
    dopant: { type: "string", multiple: true },
    base: { type: "string" },
    also: { type: "string", multiple: true },
    reflection: { type: "string" },
    host: { type: "string" },
    n: { type: "string" },
    reachable: { type: "string" },
    json: { type: "boolean" },
    help: { type: "boolean", short: "h" },
  });
  if (values.help) {
    console.log(AIM_HELP);
    return EXIT.ok;
  }
  if (!values.target) throw new UsageError("Option --target L,a,b is required");
  if (!values.dopant?.length) throw new UsageError("Give at least one --dopant NAME=FILE");
  const [observer] = checkObservers([values.observer ?? "10"]);
  const [illuminant] = await resolveIlluminants([values.illuminant ?? "D65"]);
  const targets: AimTarget[] = [{
    lab: parseLab(values.target, "--target"),
    illuminant: illuminant!.name,
    observer: observer!,
  }];
  for (const extra of values.also ?? []) {
    const [name, lab] = extra.split("=");
    if (!name || !lab) throw new UsageError(`--also needs ILLUMINANT=L,a,b, got "${extra}"`);
    const [ill] = await resolveIlluminants([name]);
    targets.push({ lab: parseLab(lab, "--also"), illuminant: ill!.name, observer: observer! });
  }
  const read = async (file: string) => {
    try {
      const [s] = await readSpectrumFile(file);
      return { s: s!, alpha: alphaOf(s!) };
    } catch (e) {
      throw new UsageError((e as Error).message);
    }
  };
  const dopants = [];
  for (const spec of values.dopant) {
    const eq = spec.indexOf("=");
    if (eq <= 0) throw new UsageError(`--dopant needs NAME=FILE, got "${spec}"`);
    dopants.push({ name: spec.slice(0, eq), ...(await read(spec.slice(eq + 1))) });
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
  if (values.base) {
    const b = await read(values.base);
    problem.baseAlpha = resampleLinear(b.s.wavelengthNm, b.alpha, grid);
  }
  const fixed = positiveNumber(values.path, "path");
  if (values["path-range"]) {
    const m = /^(\d+(?:\.\d+)?)\s*-\s*(\d+(?:\.\d+)?)$/.exec(values["path-range"]);
    if (!m || !(Number(m[2]) > Number(m[1]))) {
      throw new UsageError(
        `Option --path-range needs MIN-MAX in mm, got "${values["path-range"]}"`,
      );
    }
    problem.path = { minMm: Number(m[1]), maxMm: Number(m[2]) };
  } else if (fixed !== undefined) {
    problem.path = fixed;
  } else {
    throw new UsageError("Give --path MM or --path-range MIN-MAX");
  }
  const reflection = reflectionFrom(values);
  if (reflection.reflection === "host") {
    problem.surfaceReflectance = surfaceReflectance(grid, reflection).r;
  }
  const limit = positiveNumber(values.reachable, "reachable");
  if (limit !== undefined) problem.reachableDE00 = limit;
  const result = aimDoping(problem);
  if (values.json) console.log(JSON.stringify(result, null, 2));
  else {
    console.log(
      toTable(
        Object.entries(result.levels).map(([name, level]) => ({
          dopant: name,
          level: round(level, 5),
          "ΔE00 per unit": round(result.sensitivity[name], 3),
        })),
        ["dopant", "level", "ΔE00 per unit"],
      ),
    );
    console.log(
      `path ${round(result.pathMm, 3)} mm · L* ${round(result.L, 2)} a* ${round(result.a, 2)} b* ${
        round(result.b, 2)
      } · ΔE00 ${round(result.dE00, 3)} · ${result.message}`,
    );
  }
  return EXIT.ok;
}

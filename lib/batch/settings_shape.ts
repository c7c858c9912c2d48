/**
 * The shape of a batch settings file — type and bounds of every key — checked with a schema
 * library (zod) before the values are resolved. Unknown keys are warnings, not errors; the
 * messages name the setting and the rule, never the file's contents.
 *
 * @module
 */
import { z } from "zod";

/** A number, or a numeric string (a decimal comma allowed, as sheets and YAML give them). */
function numeric(schema: z.ZodNumber) {
  return z.preprocess(
    (v) =>
      typeof v === "string" && /^\s*[-+]?(\d+([.,]\d*)?|[.,]\d+)(e[-+]?\d+)?\s*$/i.test(v)
        ? Number(v.trim().replace(",", "."))
        : v,
    schema,
  );
}

const name = z.string().min(1).max(100);
const nameList = z.union([z.string().max(1000), z.array(z.union([name, z.number()])).max(50)]);
const path = z.string().min(1).max(4096);
const mm = numeric(z.number().gt(0).lte(10000));
const labValue = numeric(z.number().gte(-1000).lte(1000));
const sd = numeric(z.number().gte(0, { error: "must be a standard uncertainty, 0 or more" }));
const probability = numeric(z.number().gt(0).lt(1));
const lab = z.union([
  z.array(labValue).length(3),
  z.strictObject({ L: labValue, a: labValue, b: labValue }),
]);

const targetObject = z.strictObject({
  L: labValue.optional(),
  a: labValue.optional(),
  b: labValue.optional(),
  illuminant: name.optional(),
  observer: z.union([name, z.number()]).optional(),
  toleranceDE00: numeric(z.number().gt(0).lte(100)).optional(),
  spectrum: path.optional(),
  spectrumPathMm: mm.optional(),
  illuminants: nameList.optional(),
  under: z.record(name, lab).optional(),
});
const target = z.union([z.string().max(200), targetObject]);

/** Every key a settings file may hold, with its type and bounds. */
export const settingsShape = z.strictObject({
  illuminants: nameList.optional(),
  observers: nameList.optional(),
  change: z.strictObject({
    from: name.optional(),
    to: name.optional(),
    observer: z.union([name, z.number()]).optional(),
    adapt: z.enum(["none", "cat16", "bradford"]).optional(),
  }).optional(),
  pathMm: mm.optional(),
  thicknessMm: mm.optional(),
  reflection: z.enum(["none", "host"]).optional(),
  host: name.optional(),
  n: numeric(z.number().gte(1).lte(5)).optional(),
  sellmeier: z.string().min(1).max(1000).optional(),
  ordinate: name.optional(),
  axis: name.optional(),
  target: target.optional(),
  targets: z.record(name, target).optional(),
  series: z.strictObject({
    fromMm: mm.optional(),
    toMm: mm.optional(),
    steps: numeric(z.number().int({ error: "must be a whole number" }).gte(2).lte(1000)).optional(),
    targetL: numeric(z.number().gt(0).lt(100)).optional(),
  }).optional(),
  changeHueThresholdDeg: numeric(z.number().gt(0).lte(180)).optional(),
  changeMinChroma: numeric(z.number().gte(0).lte(200)).optional(),
  calibration: path.optional(),
  calibrations: z.record(name, path).optional(),
  limits: z.strictObject({
    maxFileMb: numeric(z.number().gt(0).lte(4096)).optional(),
    fileTimeoutSeconds: numeric(z.number().gt(0).lte(86400)).optional(),
    maxMemoryMb: numeric(z.number().gte(256).lte(1048576)).optional(),
  }).optional(),
  alphaBase: z.union([z.enum(["e", "10"]), z.literal(10)]).optional(),
  uncertainty: z.strictObject({
    enabled: z.boolean().optional(),
    noiseSd: sd.optional(),
    offsetSd: sd.optional(),
    wavelengthSdNm: sd.optional(),
    thicknessSdMm: sd.optional(),
    pathSdMm: sd.optional(),
    passAt: probability.optional(),
    failAt: probability.optional(),
  }).refine((u) => {
    const pass = Number(u.passAt ?? 0.95), fail = Number(u.failAt ?? 0.05);
    return fail < pass;
  }, { error: "failAt must be below passAt (0 < failAt < passAt < 1)" }).optional(),
  /** The report block is validated by the report's own settings. */
  report: z.unknown().optional(),
});

function where(path: PropertyKey[]): string {
  return path.map((p, i) => (typeof p === "number" ? `[${p}]` : `${i ? "." : ""}${String(p)}`))
    .join("") || "(top level)";
}

/** What the shape check found. */
export interface ShapeCheck {
  /** Keys crystint does not know (they are ignored). */
  warnings: string[];
  /** The first wrong setting and the rule it breaks, if any. */
  error?: string;
}

/** Checks the types and bounds of a raw settings object. */
export function checkSettingsShape(raw: unknown): ShapeCheck {
  if (raw === null || raw === undefined) return { warnings: [] };
  if (typeof raw !== "object" || Array.isArray(raw)) {
    return { warnings: [], error: "Settings must be a mapping of names to values" };
  }
  const result = settingsShape.safeParse(raw);
  if (result.success) return { warnings: [] };
  const warnings: string[] = [];
  const errors: string[] = [];
  for (const issue of result.error.issues) {
    if (issue.code === "unrecognized_keys") {
      for (const k of issue.keys) {
        warnings.push(`Unknown setting "${where([...issue.path, k])}" (ignored)`);
      }
    } else if (issue.code === "invalid_union") {
      // the alternative that got furthest explains best
      const deepest = issue.errors.flat().sort((a, b) => b.path.length - a.path.length)[0];
      errors.push(
        deepest && deepest.path.length > 0
          ? `Setting ${where([...issue.path, ...deepest.path])}: ${deepest.message}`
          : `Setting ${where(issue.path)}: ${deepest?.message ?? issue.message}`,
      );
    } else {
      errors.push(`Setting ${where(issue.path)}: ${issue.message}`);
    }
  }
  return errors.length > 0 ? { warnings, error: errors[0]! } : { warnings };
}

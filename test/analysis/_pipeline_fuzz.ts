/**
 * Seeded fuzzing of the whole pipeline, read → analyse: mutated exports either fail to read with
 * an `InputError` or give results whose every number is finite (or null). Used by the test (a
 * few hundred cases) and by `deno task fuzz` (100,000 by default).
 */
import { readSpectraFromBytes } from "../../lib/io/read_spectra.ts";
import { InputError } from "../../lib/io/input_error.ts";
import { analyseSample, type SampleSettings } from "../../lib/analysis/mod.ts";

/** mulberry32: a small seeded generator (public domain). */
function random(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const SETTINGS: SampleSettings = {
  read: {},
  reflection: { reflection: "none" },
  illuminants: ["D65", "A"],
  observers: ["2"],
  change: { from: "D65", to: "A", observer: "2", adapt: "none" },
  series: { fromMm: 1, toMm: 8, steps: 4 },
  changeHueThresholdDeg: 20,
  changeMinChroma: 5,
  extra: {},
  uncertainty: { sources: {} },
};

/** An invented export in one of a few layouts, with noise that grows as T falls. */
function baseExport(r: () => number): string {
  const layout = Math.floor(r() * 4);
  const step = [1, 2, 5, 10][Math.floor(r() * 4)]!;
  const from = 300 + Math.floor(r() * 80), to = 780 + Math.floor(r() * 120);
  const centre = 18000 + 6000 * (r() - 0.5), height = 2 * r();
  const lines: string[] = [];
  const sep = layout === 1 ? ";" : layout === 2 ? "\t" : ",";
  if (layout === 1) lines.push("Thickness (mm);2,0", "Sample;fuzz");
  if (layout === 3) lines.push("# Thickness: 1.5 mm", "# Polarisation: e");
  lines.push(["wavelength_nm", layout === 2 ? "%T" : "T"].join(sep));
  for (let nm = from; nm <= to; nm += step) {
    const a = height * Math.exp(-0.5 * ((1e7 / nm - centre) / 1200) ** 2) +
      (nm < 330 ? 6 * r() : 0);
    let t = 10 ** -a;
    t += (0.001 / Math.max(t, 0.01)) * (r() - 0.5) * 0.01;
    const v = layout === 2 ? 100 * t : t;
    const text = v.toFixed(5);
    lines.push([String(nm), layout === 1 ? text.replace(".", ",") : text].join(sep));
  }
  return lines.join("\n") + "\n";
}

/** A byte-level or line-level mutation of a text. */
function mutate(text: string, r: () => number): string {
  const lines = text.split("\n");
  const n = 1 + Math.floor(r() * 4);
  for (let k = 0; k < n; k++) {
    const i = Math.floor(r() * lines.length);
    const kind = Math.floor(r() * 9);
    const line = lines[i] ?? "";
    if (kind === 0) lines.splice(i, 1);
    else if (kind === 1) lines.splice(i, 0, line);
    else if (kind === 2) lines[i] = line.replace(/\d/, String(Math.floor(r() * 10)));
    else if (kind === 3) {
      lines[i] = line.replace(/[\d.]+$/, ["1e309", "-1e309", "NaN", "-0", "7"][k % 5]!);
    } else if (kind === 4) lines[i] = line.slice(0, Math.floor(r() * line.length));
    else if (kind === 5) lines[i] = line + ",9";
    else if (kind === 6) {
      lines[i] = line.replace(/^\d+/, (m) => String(Number(m) + 1000 * (r() - 0.5)));
    } else if (kind === 7) lines[i] = String.fromCharCode(Math.floor(r() * 256)) + line;
    else lines[i] = line.replace(/[\d.]+$/, (m) => String(-Number(m)));
  }
  return lines.join("\n");
}

/** Every number below a value, with its path, that is not finite. */
function nonFinite(value: unknown, path = "", out: string[] = []): string[] {
  if (typeof value === "number") {
    if (!Number.isFinite(value)) out.push(`${path}=${value}`);
  } else if (Array.isArray(value)) value.forEach((v, i) => nonFinite(v, `${path}[${i}]`, out));
  else if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) nonFinite(v, `${path}.${k}`, out);
  }
  return out;
}

/** What a fuzz run found. */
export interface FuzzReport {
  cases: number;
  read: number;
  refused: number;
  untyped: string[];
  nonFinite: string[];
}

/** Runs `cases` mutated exports from `seed` through reading and the analysis. */
export function fuzzPipeline(cases: number, seed: number, dumpDir?: string): FuzzReport {
  const r = random(seed);
  const report: FuzzReport = { cases, read: 0, refused: 0, untyped: [], nonFinite: [] };
  for (let c = 0; c < cases; c++) {
    const text = r() < 0.15 ? baseExport(r) : mutate(baseExport(r), r);
    let spectra;
    try {
      spectra = readSpectraFromBytes(new TextEncoder().encode(text), `case-${c}.csv`);
    } catch (e) {
      if (e instanceof InputError) report.refused++;
      else report.untyped.push(`case ${c} (read): ${(e as Error).message}`);
      continue;
    }
    report.read++;
    for (const s of spectra) {
      try {
        const result = analyseSample(s, `case-${c}.csv`, SETTINGS);
        // a null-safe JSON round trip: what results.json would carry
        const bad = nonFinite(
          JSON.parse(
            JSON.stringify(
              result,
              (_k, v) => typeof v === "number" && !Number.isFinite(v) ? `NONFINITE:${v}` : v,
            ),
          ),
        );
        const marked = JSON.stringify(result, (_k, v) =>
          typeof v === "number" && !Number.isFinite(v) ? `NONFINITE:${v}` : v).match(
            /"([^"]+)":"NONFINITE:[^"]*"/g,
          ) ?? [];
        if (bad.length || marked.length) {
          if (dumpDir) {
            Deno.writeTextFileSync(`${dumpDir}/fuzz-case-${c}.csv`, text);
          }
          report.nonFinite.push(`case ${c}: ${[...bad, ...marked].slice(0, 3).join(", ")}`);
        }
      } catch (e) {
        if (e instanceof InputError) report.refused++;
        else {report.untyped.push(
            `case ${c} (analyse): ${(e as Error).name}: ${(e as Error).message}`,
          );}
      }
    }
  }
  return report;
}

if (import.meta.main) {
  const cases = Number(Deno.args[0] ?? 100000), seed = Number(Deno.args[1] ?? 1);
  // a third argument names a folder that receives each case with non-finite numbers
  const report = fuzzPipeline(cases, seed, Deno.args[2]);
  console.log(JSON.stringify(
    {
      ...report,
      untyped: report.untyped.slice(0, 20),
      nonFinite: report.nonFinite.slice(0, 20),
      untypedCount: report.untyped.length,
      nonFiniteCount: report.nonFinite.length,
    },
    null,
    2,
  ));
  Deno.exit(report.untyped.length || report.nonFinite.length ? 1 : 0);
}

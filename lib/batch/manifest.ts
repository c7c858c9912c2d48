/**
 * The sample sheet a lab keeps: one row per sample or file, with thickness, finished path,
 * host, polarisation, target, calibration and notes; other columns are carried along.
 *
 * @module
 */
import { parseSheet } from "../io/parse_sheet.ts";
import { SettingsError } from "./settings_schema.ts";
import { DEFAULT_MAX_FILE_BYTES, LimitedReadError, readTextLimited } from "./read_limited.ts";

/** One manifest row with the columns crystint knows, the rest kept in `extra`. */
export interface ManifestRow {
  line: number;
  sample?: string;
  file?: string;
  thicknessMm?: number;
  pathMm?: number;
  /** Thickness tolerance (standard uncertainty), mm. */
  thicknessSdMm?: number;
  /** Path tolerance (standard uncertainty), mm. */
  pathSdMm?: number;
  /** Base of α values in the file: e (natural) or 10 (decadic). */
  alphaBase?: "e" | "10";
  host?: string;
  polarisation?: string;
  target?: string;
  calibration?: string;
  notes?: string;
  extra: Record<string, string>;
}

const ALIASES: Record<string, keyof Omit<ManifestRow, "line" | "extra">> = {
  sample: "sample",
  sample_id: "sample",
  id: "sample",
  name: "sample",
  stone: "sample",
  file: "file",
  filename: "file",
  spectrum: "file",
  path_to_file: "file",
  thickness_mm: "thicknessMm",
  thickness: "thicknessMm",
  measured_thickness_mm: "thicknessMm",
  path_mm: "pathMm",
  path: "pathMm",
  stone_path_mm: "pathMm",
  thickness_sd: "thicknessSdMm",
  thickness_sd_mm: "thicknessSdMm",
  path_sd: "pathSdMm",
  path_sd_mm: "pathSdMm",
  alpha_base: "alphaBase",
  depth_mm: "pathMm",
  host: "host",
  polarisation: "polarisation",
  polarization: "polarisation",
  pol: "polarisation",
  target: "target",
  calibration: "calibration",
  notes: "notes",
  note: "notes",
  comment: "notes",
};

function key(header: string): string {
  return header.trim().toLowerCase().replace(/\((mm)\)/g, "_mm").replace(/[^a-z0-9]+/g, "_")
    .replace(/^_|_$/g, "");
}

/**
 * Parses manifest CSV text.
 *
 * @throws {SettingsError} For unparsable CSV or a non-numeric thickness/path, naming the line.
 */
export function parseManifest(text: string, file: string): ManifestRow[] {
  let records: string[][];
  try {
    records = parseSheet(text);
  } catch (e) {
    throw new SettingsError(`Cannot read manifest ${file}: ${(e as Error).message}`);
  }
  const [header, ...rows] = records;
  if (!header) return [];
  const keys = header.map(key);
  return rows.map((cells, i) => {
    const row: ManifestRow = { line: i + 2, extra: {} };
    keys.forEach((k, c) => {
      const value = cells[c] ?? "";
      const field = ALIASES[k];
      if (!field) {
        if (header[c]) row.extra[header[c]!] = value;
        return;
      }
      if (value === "") return;
      if (field === "thicknessMm" || field === "pathMm") {
        const n = Number(value.replace(",", "."));
        if (!(n > 0)) {
          throw new SettingsError(
            `${file}:${i + 2}: ${header[c]} must be a positive number, got "${value}"`,
          );
        }
        row[field] = n;
      } else if (field === "thicknessSdMm" || field === "pathSdMm") {
        const n = Number(value.replace(",", "."));
        if (!(Number.isFinite(n) && n >= 0)) {
          throw new SettingsError(
            `${file}:${i + 2}: ${
              header[c]
            } must be a standard uncertainty in mm (0 or more), got "${value}"`,
          );
        }
        row[field] = n;
      } else if (field === "alphaBase") {
        const base = value.trim().toLowerCase();
        if (base !== "e" && base !== "10") {
          throw new SettingsError(`${file}:${i + 2}: ${header[c]} must be e or 10, got "${value}"`);
        }
        row[field] = base;
      } else {
        row[field] = value;
      }
    });
    return row;
  });
}

/** Reads a manifest file. */
export async function readManifest(
  path: string,
  maxBytes = DEFAULT_MAX_FILE_BYTES,
): Promise<ManifestRow[]> {
  try {
    return parseManifest(await readTextLimited(path, maxBytes), path);
  } catch (e) {
    if (e instanceof SettingsError) throw e;
    if (e instanceof LimitedReadError) throw new SettingsError(`Cannot read manifest ${e.message}`);
    throw new SettingsError(`Cannot read manifest ${path}: ${(e as Error).message}`);
  }
}

function normalise(file: string): string {
  return file.trim().replace(/\\/g, "/").replace(/^(\.\/)+/, "");
}

function baseName(file: string): string {
  return file.split(/[\\/]/).pop()!;
}

/** How the sample sheet's rows join the planned files. */
export interface SheetJoin {
  /** The row of each file that has exactly one. */
  rows: Map<string, ManifestRow>;
  /** Files whose row is ambiguous, with the message naming both candidates. */
  ambiguous: Map<string, string>;
  /** Rows that matched no file. */
  unused: ManifestRow[];
}

/**
 * Joins sheet rows to files exactly: a row's `file` is the input's path relative to the batch
 * root (or the path as given), or its base name when only one input has that name; a row
 * without `file` matches by sample name = file stem. A row that fits two files, or a file that
 * two rows name, is ambiguous and reported with both names (never a suffix match: `1.csv` is
 * not `11.csv`).
 *
 * @param relative Each file's path relative to the folder it was found under.
 */
export function joinSheet(
  rows: ManifestRow[],
  files: string[],
  relative: Map<string, string> = new Map(),
): SheetJoin {
  // no sheet: nothing to index (a batch of 100,000 files would build four maps for nothing)
  if (rows.length === 0) return { rows: new Map(), ambiguous: new Map(), unused: [] };
  const byRel = new Map<string, string[]>();
  const byBase = new Map<string, string[]>();
  const byStem = new Map<string, string[]>();
  const add = (m: Map<string, string[]>, k: string, f: string) => {
    const list = m.get(k);
    if (list) {
      if (!list.includes(f)) list.push(f);
    } else m.set(k, [f]);
  };
  for (const f of files) {
    add(byRel, normalise(relative.get(f) ?? f), f);
    add(byRel, normalise(f), f);
    const base = baseName(f);
    add(byBase, base, f);
    add(byStem, base.replace(/\.[^.]+$/, ""), f);
  }
  const claims = new Map<string, ManifestRow[]>();
  const ambiguous = new Map<string, string>();
  const unused: ManifestRow[] = [];
  for (const r of rows) {
    let hits: string[] | undefined;
    let what: string;
    if (r.file !== undefined) {
      const f = normalise(r.file);
      hits = byRel.get(f) ?? (f.includes("/") ? undefined : byBase.get(f));
      what = `file "${r.file}"`;
    } else if (r.sample !== undefined) {
      hits = byStem.get(r.sample);
      what = `sample "${r.sample}"`;
    } else {
      unused.push(r);
      continue;
    }
    if (!hits || hits.length === 0) {
      unused.push(r);
      continue;
    }
    if (hits.length > 1) {
      for (const f of hits) {
        ambiguous.set(
          f,
          `${f}: sample sheet line ${r.line} (${what}) matches both ${hits[0]} and ${
            hits[1]
          }; give the path relative to the input folder`,
        );
      }
      continue;
    }
    const list = claims.get(hits[0]!) ?? [];
    list.push(r);
    claims.set(hits[0]!, list);
  }
  const joined = new Map<string, ManifestRow>();
  for (const [f, list] of claims) {
    if (ambiguous.has(f)) continue;
    if (list.length > 1) {
      ambiguous.set(
        f,
        `${f}: sample sheet lines ${list[0]!.line} and ${list[1]!.line} both name this file`,
      );
    } else joined.set(f, list[0]!);
  }
  return { rows: joined, ambiguous, unused };
}

/** Finds the manifest row for one file by the rules of {@linkcode joinSheet}. */
export function matchRow(
  rows: ManifestRow[],
  file: string,
  relative?: string,
): ManifestRow | undefined {
  return joinSheet(rows, [file], new Map(relative ? [[file, relative]] : [])).rows.get(file);
}

/**
 * The sample sheet a lab keeps: one row per sample or file, with thickness, finished path,
 * host, polarisation, target, calibration and notes; other columns are carried along.
 *
 * @module
 */
import { parseSheet } from "../io/parse_sheet.ts";
import { SettingsError } from "./settings_schema.ts";

/** One manifest row with the columns crystint knows, the rest kept in `extra`. */
export interface ManifestRow {
  line: number;
  sample?: string;
  file?: string;
  thicknessMm?: number;
  pathMm?: number;
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
      } else {
        row[field] = value;
      }
    });
    return row;
  });
}

/** Reads a manifest file. */
export async function readManifest(path: string): Promise<ManifestRow[]> {
  try {
    return parseManifest(await Deno.readTextFile(path), path);
  } catch (e) {
    if (e instanceof SettingsError) throw e;
    throw new SettingsError(`Cannot read manifest ${path}: ${(e as Error).message}`);
  }
}

/** Finds the manifest row for a file: by file name (relative or base name), else by sample. */
export function matchRow(rows: ManifestRow[], file: string): ManifestRow | undefined {
  const base = file.split(/[\\/]/).pop()!;
  const stem = base.replace(/\.[^.]+$/, "");
  return rows.find((r) => r.file !== undefined && (file.endsWith(r.file) || r.file === base)) ??
    rows.find((r) => r.file === undefined && r.sample !== undefined && r.sample === stem);
}

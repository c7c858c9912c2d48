/**
 * How results.json keeps its samples small (issue 13): what samples share is stored once per
 * document, in its `shared` block, and each sample refers to it.
 *
 * - Lists of records whose keys are alike (colour rows, thickness-series points, fitted bands,
 *   uncertainty rows, assignment hints) are stored as a table `{shape, rows}`: `shape` numbers a
 *   key list in `shared.shapes`, each row holds the values in that order. Colour rows leave out
 *   `sample` and `file`, which are their sample's, and hold their white (`whiteX`, `whiteY`,
 *   `whiteZ`) as `white`, the number of an entry in `shared.whites`.
 * - Assignment hints refer to a catalogue entry in `shared.catalogue` (ion, host, transition,
 *   source, status, and the entry's centre and width), and their reason is rebuilt from the
 *   fitted band and that entry; a reason that would not come back the same is kept as it is.
 * - The charted transmittance, where it is the measurement the bands were fitted to (the same
 *   wavelengths as the fit's absorbance, in reverse), is kept once: as the integers of
 *   10^(−A) of that absorbance curve and, in `text`, what each differs from the stored values
 *   (`{q, over: "absorbance", text}`), when that is shorter. (10^(−A) is taken with `**`; an
 *   engine whose power function differed in the last bit would change an integer only where
 *   10^(−A)·q fell within that bit of a half, about once in 10¹¹ values.)
 * - The colour change leaves out the L*a*b*, chroma, hue and swatch of its two colours where they
 *   are those of the colour rows; provenance leaves out the entries with no value and no source.
 * - Computed numbers keep 9 significant digits (`STORED_DIGITS`): the rounding changes a number
 *   by at most 5 parts in 10⁹ of itself, far below what any measurement resolves (photometric
 *   noise of 10⁻⁴ or more); curves are stored at their own precision (`chart_curves.ts`).
 *
 * {@linkcode unpackResults} gives back the samples as {@linkcode SampleResult} records, every
 * key in place; a document without a `shared` block (written before) is given as it is.
 *
 * @module
 */
import { BAND_CATALOGUE, type CatalogueBand } from "../bands/data/band_catalogue.ts";
import { assignmentReason } from "../bands/assign_bands.ts";
import type { FittedBand } from "../bands/fit_bands.ts";
import type { ResultsDocument } from "./results_document.ts";
import {
  axisValues,
  curveValues,
  packSteps,
  type StoredAxis,
  type StoredCurve,
  type UniformAxis,
} from "./chart_curves.ts";
import { integersToText, textToIntegers } from "../numeric/step_text.ts";
import type { SampleResult } from "./sample_result.ts";

/** Significant digits of the computed numbers results.json stores (see the module note). */
export const STORED_DIGITS = 9;

/** A catalogue entry as a results document keeps it (centre and width when reasons are rebuilt). */
export interface StoredCatalogueEntry {
  /** Ion. */
  ion: string;
  /** Host crystal. */
  host: string;
  /** Transition or band name. */
  transition: string;
  /** Where the figures come from. */
  source: string;
  /** published, or from memory (unverified). */
  status: string;
  /** Centre, cm⁻¹ (present when the reasons referring to it are rebuilt). */
  centerCm1?: number;
  /** Typical width, cm⁻¹ (present with `centerCm1`). */
  fwhmCm1?: number;
}

/** What the samples of a results document share, stored once (the document's `shared` block). */
export interface SharedTables {
  /** Key lists of the record tables, numbered by position. */
  shapes: string[][];
  /** Catalogue entries the assignment hints refer to, numbered by position. */
  catalogue: StoredCatalogueEntry[];
  /** Whites of the colour rows (illuminant, observer, whiteX, whiteY, whiteZ), by position. */
  whites?: Record<string, unknown>[];
}

/** A list of records stored as one key list (`shape`) and a row of values per record. */
interface RecordTable {
  shape: number;
  rows: unknown[][];
}

/** A JSON object. */
type Json = Record<string, unknown>;

/** The white of a colour row, in its order. */
const WHITE_KEYS = ["whiteX", "whiteY", "whiteZ"];

/** The provenance entries, in their order (`provenance_step.ts`). */
const PROVENANCE_KEYS = ["thicknessMm", "pathMm", "host", "polarisation", "ordinate", "axis"];

/** The keys of an assignment hint, in their order (`assign_bands.ts`). */
const ASSIGNMENT_KEYS = [
  "bandIndex",
  "ion",
  "host",
  "transition",
  "score",
  "reason",
  "source",
  "status",
];

/** Change fields that repeat the colour rows: [change key, colour key, which colour]. */
/** The keys of a colour change in the order the analysis writes them (`change_step.ts`). */
const CHANGE_KEY_ORDER = [
  "from",
  "to",
  "observer",
  "adapt",
  "dE00",
  "dEab",
  "dL",
  "dC",
  "dh",
  "labFrom",
  "labTo",
  "chromaFrom",
  "chromaTo",
  "hueFrom",
  "hueTo",
  "swatchFrom",
  "swatchTo",
  "marked",
];

const CHANGE_REPEATS: [string, string, "from" | "to"][] = [
  ["chromaFrom", "C", "from"],
  ["chromaTo", "C", "to"],
  ["hueFrom", "h", "from"],
  ["hueTo", "h", "to"],
  ["swatchFrom", "srgb", "from"],
  ["swatchTo", "srgb", "to"],
];

/** A number at the stored precision (integers as they are; not finite: null, as JSON writes it). */
function roundNumber(v: number): number | null {
  if (!Number.isFinite(v)) return null;
  if (Number.isInteger(v)) return v === 0 ? 0 : v;
  return Number(v.toPrecision(STORED_DIGITS));
}

/**
 * A copy as JSON would give it back (undefined keys left out, numbers that are not finite null),
 * every computed number at the stored precision; curves (`plot`, `curve`) keep their own.
 */
function storedCopy(v: unknown, round = true): unknown {
  if (typeof v === "number") return round ? roundNumber(v) : Number.isFinite(v) ? v : null;
  if (Array.isArray(v)) return v.map((x) => x === undefined ? null : storedCopy(x, round));
  if (v && typeof v === "object") {
    const out: Json = {};
    for (const [k, x] of Object.entries(v)) {
      if (x !== undefined) out[k] = storedCopy(x, round && k !== "plot" && k !== "curve");
    }
    return out;
  }
  return v;
}

const isRecord = (v: unknown): v is Json => !!v && typeof v === "object" && !Array.isArray(v);

function isTable(v: unknown): v is RecordTable {
  return isRecord(v) && typeof v.shape === "number" && Array.isArray(v.rows);
}

const sameLab = (lab: unknown, row: Json | undefined) =>
  isRecord(lab) && row !== undefined && Object.keys(lab).join() === "L,a,b" &&
  lab.L === row.L && lab.a === row.a && lab.b === row.b;

/**
 * Packs sample results for results.json one at a time (a batch streams through it) and
 * collects what they share; write {@linkcode ResultsPacker.shared} after the samples.
 */
export class ResultsPacker {
  readonly #shapes: string[][] = [];
  readonly #shapeIndex = new Map<string, number>();
  readonly #catalogue: StoredCatalogueEntry[] = [];
  readonly #catalogueIndex = new Map<string, number>();
  readonly #whites: Json[] = [];
  readonly #whiteIndex = new Map<string, number>();

  /** What the samples packed so far share (grows as samples are packed; entries never change). */
  get shared(): SharedTables {
    return { shapes: this.#shapes, catalogue: this.#catalogue, whites: this.#whites };
  }

  /** The sample as results.json stores it (numbers at the stored precision, shared parts by number). */
  pack(result: SampleResult): Json {
    const s = storedCopy(result) as Json;
    const out: Json = { ...s };
    const color = s.color as Json[];
    const rows = color.map((row) => {
      const [k0, k1] = Object.keys(row);
      if (k0 !== "sample" || k1 !== "file" || row.sample !== s.sample || row.file !== s.file) {
        return undefined;
      }
      const { sample: _s, file: _f, ...rest } = row;
      return this.#referWhite(rest);
    });
    if (rows.every((r) => r !== undefined)) out.color = this.#table(rows as Json[]) ?? color;
    if (isRecord(s.change)) out.change = this.#packChange(s.change, color);
    if (isRecord(s.series) && Array.isArray(s.series.points)) {
      out.series = { ...s.series, points: this.#table(s.series.points) ?? s.series.points };
    }
    if (isRecord(s.bands)) out.bands = this.#packBands(s.bands);
    const overA = isRecord(s.plot) && isRecord(s.bands) && plotOverAbsorbance(s.plot, s.bands);
    if (overA) out.plot = { ...(s.plot as Json), t: overA };
    if (isRecord(s.uncertainty) && Array.isArray(s.uncertainty.rows)) {
      out.uncertainty = {
        ...s.uncertainty,
        rows: this.#table(s.uncertainty.rows) ?? s.uncertainty.rows,
      };
    }
    if (isRecord(s.provenance)) {
      out.provenance = Object.fromEntries(
        Object.entries(s.provenance).filter(([, v]) =>
          !(isRecord(v) && Object.keys(v).join() === "value,source" && v.value === null &&
            v.source === null)
        ),
      );
    }
    return out;
  }

  /** A colour row with its white as the number of a shared white (as it is without one). */
  #referWhite(row: Json): Json {
    const keys = Object.keys(row), at = keys.indexOf("whiteX");
    if (at < 0 || keys.slice(at, at + 3).join() !== WHITE_KEYS.join() || "white" in row) return row;
    const white = {
      illuminant: row.illuminant,
      observer: row.observer,
      ...Object.fromEntries(WHITE_KEYS.map((k) => [k, row[k]])),
    };
    const id = JSON.stringify(white);
    let index = this.#whiteIndex.get(id);
    if (index === undefined) {
      index = this.#whites.push(white) - 1;
      this.#whiteIndex.set(id, index);
    }
    const out: Json = {};
    for (const k of keys) {
      if (k === "whiteX") out.white = index;
      else if (!WHITE_KEYS.includes(k)) out[k] = row[k];
    }
    return out;
  }

  /** The records as a table, or undefined when there are none or their keys differ. */
  #table(records: unknown[]): RecordTable | undefined {
    if (records.length === 0 || !records.every(isRecord)) return undefined;
    const keys = Object.keys(records[0] as Json);
    const id = JSON.stringify(keys);
    if (!records.every((r) => JSON.stringify(Object.keys(r as Json)) === id)) return undefined;
    let shape = this.#shapeIndex.get(id);
    if (shape === undefined) {
      shape = this.#shapes.push(keys) - 1;
      this.#shapeIndex.set(id, shape);
    }
    return { shape, rows: records.map((r) => keys.map((k) => (r as Json)[k])) };
  }

  #packChange(change: Json, color: Json[]): Json {
    const rowOf = (illuminant: unknown) =>
      color.find((r) => r.illuminant === illuminant && r.observer === change.observer);
    const from = rowOf(change.from), to = rowOf(change.to);
    const out: Json = { ...change };
    if (sameLab(change.labFrom, from)) delete out.labFrom;
    if (sameLab(change.labTo, to)) delete out.labTo;
    for (const [key, colorKey, which] of CHANGE_REPEATS) {
      const row = which === "from" ? from : to;
      if (row !== undefined && key in change && change[key] === row[colorKey]) delete out[key];
    }
    return out;
  }

  #packBands(bands: Json): Json {
    const out: Json = { ...bands };
    const fitted = Array.isArray(bands.bands) ? bands.bands as Json[] : [];
    if (Array.isArray(bands.assignments)) {
      const hints = bands.assignments.map((a) => this.#packAssignment(a, fitted));
      out.assignments = hints.every((h) => h !== undefined)
        ? this.#table(hints) ?? hints
        : bands.assignments;
    }
    for (const key of ["bands", "bandsAlpha"]) {
      if (Array.isArray(bands[key])) out[key] = this.#table(bands[key]) ?? bands[key];
    }
    return out;
  }

  /** An assignment hint referring to a catalogue entry, or undefined when it has other keys. */
  #packAssignment(a: unknown, fitted: Json[]): Json | undefined {
    if (!isRecord(a) || Object.keys(a).join() !== ASSIGNMENT_KEYS.join()) return undefined;
    const band = fitted[a.bandIndex as number] as FittedBand | undefined;
    const same = (e: CatalogueBand) =>
      e.ion === a.ion && e.host === a.host && e.transition === a.transition &&
      e.source === a.source && e.status === a.status;
    const known = band &&
      BAND_CATALOGUE.find((e) => same(e) && assignmentReason(band, e) === a.reason);
    const entry: StoredCatalogueEntry = {
      ion: a.ion as string,
      host: a.host as string,
      transition: a.transition as string,
      source: a.source as string,
      status: a.status as string,
      ...(known ? { centerCm1: known.centerCm1, fwhmCm1: known.fwhmCm1 } : {}),
    };
    const id = JSON.stringify(entry);
    let index = this.#catalogueIndex.get(id);
    if (index === undefined) {
      index = this.#catalogue.push(entry) - 1;
      this.#catalogueIndex.set(id, index);
    }
    return {
      bandIndex: a.bandIndex,
      entry: index,
      score: a.score,
      ...(known ? {} : { reason: a.reason }),
    };
  }
}

/** A charted transmittance kept as what it differs from 10^(−A) of the fitted absorbance. */
interface TransmittanceOverAbsorbance {
  q: number;
  over: "absorbance";
  text: string;
}

/** Integers of 10^(−A)·q on the plot's wavelengths, or undefined when the curves do not match. */
function fromAbsorbance(plot: Json, bands: Json, q: number): number[] | undefined {
  const curve = bands.curve as { nm: StoredAxis; data: StoredCurve } | undefined;
  if (bands.ordinate !== "absorbance" || !curve) return undefined;
  if (!reversedAxes(plot.nm as StoredAxis, curve.nm)) return undefined;
  const a = curveValues(curve.data).reverse();
  return a.map((x) => Math.round(10 ** -x * q));
}

/**
 * Whether one axis holds the other's wavelengths in reverse. Equal steps of 0.01 nm multiples
 * (as stored) are compared by their ends, lists value by value. (Only a choice of coding rests
 * on it: what is kept over the absorbance is exact whatever the axes.)
 */
function reversedAxes(a: StoredAxis, b: StoredAxis): boolean {
  if (!Array.isArray(a) && !Array.isArray(b)) {
    const end = (x: UniformAxis) =>
      axisValues({ ...x, from: x.from + (x.count - 1) * x.step, count: 1 })[0];
    return a.count === b.count && a.step === -b.step && a.from === end(b) && b.from === end(a);
  }
  const x = axisValues(a), y = axisValues(b);
  return x.length === y.length && x.every((v, i) => v === y[y.length - 1 - i]);
}

/** The plot's transmittance over the fitted absorbance, when that is shorter. */
function plotOverAbsorbance(plot: Json, bands: Json): TransmittanceOverAbsorbance | undefined {
  const t = plot.t as StoredCurve;
  if (Array.isArray(t) || !("text" in t)) return undefined;
  const derived = fromAbsorbance(plot, bands, t.q);
  if (!derived || !derived.every(Number.isSafeInteger)) return undefined;
  const k = curveValues(t).map((v) => Math.round(v * t.q));
  const text = integersToText(k.map((x, i) => x - derived[i]!));
  if (text.length >= t.text.length) return undefined;
  // unpacking adds the differences back (exact) and packs the values again: kept so only when
  // that gives back the very same text
  const again = packSteps(k.map((x) => x / t.q), Math.round(Math.log10(t.q)));
  if (Array.isArray(again) || !("text" in again)) return undefined;
  return again.text === t.text && again.order === t.order
    ? { q: t.q, over: "absorbance", text }
    : undefined;
}

/** The plot with its transmittance as stored before being kept over the absorbance. */
function unpackPlot(plot: Json, bands: Json): Json {
  const t = plot.t as TransmittanceOverAbsorbance;
  const derived = fromAbsorbance(plot, bands, t.q);
  const diff = textToIntegers(t.text);
  if (!derived || diff.length !== derived.length) {
    throw new RangeError("Cannot unpack results: the plot is kept over an absorbance it lacks");
  }
  const values = derived.map((k, i) => (k + diff[i]!) / t.q);
  return { ...plot, t: packSteps(values, Math.round(Math.log10(t.q))) };
}

/** The records of a table (a list, as written before, is given as it is). */
function records(v: unknown, shared: SharedTables): Json[] {
  if (!isTable(v)) return v as Json[];
  const keys = shared.shapes[v.shape];
  if (!keys) throw new RangeError(`Cannot unpack results: no shape ${v.shape} in "shared"`);
  return v.rows.map((row) => Object.fromEntries(keys.map((k, i) => [k, row[i]])));
}

/** One assignment hint with its catalogue entry's texts and its reason. */
function unpackAssignment(a: Json, fitted: Json[], shared: SharedTables): Json {
  if (typeof a.entry !== "number") return a;
  const e = shared.catalogue[a.entry];
  if (!e) throw new RangeError(`Cannot unpack results: no catalogue entry ${a.entry}`);
  const band = fitted[a.bandIndex as number] as FittedBand | undefined;
  let reason = a.reason;
  if (reason === undefined) {
    if (!band || e.centerCm1 === undefined || e.fwhmCm1 === undefined) {
      throw new RangeError(`Cannot unpack results: no reason for band ${a.bandIndex}`);
    }
    reason = assignmentReason(band, {
      ion: e.ion,
      centerCm1: e.centerCm1,
      fwhmCm1: e.fwhmCm1,
      status: e.status as CatalogueBand["status"],
    });
  }
  return {
    bandIndex: a.bandIndex,
    ion: e.ion,
    host: e.host,
    transition: e.transition,
    score: a.score,
    reason,
    source: e.source,
    status: e.status,
  };
}

/**
 * A sample of a packed results document as a {@linkcode SampleResult} (every key back in
 * place); `shared` is the document's `shared` block.
 *
 * @throws {RangeError} When the sample refers to a shape or catalogue entry `shared` lacks.
 */
export function unpackSample(stored: Record<string, unknown>, shared: SharedTables): SampleResult {
  const s: Json = { ...stored };
  if (isTable(stored.color)) {
    s.color = records(stored.color, shared).map((row) => {
      const out: Json = { sample: stored.sample, file: stored.file };
      for (const [k, v] of Object.entries(row)) {
        if (k !== "white") out[k] = v;
        else {
          const white = shared.whites?.[v as number];
          if (!white) throw new RangeError(`Cannot unpack results: no white ${v} in "shared"`);
          for (const w of WHITE_KEYS) out[w] = white[w];
        }
      }
      return out;
    });
  }
  const color = s.color as Json[];
  if (isRecord(stored.change)) s.change = unpackChange(stored.change, color);
  if (isRecord(stored.series)) {
    s.series = { ...stored.series, points: records(stored.series.points, shared) };
  }
  if (isRecord(stored.bands)) {
    const b: Json = { ...stored.bands };
    for (const key of ["bands", "bandsAlpha"]) {
      if (key in b) b[key] = records(b[key], shared);
    }
    if ("assignments" in b) {
      const fitted = Array.isArray(b.bands) ? b.bands as Json[] : [];
      b.assignments = records(b.assignments, shared).map((a) =>
        unpackAssignment(a, fitted, shared)
      );
    }
    s.bands = b;
  }
  if (isRecord(stored.plot) && isRecord(stored.plot.t) && stored.plot.t.over === "absorbance") {
    s.plot = unpackPlot(stored.plot, s.bands as Json);
  }
  if (isRecord(stored.uncertainty)) {
    s.uncertainty = { ...stored.uncertainty, rows: records(stored.uncertainty.rows, shared) };
  }
  if (isRecord(stored.provenance)) {
    const p: Json = {};
    for (const k of PROVENANCE_KEYS) p[k] = stored.provenance[k] ?? { value: null, source: null };
    s.provenance = { ...p, ...stored.provenance };
  }
  return s as unknown as SampleResult;
}

/** The colour change with the values it shares with the colour rows put back. */
function unpackChange(change: Json, color: Json[]): Json {
  const rowOf = (illuminant: unknown) =>
    color.find((r) => r.illuminant === illuminant && r.observer === change.observer);
  const rows = { from: rowOf(change.from), to: rowOf(change.to) };
  const lab = (row: Json | undefined) => row && { L: row.L, a: row.a, b: row.b };
  const full: Json = { ...change };
  const restore = (key: string, value: unknown) => {
    if (!(key in change) && value !== undefined) full[key] = value;
  };
  restore("labFrom", lab(rows.from));
  restore("labTo", lab(rows.to));
  for (const [key, colorKey, which] of CHANGE_REPEATS) restore(key, rows[which]?.[colorKey]);
  // the keys in the order the analysis writes them, whichever were left out; others after
  const out: Json = {};
  for (const k of CHANGE_KEY_ORDER) if (k in full) out[k] = full[k];
  for (const [k, v] of Object.entries(full)) if (!(k in out)) out[k] = v;
  return out;
}

/**
 * A sample with its charted curves and axes as plain lists of numbers (what
 * `batch --plain-json` stores, for readers without crystint); values are the stored ones.
 */
export function plainResult(result: SampleResult): SampleResult {
  const out: SampleResult = {
    ...result,
    plot: { nm: axisValues(result.plot.nm), t: curveValues(result.plot.t) },
  };
  if (result.bands) {
    const c = result.bands.curve;
    out.bands = {
      ...result.bands,
      curve: { nm: axisValues(c.nm), data: curveValues(c.data), model: curveValues(c.model) },
    };
  }
  return out;
}

/**
 * A parsed results.json with its samples as {@linkcode SampleResult} records: what notebooks
 * and other programs should call before reading `samples`. A document written before packing
 * (no `shared` block) is given as it is.
 *
 * @throws {RangeError} When a sample refers to a shape or catalogue entry the document lacks.
 * @example A colour table and its shared key list
 * ```ts
 * import { unpackResults } from "./results_packing.ts";
 * const doc = unpackResults(JSON.parse(`{"samples": [{"sample": "S1", "file": "S1.csv",
 *   "color": {"shape": 0, "rows": [["D65", "2", 90.146]]}}], "errors": [],
 *   "shared": {"shapes": [["illuminant", "observer", "L"]], "catalogue": []}}`));
 * const row = doc.samples[0]!.color[0]!;
 * if (row.sample !== "S1" || row.observer !== "2" || row.L !== 90.146) throw new Error();
 * ```
 */
export function unpackResults(
  doc: Omit<ResultsDocument, "samples"> & { samples: unknown[]; shared?: SharedTables },
): ResultsDocument {
  const { shared, ...rest } = doc;
  if (!shared) return rest as ResultsDocument;
  return { ...rest, samples: rest.samples.map((s) => unpackSample(s as Json, shared)) };
}

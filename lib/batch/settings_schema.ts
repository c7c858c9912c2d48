/**
 * Batch settings: the schema (types, defaults, bounds) and its validation with clear messages.
 *
 * @module
 */
import { getIlluminant } from "../cie/illuminants.ts";
import { getObserver } from "../cie/observers.ts";
import { getHost, parseSellmeier } from "../optics/refractive_index.ts";
import { axisFromText, ordinateFromText } from "../io/header_units.ts";
import { checkSettingsShape } from "./settings_shape.ts";
import type {
  ChangeSetting,
  SeriesSetting,
  TargetColor,
  TargetSetting,
} from "../analysis/sample_settings.ts";
import type { ReportHeader } from "../analysis/results_document.ts";

export type { TargetColor, TargetSetting };

/** Everything a batch run is configured by. */
export interface BatchSettings {
  illuminants: string[];
  observers: string[];
  change: ChangeSetting;
  /** Default path length for the finished stone, mm (a manifest column overrides it). */
  pathMm?: number;
  /** Default measured thickness, mm, when neither file nor manifest says. */
  thicknessMm?: number;
  /** Surfaces: none, host (Fresnel), or unset: host where a host is known, else none. */
  reflection?: "none" | "host";
  host?: string;
  n?: number;
  /** The user's own Sellmeier coefficients, as for `--sellmeier` (overrides the host's). */
  sellmeier?: string;
  ordinate?: string;
  axis?: string;
  /** The target every sample is checked against, unless the manifest names another. */
  target?: TargetSetting;
  /** Named targets the manifest's `target` column may refer to. */
  targets: Record<string, TargetSetting>;
  /** Thickness series range; `targetL` asks for the path that reaches that L*. */
  series: SeriesSetting;
  /** Hue difference (degrees) from which a D65→A change is called marked (common practice). */
  changeHueThresholdDeg: number;
  /** Smallest C*ab (under both lights) for a change to be called marked (common practice). */
  changeMinChroma: number;
  /** Calibration file applied to every sample unless the manifest names another. */
  calibration?: string;
  /** Named calibration files the manifest's `calibration` column may refer to. */
  calibrations: Record<string, string>;
  /** Report title, lab, client, operator, note, date and audience; date defaults to the run's. */
  report?: Partial<ReportHeader>;
  /** Per-file limits of a batch (see batch_limits.ts for the defaults). */
  limits?: { maxFileMb?: number; fileTimeoutSeconds?: number; maxMemoryMb?: number };
  /** Base of α inputs: `10` (decadic, A = α·d) values are multiplied by ln 10 on read. */
  alphaBase: "e" | "10";
  /** Uncertainty sources and verdict levels; omitted or `enabled: false`: none computed. */
  uncertainty?: BatchUncertainty;
}

/** The `uncertainty:` block (GUM, JCGM 100:2008 sources; guard bands as ISO 14253-1). */
export interface BatchUncertainty {
  /** Photometric noise per point in the file's ordinate; omitted: estimated from the spectrum. */
  noiseSd?: number;
  /** Zero/100 % level error, fully correlated across wavelengths, same unit. */
  offsetSd: number;
  /** Wavelength-scale error (a shift), nm. */
  wavelengthSdNm: number;
  /** Thickness tolerance, mm (the sheet's `thickness_sd` overrides it). */
  thicknessSdMm: number;
  /** Path tolerance, mm (the sheet's `path_sd` overrides it). */
  pathSdMm: number;
  /** Smallest pass probability that is a pass. */
  passAt: number;
  /** Largest pass probability that is a fail. */
  failAt: number;
}

/** A problem with the settings file (a usage error, exit code 1). */
export class SettingsError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "SettingsError";
  }
}

/** The defaults. */
export function defaultSettings(): BatchSettings {
  return {
    illuminants: ["D65", "A"],
    observers: ["2", "10"],
    change: { from: "D65", to: "A", observer: "2", adapt: "none" },
    targets: {},
    calibrations: {},
    series: { fromMm: 0.5, toMm: 12, steps: 24 },
    changeHueThresholdDeg: 20,
    changeMinChroma: 5,
    alphaBase: "e",
  };
}

function num(v: unknown, where: string, positive = false): number {
  const n = typeof v === "string" ? Number(v.replace(",", ".")) : v;
  if (typeof n !== "number" || !Number.isFinite(n) || (positive && !(n > 0))) {
    throw new SettingsError(
      `Setting ${where} must be a ${positive ? "positive " : ""}number, got ${JSON.stringify(v)}`,
    );
  }
  return n;
}

function target(v: unknown, where: string): TargetSetting {
  if (typeof v === "string") {
    const parts = v.split(/[,;\s]+/).filter(Boolean);
    if (parts.length !== 3) throw new SettingsError(`Setting ${where} must be "L,a,b", got "${v}"`);
    return target({ L: parts[0], a: parts[1], b: parts[2] }, where);
  }
  if (!v || typeof v !== "object") {
    throw new SettingsError(`Setting ${where} must be an object with L, a, b`);
  }
  const o = v as Record<string, unknown>;
  const observer = String(o.observer ?? "2");
  const toleranceDE00 = o.toleranceDE00 === undefined
    ? 2
    : num(o.toleranceDE00, `${where}.toleranceDE00`, true);
  check(() => getObserver(observer), `${where}.observer`);
  const lab = (x: unknown, at: string, illuminant: string): TargetColor => {
    check(() => getIlluminant(illuminant), `${at}`);
    if (Array.isArray(x) && x.length === 3) {
      return {
        L: num(x[0], `${at}[0]`),
        a: num(x[1], `${at}[1]`),
        b: num(x[2], `${at}[2]`),
        illuminant,
      };
    }
    const r = (x ?? {}) as Record<string, unknown>;
    return { L: num(r.L, `${at}.L`), a: num(r.a, `${at}.a`), b: num(r.b, `${at}.b`), illuminant };
  };
  let colors: TargetColor[];
  const t: Partial<TargetSetting> = {};
  if (o.spectrum !== undefined) {
    const ills = o.illuminants === undefined
      ? ["D65", "A"]
      : (Array.isArray(o.illuminants) ? o.illuminants : String(o.illuminants).split(",")).map((x) =>
        String(x).trim()
      );
    colors = ills.map((
      ill,
    ) => (check(() => getIlluminant(ill), `${where}.illuminants`),
      { L: NaN, a: NaN, b: NaN, illuminant: ill })
    );
    t.spectrum = String(o.spectrum);
    if (o.spectrumPathMm !== undefined) {
      t.spectrumPathMm = num(o.spectrumPathMm, `${where}.spectrumPathMm`, true);
    }
  } else if (o.under !== undefined) {
    if (!o.under || typeof o.under !== "object") {
      throw new SettingsError(`Setting ${where}.under must map illuminants to L, a, b`);
    }
    colors = Object.entries(o.under as Record<string, unknown>).map(([ill, x]) =>
      lab(x, `${where}.under.${ill}`, ill)
    );
  } else {
    colors = [lab(o, where, String(o.illuminant ?? "D65"))];
  }
  if (colors.length === 0) throw new SettingsError(`Setting ${where} names no target colour`);
  return { ...colors[0]!, observer, toleranceDE00, also: colors.slice(1), ...t } as TargetSetting;
}

function check(f: () => unknown, where: string) {
  try {
    f();
  } catch (e) {
    throw new SettingsError(`Setting ${where}: ${(e as Error).message}`);
  }
}

/** Longest title, lab, client or operator text (the note may be longer). */
const REPORT_TEXT_LIMIT = 200;
const REPORT_NOTE_LIMIT = 2000;

function reportSettings(v: unknown): Partial<ReportHeader> {
  if (!v || typeof v !== "object" || Array.isArray(v)) {
    throw new SettingsError("Setting report must be a mapping (title, lab, client, …)");
  }
  const o = v as Record<string, unknown>;
  const out: Partial<ReportHeader> = {};
  for (const k of Object.keys(o)) {
    if (!["title", "lab", "client", "operator", "note", "date", "audience"].includes(k)) {
      throw new SettingsError(`Unknown setting "report.${k}"`);
    }
  }
  for (const k of ["title", "lab", "client", "operator", "note"] as const) {
    const x = o[k];
    if (x === undefined || x === null) continue;
    if (typeof x !== "string" && typeof x !== "number") {
      throw new SettingsError(`Setting report.${k} must be text`);
    }
    const text = String(x);
    const limit = k === "note" ? REPORT_NOTE_LIMIT : REPORT_TEXT_LIMIT;
    if (text.length > limit) {
      throw new SettingsError(`Setting report.${k} must be at most ${limit} characters`);
    }
    out[k] = text;
  }
  if (o.date !== undefined && o.date !== null) {
    const d = o.date instanceof Date ? o.date.toISOString().slice(0, 10) : o.date;
    if (typeof d !== "string" || d.length === 0 || d.length > REPORT_TEXT_LIMIT) {
      throw new SettingsError("Setting report.date must be a date as text, e.g. 2026-12-02");
    }
    out.date = d;
  }
  if (o.audience !== undefined) {
    if (o.audience !== "internal" && o.audience !== "client") {
      throw new SettingsError("Setting report.audience must be internal or client");
    }
    out.audience = o.audience;
  }
  return out;
}

/** The `uncertainty:` block (bounds checked by settings_shape.ts); null when disabled. */
function uncertaintySettings(v: unknown): BatchUncertainty | null {
  const o = (v ?? {}) as Record<string, unknown>;
  if (o.enabled === false) return null;
  const sd = (k: string) => o[k] === undefined ? 0 : num(o[k], `uncertainty.${k}`);
  const u: BatchUncertainty = {
    offsetSd: sd("offsetSd"),
    wavelengthSdNm: sd("wavelengthSdNm"),
    thicknessSdMm: sd("thicknessSdMm"),
    pathSdMm: sd("pathSdMm"),
    passAt: o.passAt === undefined ? 0.95 : num(o.passAt, "uncertainty.passAt"),
    failAt: o.failAt === undefined ? 0.05 : num(o.failAt, "uncertainty.failAt"),
  };
  if (o.noiseSd !== undefined) u.noiseSd = num(o.noiseSd, "uncertainty.noiseSd");
  if (!(0 < u.failAt && u.failAt < u.passAt && u.passAt < 1)) {
    throw new SettingsError(
      `Setting uncertainty: need 0 < failAt < passAt < 1, got failAt ${u.failAt}, passAt ${u.passAt}`,
    );
  }
  return u;
}

/**
 * Validates a settings object (from JSON or YAML) on top of the defaults.
 *
 * Types and bounds are checked first (settings_shape.ts); unknown keys go to `warn`.
 *
 * @throws {SettingsError} Naming the setting and what is wrong with it.
 */
export function resolveSettings(
  raw: unknown,
  warn: (message: string) => void = () => {},
): BatchSettings {
  const s = defaultSettings();
  if (raw === null || raw === undefined) return s;
  const shape = checkSettingsShape(raw);
  if (shape.error) throw new SettingsError(shape.error);
  shape.warnings.forEach((w) => warn(w));
  if (typeof raw !== "object" || Array.isArray(raw)) {
    throw new SettingsError("Settings must be a mapping of names to values");
  }
  const o = raw as Record<string, unknown>;
  const list = (
    v: unknown,
  ) => (Array.isArray(v) ? v.map(String) : String(v).split(",").map((x) => x.trim()));
  if (o.illuminants !== undefined) s.illuminants = list(o.illuminants);
  if (o.observers !== undefined) s.observers = list(o.observers);
  s.illuminants.forEach((i) => check(() => getIlluminant(i), "illuminants"));
  s.observers.forEach((i) => check(() => getObserver(i), "observers"));
  if (o.change !== undefined) {
    const c = o.change as Record<string, unknown>;
    s.change = {
      from: String(c.from ?? s.change.from),
      to: String(c.to ?? s.change.to),
      observer: String(c.observer ?? s.change.observer),
      adapt: (c.adapt ?? "none") as BatchSettings["change"]["adapt"],
    };
    check(() => getIlluminant(s.change.from), "change.from");
    check(() => getIlluminant(s.change.to), "change.to");
    check(() => getObserver(s.change.observer), "change.observer");
    if (!["none", "cat16", "bradford"].includes(s.change.adapt)) {
      throw new SettingsError(`Setting change.adapt must be none, cat16 or bradford`);
    }
  }
  if (o.pathMm !== undefined) s.pathMm = num(o.pathMm, "pathMm", true);
  if (o.thicknessMm !== undefined) s.thicknessMm = num(o.thicknessMm, "thicknessMm", true);
  if (o.reflection !== undefined) {
    if (o.reflection !== "none" && o.reflection !== "host") {
      throw new SettingsError(`Setting reflection must be none or host`);
    }
    s.reflection = o.reflection;
  }
  if (o.host !== undefined) {
    s.host = String(o.host);
    check(() => getHost(s.host!), "host");
  }
  if (o.n !== undefined) s.n = num(o.n, "n", true);
  if (o.sellmeier !== undefined) {
    s.sellmeier = String(o.sellmeier);
    check(() => parseSellmeier(s.sellmeier!), "sellmeier");
  }
  if (o.ordinate !== undefined) {
    s.ordinate = String(o.ordinate);
    if (!ordinateFromText(s.ordinate)) {
      throw new SettingsError(`Setting ordinate: unknown kind "${s.ordinate}"`);
    }
  }
  if (o.axis !== undefined) {
    s.axis = String(o.axis);
    if (!axisFromText(s.axis)) throw new SettingsError(`Setting axis: unknown unit "${s.axis}"`);
  }
  if (o.target !== undefined) s.target = target(o.target, "target");
  if (o.targets !== undefined) {
    if (!o.targets || typeof o.targets !== "object") {
      throw new SettingsError("Setting targets must be a mapping");
    }
    for (const [name, t] of Object.entries(o.targets as Record<string, unknown>)) {
      s.targets[name] = target(t, `targets.${name}`);
    }
  }
  if (o.series !== undefined) {
    const r = o.series as Record<string, unknown>;
    s.series = {
      fromMm: r.fromMm === undefined ? s.series.fromMm : num(r.fromMm, "series.fromMm", true),
      toMm: r.toMm === undefined ? s.series.toMm : num(r.toMm, "series.toMm", true),
      steps: r.steps === undefined
        ? s.series.steps
        : Math.round(num(r.steps, "series.steps", true)),
    };
    if (r.targetL !== undefined) s.series.targetL = num(r.targetL, "series.targetL");
    if (s.series.toMm <= s.series.fromMm) {
      throw new SettingsError("Setting series.toMm must exceed series.fromMm");
    }
  }
  if (o.changeMinChroma !== undefined) {
    s.changeMinChroma = num(o.changeMinChroma, "changeMinChroma");
  }
  if (o.calibration !== undefined) s.calibration = String(o.calibration);
  if (o.calibrations !== undefined) {
    if (!o.calibrations || typeof o.calibrations !== "object") {
      throw new SettingsError("Setting calibrations must be a mapping");
    }
    for (const [name, path] of Object.entries(o.calibrations as Record<string, unknown>)) {
      s.calibrations[name] = String(path);
    }
  }
  if (o.report !== undefined) s.report = reportSettings(o.report);
  if (o.limits !== undefined) {
    const l = o.limits as Record<string, unknown>;
    s.limits = {};
    if (l.maxFileMb !== undefined) s.limits.maxFileMb = num(l.maxFileMb, "limits.maxFileMb", true);
    if (l.fileTimeoutSeconds !== undefined) {
      s.limits.fileTimeoutSeconds = num(l.fileTimeoutSeconds, "limits.fileTimeoutSeconds", true);
    }
    if (l.maxMemoryMb !== undefined) {
      s.limits.maxMemoryMb = num(l.maxMemoryMb, "limits.maxMemoryMb");
    }
  }
  if (o.alphaBase !== undefined) {
    const base = String(o.alphaBase).trim().toLowerCase();
    if (base !== "e" && base !== "10") throw new SettingsError("Setting alphaBase must be e or 10");
    s.alphaBase = base;
  }
  if (o.uncertainty !== undefined) {
    const u = uncertaintySettings(o.uncertainty);
    if (u) s.uncertainty = u;
  }
  if (o.changeHueThresholdDeg !== undefined) {
    s.changeHueThresholdDeg = num(o.changeHueThresholdDeg, "changeHueThresholdDeg", true);
  }
  return s;
}

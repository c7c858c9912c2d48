/**
 * First-order propagation of measurement uncertainty from a spectrum to CIELAB (GUM,
 * JCGM 100:2008 §5.1–5.2): the colour is linear in the path transmittance (XYZ = Σ wᵢ Tᵢ with
 * the cached weighting factors), the path transmittance has exact derivatives
 * (path_transmittance_sensitivity.ts), and CIELAB has its analytic Jacobian in XYZ (CIE 15:2018
 * eq. 8.3–8.5, both branches of f). Sources: per-point photometric noise (independent), a
 * photometric offset (fully correlated across wavelengths), a wavelength-scale shift, the
 * measured thickness and the target path; all mutually independent. Standard uncertainties are
 * k = 1.
 *
 * @module
 */
import type { Spectrum } from "../spectrum/spectrum.ts";
import type { ReflectionSettings } from "../optics/path_transmittance.ts";
import {
  type PathTransmittanceSensitivity,
  pathTransmittanceSensitivity,
} from "../optics/path_transmittance_sensitivity.ts";
import { type AdaptationMethod, adaptXyz } from "./adaptation.ts";
import { getIlluminant, type Illuminant } from "./illuminants.ts";
import { type Lab, xyzToLab } from "./spaces.ts";
import {
  type TristimulusWeights,
  tristimulusWeights,
  weightedXyz,
  type Xyz,
} from "./tristimulus.ts";

/** Uncertainty sources as given; each is a standard uncertainty (k = 1). */
export interface UncertaintySources {
  /**
   * Photometric noise per point, in the spectrum's own ordinate (T as a fraction, so 0.3 %T
   * is 0.003; A in absorbance units; α in cm⁻¹): one value, or one per point.
   * @default estimated from the spectrum's high-frequency residual ({@linkcode estimateNoiseSd})
   */
  noiseSd?: number | ArrayLike<number>;
  /** Zero/100 % level error, fully correlated across wavelengths, same unit. @default 0 */
  offsetSd?: number;
  /** Wavelength-scale error (a shift), nm. @default 0 */
  wavelengthSdNm?: number;
  /** Measured thickness, mm. @default 0 */
  thicknessSdMm?: number;
  /** Target path, mm. @default 0 */
  pathSdMm?: number;
}

/** The sources actually used, stated with each result (plain JSON). */
export interface ResolvedUncertaintySources {
  /** Median of the per-point noise σ, in the spectrum's ordinate. */
  noiseSd: number;
  /** Largest per-point noise σ (noise that grows where the sample is dark shows here). */
  noiseSdMax: number;
  /** `given`, or `estimated` from the high-frequency residual. */
  noiseSource: "given" | "estimated";
  /** Ordinate the noise and offset are in. */
  ordinate: Spectrum["quantity"];
  /** Zero/100 % level error used, same unit as the noise. */
  offsetSd: number;
  /** Wavelength-scale error used, nm. */
  wavelengthSdNm: number;
  /** Thickness uncertainty used, mm. */
  thicknessSdMm: number;
  /** Path uncertainty used, mm. */
  pathSdMm: number;
}

/** Names of the correlated (one-number) sources. */
export type SourceName = "offset" | "wavelength" | "thickness" | "path";

/** Standard uncertainty of L*, a*, b* from one source alone. */
export interface LabSd {
  /** σ of L*. */
  LSd: number;
  /** σ of a*. */
  aSd: number;
  /** σ of b*. */
  bSd: number;
}

/** Uncertainty of one colour row (one illuminant × observer); plain JSON. */
export interface ColorUncertainty {
  /** Illuminant of the row. */
  illuminant: string;
  /** Observer of the row. */
  observer: string;
  /** `linear`: first order (JCGM 100); `mc`: Monte Carlo (JCGM 101). */
  mode: "linear" | "mc";
  /** σ of L* (k = 1). */
  LSd: number;
  /** σ of a*. */
  aSd: number;
  /** σ of b*. */
  bSd: number;
  /** σ of C*ab. */
  CSd: number;
  /** σ of the hue angle in degrees; null at C* = 0, where the hue is undefined. */
  hSd: number | null;
  /** Covariance of (L*, a*, b*), row-major 3×3. */
  labCovariance: number[][];
  /** What each source alone contributes (first order; absent for Monte Carlo). */
  budget?: Record<"noise" | SourceName, LabSd>;
  /** The sources used. */
  sources: ResolvedUncertaintySources;
  /** What the numbers leave out or could not include. */
  notes: string[];
  /** Monte Carlo only: number of draws, seed, mean and 95 % probabilistically symmetric intervals. */
  draws?: number;
  /** Monte Carlo only: the seed. */
  seed?: number;
  /** Monte Carlo only: the mean L*a*b* of the draws. */
  labMean?: Lab;
  /** Monte Carlo only: probabilistically symmetric 95 % intervals. */
  interval95?: Record<"L" | "a" | "b" | "C" | "h", [number, number]>;
}

/** Choices shared by the linear and Monte Carlo routes. */
export interface ColorUncertaintyOptions {
  /** Illuminants by name or object. @default ["D65", "A"] */
  illuminants?: (string | Illuminant)[];
  /** Observers. @default ["2"] */
  observers?: string[];
  /** Path in mm to compute the colour for; omitted: the measured slab as it is. */
  pathMm?: number;
  /** Surface treatment of the rescaling. @default { reflection: "none" } */
  reflection?: ReflectionSettings;
  /** The uncertainty sources; noise is estimated when not given. */
  sources?: UncertaintySources;
}

/** Points on each side of the moving window of the noise estimate. */
const NOISE_HALF_WINDOW = 50;
/** Var(v_{i−2} − 4v_{i−1} + 6v_i − 4v_{i+1} + v_{i+2}) = 70 σ² for white noise. */
const FOURTH_DIFFERENCE_VARIANCE = 70;
/** σ = 1.4826 · MAD for a normal distribution. */
const MAD_TO_SD = 1.4826;

function median(v: number[]): number {
  if (v.length === 0) return 0;
  const s = v.slice().sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/**
 * Per-point photometric noise σ estimated from the high-frequency residual: fourth differences
 * (which cancel any cubic trend, so smooth bands barely contribute), robust scale (1.4826 ·
 * median absolute deviation) over a moving window of ±50 points, so noise that grows where the
 * sample is dark is followed. Instruments that smooth their output make this an underestimate.
 *
 * @param values Measured values in their own ordinate, on a (nearly) uniform grid.
 * @returns σ per point, same length; zeros when fewer than 9 points.
 *
 * @example Uniform noise of σ 0.001 on a sloping baseline is recovered
 * ```ts
 * import { estimateNoiseSd } from "./color_uncertainty.ts";
 * let seed = 12345;
 * const uniform = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648) - 0.5;
 * const v = Float64Array.from({ length: 400 }, (_, i) => 0.3 + i / 1000 + 0.001 * Math.sqrt(12) * uniform());
 * const sd = estimateNoiseSd(v)[200]!;
 * if (Math.abs(sd / 0.001 - 1) > 0.3) throw new Error(String(sd));
 * ```
 */
export function estimateNoiseSd(values: ArrayLike<number>): Float64Array<ArrayBuffer> {
  const n = values.length;
  const out = new Float64Array(n);
  if (n < 9) return out;
  const d4 = new Float64Array(n - 4);
  for (let i = 2; i < n - 2; i++) {
    d4[i - 2] = values[i - 2]! - 4 * values[i - 1]! + 6 * values[i]! - 4 * values[i + 1]! +
      values[i + 2]!;
  }
  const scale = MAD_TO_SD / Math.sqrt(FOURTH_DIFFERENCE_VARIANCE);
  for (let i = 0; i < n; i++) {
    const c = Math.min(Math.max(i - 2, 0), d4.length - 1);
    const lo = Math.max(0, c - NOISE_HALF_WINDOW),
      hi = Math.min(d4.length, c + NOISE_HALF_WINDOW + 1);
    const w = Array.from(d4.subarray(lo, hi));
    const m = median(w);
    out[i] = scale * median(w.map((x) => Math.abs(x - m)));
  }
  return out;
}

/** The sources with defaults filled in, and the per-point noise σ. */
export function resolveUncertaintySources(
  spectrum: Spectrum,
  sources: UncertaintySources = {},
): { resolved: ResolvedUncertaintySources; noisePerPoint: Float64Array<ArrayBuffer> } {
  const n = spectrum.values.length;
  const given = sources.noiseSd;
  let noisePerPoint: Float64Array<ArrayBuffer>;
  if (given === undefined) noisePerPoint = estimateNoiseSd(spectrum.values);
  else if (typeof given === "number") noisePerPoint = new Float64Array(n).fill(given);
  else {
    if (given.length !== n) {
      throw new RangeError(`Cannot use ${given.length} noise values for ${n} points`);
    }
    noisePerPoint = Float64Array.from(given);
  }
  const check = (v: number | undefined, name: string) => {
    const x = v ?? 0;
    if (!(x >= 0) || !Number.isFinite(x)) {
      throw new RangeError(`Cannot use ${name} "${v}": must be a finite number ≥ 0`);
    }
    return x;
  };
  noisePerPoint.forEach((v) => check(v, "noise σ"));
  return {
    resolved: {
      noiseSd: median(Array.from(noisePerPoint)),
      noiseSdMax: noisePerPoint.reduce((a, b) => Math.max(a, b), 0),
      noiseSource: given === undefined ? "estimated" : "given",
      ordinate: spectrum.quantity,
      offsetSd: check(sources.offsetSd, "offset σ"),
      wavelengthSdNm: check(sources.wavelengthSdNm, "wavelength σ"),
      thicknessSdMm: check(sources.thicknessSdMm, "thickness σ"),
      pathSdMm: check(sources.pathSdMm, "path σ"),
    },
    noisePerPoint,
  };
}

type Matrix3 = number[][];
type Vector3 = number[];

function fPrime(t: number): number {
  return t > (6 / 29) ** 3 ? 1 / (3 * Math.cbrt(t * t)) : 841 / 108;
}

/** ∂(L*, a*, b*)/∂(X, Y, Z) at a stimulus (CIE 15:2018 eq. 8.3–8.5 differentiated). */
export function labJacobian(xyz: Xyz, white: Xyz): Matrix3 {
  const gx = fPrime(xyz.X / white.X) / white.X;
  const gy = fPrime(xyz.Y / white.Y) / white.Y;
  const gz = fPrime(xyz.Z / white.Z) / white.Z;
  return [[0, 116 * gy, 0], [500 * gx, -500 * gy, 0], [0, 200 * gy, -200 * gz]];
}

function mulMatrix(a: readonly (readonly number[])[], b: readonly (readonly number[])[]): Matrix3 {
  const out: Matrix3 = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
  for (let i = 0; i < 3; i++) {
    for (let j = 0; j < 3; j++) {
      out[i]![j] = a[i]![0]! * b[0]![j]! + a[i]![1]! * b[1]![j]! + a[i]![2]! * b[2]![j]!;
    }
  }
  return out;
}

/** The adaptation step of a colour change, as a matrix (von Kries-type transforms are linear). */
function adaptationMatrix(from: Xyz, to: Xyz, method: AdaptationMethod): Matrix3 {
  const cols = [[1, 0, 0], [0, 1, 0], [0, 0, 1]].map(([X, Y, Z]) =>
    adaptXyz({ X: X!, Y: Y!, Z: Z! }, from, to, method)
  );
  return [0, 1, 2].map((r) => cols.map((c) => [c.X, c.Y, c.Z][r]!)) as unknown as Matrix3;
}

/** XYZ factors per point; PCHIP grids (not linear in the data) are linearised at T. */
function pointWeights(w: TristimulusWeights, t: Float64Array): Float64Array[] {
  if (w.wx && w.wy && w.wz) return [w.wx, w.wy, w.wz];
  const n = t.length;
  const out = [new Float64Array(n), new Float64Array(n), new Float64Array(n)];
  const probe = Float64Array.from(t);
  for (let k = 0; k < n; k++) {
    const h = 1e-6 * Math.max(Math.abs(t[k]!), 1e-3);
    probe[k] = t[k]! + h;
    const up = weightedXyz(probe, w);
    probe[k] = t[k]! - h;
    const down = weightedXyz(probe, w);
    probe[k] = t[k]!;
    out[0]![k] = (up.X - down.X) / (2 * h);
    out[1]![k] = (up.Y - down.Y) / (2 * h);
    out[2]![k] = (up.Z - down.Z) / (2 * h);
  }
  return out;
}

/** Sensitivity of one CIELAB colour to every input. */
export interface LabSensitivity {
  illuminant: string;
  observer: string;
  lab: Lab;
  xyz: Xyz;
  /** ∂(L*, a*, b*)/∂v_i, interleaved [L0, a0, b0, L1, …]. */
  perPoint: Float64Array<ArrayBuffer>;
  /** ∂(L*, a*, b*) per unit of each correlated source. */
  perSource: Record<SourceName, Vector3>;
}

/**
 * Sensitivity of the CIELAB colour of a path transmittance to each input.
 *
 * @param path Path transmittance and its derivatives ({@linkcode pathTransmittanceSensitivity}).
 * @param adapt When given, the colour is adapted to `adapt.white` and CIELAB taken against it
 *   (colour change after chromatic adaptation).
 */
export function labSensitivity(
  wavelengthNm: Float64Array,
  path: PathTransmittanceSensitivity,
  illuminant: string | Illuminant,
  observer: string,
  adapt?: { white: Xyz; method: AdaptationMethod },
): LabSensitivity {
  const w = tristimulusWeights(wavelengthNm, illuminant, observer);
  const t = path.transmittance;
  let xyz = weightedXyz(t, w);
  let white = w.white;
  let jac = labJacobian(xyz, white);
  if (adapt) {
    const m = adaptationMatrix(w.white, adapt.white, adapt.method);
    xyz = adaptXyz(xyz, w.white, adapt.white, adapt.method);
    white = adapt.white;
    jac = mulMatrix(labJacobian(xyz, white), m);
  }
  const [fx, fy, fz] = pointWeights(w, t) as [Float64Array, Float64Array, Float64Array];
  const n = t.length;
  const perPoint = new Float64Array(3 * n);
  const sums: Record<SourceName, Vector3> = {
    offset: [0, 0, 0],
    wavelength: [0, 0, 0],
    thickness: [0, 0, 0],
    path: [0, 0, 0],
  };
  const by: Record<SourceName, Float64Array> = {
    offset: path.perValue,
    wavelength: path.perShiftNm,
    thickness: path.perThicknessMm,
    path: path.perPathMm,
  };
  for (let i = 0; i < n; i++) {
    const wi: Vector3 = [fx[i]!, fy[i]!, fz[i]!];
    for (let r = 0; r < 3; r++) {
      const jw = jac[r]![0]! * wi[0]! + jac[r]![1]! * wi[1]! + jac[r]![2]! * wi[2]!;
      perPoint[3 * i + r] = jw * path.perValue[i]!;
      for (const k of Object.keys(by) as SourceName[]) sums[k][r]! += jw * by[k][i]!;
    }
  }
  return {
    illuminant: w.illuminant,
    observer: w.observer,
    lab: xyzToLab(xyz, white),
    xyz,
    perPoint,
    perSource: sums,
  };
}

const SOURCE_SD: Record<SourceName, keyof ResolvedUncertaintySources> = {
  offset: "offsetSd",
  wavelength: "wavelengthSdNm",
  thickness: "thicknessSdMm",
  path: "pathSdMm",
};

/**
 * Covariance between the CIELAB colours of two sensitivities of the same spectrum (the same
 * noise drives both), restricted to some sources; cov(s, s) is the covariance of one colour.
 *
 * @returns Row-major 3×3: entry [i][j] = cov(s1 component i, s2 component j).
 */
export function labCovarianceBetween(
  s1: LabSensitivity,
  s2: LabSensitivity,
  noisePerPoint: ArrayLike<number>,
  resolved: ResolvedUncertaintySources,
  only?: "noise" | SourceName,
): number[][] {
  const c = [[0, 0, 0], [0, 0, 0], [0, 0, 0]];
  if (only === undefined || only === "noise") {
    for (let i = 0; i < noisePerPoint.length; i++) {
      const v = noisePerPoint[i]! ** 2;
      if (v === 0) continue;
      for (let r = 0; r < 3; r++) {
        for (let q = 0; q < 3; q++) {
          c[r]![q]! += v * s1.perPoint[3 * i + r]! * s2.perPoint[3 * i + q]!;
        }
      }
    }
  }
  for (const k of Object.keys(SOURCE_SD) as SourceName[]) {
    if (only !== undefined && only !== k) continue;
    const v = (resolved[SOURCE_SD[k]] as number) ** 2;
    if (v === 0) continue;
    for (let r = 0; r < 3; r++) {
      for (let q = 0; q < 3; q++) c[r]![q]! += v * s1.perSource[k][r]! * s2.perSource[k][q]!;
    }
  }
  return c;
}

/**
 * Standard uncertainties of C*ab and h_ab from L*a*b* and its covariance (first order).
 *
 * @returns `hSd` in degrees, null at C* = 0.
 */
export function lchSd(lab: Lab, labCovariance: number[][]): { CSd: number; hSd: number | null } {
  const c = Math.hypot(lab.a, lab.b);
  const saa = labCovariance[1]![1]!, sbb = labCovariance[2]![2]!, sab = labCovariance[1]![2]!;
  if (c === 0) return { CSd: Math.sqrt((saa + sbb) / 2), hSd: null };
  const ca = lab.a / c, cb = lab.b / c;
  const CSd = Math.sqrt(Math.max(0, ca * ca * saa + cb * cb * sbb + 2 * ca * cb * sab));
  const ha = -lab.b / (c * c), hb = lab.a / (c * c);
  const hVar = ha * ha * saa + hb * hb * sbb + 2 * ha * hb * sab;
  return { CSd, hSd: (Math.sqrt(Math.max(0, hVar)) * 180) / Math.PI };
}

function sdOf(cov: number[][]): LabSd {
  return {
    LSd: Math.sqrt(Math.max(0, cov[0]![0]!)),
    aSd: Math.sqrt(Math.max(0, cov[1]![1]!)),
    bSd: Math.sqrt(Math.max(0, cov[2]![2]!)),
  };
}

/** Notes every result carries about what was assumed. */
export function uncertaintyNotes(
  spectrum: Spectrum,
  resolved: ResolvedUncertaintySources,
  pathMm: number | undefined,
): string[] {
  const notes: string[] = [];
  if (resolved.noiseSource === "estimated") {
    notes.push(
      "noise σ estimated from the spectrum's high-frequency residual (robust fourth differences); give noiseSd if the instrument smooths its output",
    );
  }
  const alpha = spectrum.quantity === "alpha";
  if (resolved.thicknessSdMm > 0 && (alpha ? pathMm !== undefined : pathMm === undefined)) {
    notes.push(
      alpha
        ? "α does not depend on the measured thickness: its uncertainty does not affect this colour"
        : "no path rescaling: the thickness uncertainty does not affect this colour",
    );
  }
  if (resolved.pathSdMm > 0 && pathMm === undefined) {
    notes.push("no target path given: the path uncertainty does not apply");
  }
  notes.push(
    "sources taken as independent; sample inhomogeneity and instrument geometry are not included",
  );
  return notes;
}

/**
 * First-order (GUM) uncertainty of the colour of a spectrum under each illuminant × observer.
 *
 * @returns One {@linkcode ColorUncertainty} per row, in the order of `spectrumColor`.
 * @throws {RangeError} When the rescaling needs a missing thickness, or a σ is negative.
 *
 * @example A perfect grey with 0.002 noise has a tiny a*, b* uncertainty
 * ```ts
 * import { spectrumColorUncertainty } from "./color_uncertainty.ts";
 * const nm = Float64Array.from({ length: 401 }, (_, i) => 380 + i);
 * const [u] = spectrumColorUncertainty(
 *   { wavelengthNm: nm, values: new Float64Array(401).fill(0.4), quantity: "transmittance",
 *     meta: { sample: "grey" } },
 *   { illuminants: ["D65"], sources: { noiseSd: 0.002 } },
 * );
 * if (!(u!.aSd > 0 && u!.aSd < 0.1)) throw new Error(String(u!.aSd));
 * ```
 */
export function spectrumColorUncertainty(
  spectrum: Spectrum,
  options: ColorUncertaintyOptions = {},
): ColorUncertainty[] {
  const { resolved, noisePerPoint } = resolveUncertaintySources(spectrum, options.sources);
  const path = pathTransmittanceSensitivity(spectrum, options.pathMm, options.reflection);
  const notes = uncertaintyNotes(spectrum, resolved, options.pathMm);
  const out: ColorUncertainty[] = [];
  for (const ill of options.illuminants ?? ["D65", "A"]) {
    const illuminant = typeof ill === "string" ? getIlluminant(ill) : ill;
    for (const observer of options.observers ?? ["2"]) {
      const s = labSensitivity(spectrum.wavelengthNm, path, illuminant, observer);
      const cov = labCovarianceBetween(s, s, noisePerPoint, resolved);
      const budget = Object.fromEntries(
        (["noise", "offset", "wavelength", "thickness", "path"] as const).map((k) => [
          k,
          sdOf(labCovarianceBetween(s, s, noisePerPoint, resolved, k)),
        ]),
      ) as Record<"noise" | SourceName, LabSd>;
      out.push({
        illuminant: s.illuminant,
        observer: s.observer,
        mode: "linear",
        ...sdOf(cov),
        ...lchSd(s.lab, cov),
        labCovariance: cov,
        budget,
        sources: resolved,
        notes,
      });
    }
  }
  return out;
}

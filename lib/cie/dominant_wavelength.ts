/**
 * Dominant (or complementary) wavelength and excitation purity (CIE 15:2018 §9.1): the
 * straight line from the white point through the sample's chromaticity meets the spectral
 * locus of the observer at λd; when it meets the purple line instead, the line through the
 * white the other way gives the complementary wavelength λc. pe = distance(white, sample) /
 * distance(white, boundary point), never above 1: a chromaticity beyond the 380–700 nm locus
 * (possible only for light at the ends, where the locus folds back on itself) lies on the
 * boundary to that precision and gets purity 1.
 *
 * @module
 */
import { getObserver } from "./observers.ts";
import { GRID_LENGTH, GRID_START_NM } from "./grid.ts";

/** Result of the dominant-wavelength construction. */
export interface DominantWavelength {
  /** λd in nm, or λc (complementary) when `complementary` is true. */
  wavelengthNm: number;
  complementary: boolean;
  /** Excitation purity 0 (white) … 1 (on the boundary); never above 1. */
  purity: number;
}

const loci = new Map<string, { nm: number[]; x: number[]; y: number[] }>();

/** The spectral locus (x, y) of an observer at 1 nm, 360–830 nm (computed once per observer). */
export function spectralLocus(observer: string): { nm: number[]; x: number[]; y: number[] } {
  const o = getObserver(observer);
  const hit = loci.get(o.name);
  if (hit) return hit;
  const nm: number[] = [], x: number[] = [], y: number[] = [];
  for (let i = 0; i < GRID_LENGTH; i++) {
    const s = o.x[i]! + o.y[i]! + o.z[i]!;
    if (!(s > 0)) continue;
    nm.push(GRID_START_NM + i);
    x.push(o.x[i]! / s);
    y.push(o.y[i]! / s);
  }
  const locus = { nm, x, y };
  loci.set(o.name, locus);
  return locus;
}

const visible = new Map<string, { lx: number[]; ly: number[]; ln: number[] }>();

/** The locus from 380 to 700 nm, where it does not fold back on itself. */
function visibleLocus(observer: string) {
  const hit = visible.get(observer);
  if (hit) return hit;
  const locus = spectralLocus(observer);
  const keep = locus.nm.map((nm, i) => (nm >= 380 && nm <= 700 ? i : -1)).filter((i) => i >= 0);
  const v = {
    lx: keep.map((i) => locus.x[i]!),
    ly: keep.map((i) => locus.y[i]!),
    ln: keep.map((i) => locus.nm[i]!),
  };
  visible.set(observer, v);
  return v;
}

/** Angular bins of the segment index: 0.5° each. */
const BINS = 720;
/** Angular margin (rad) around each segment, far above the 1e-12 tolerance on u. */
const MARGIN = 1e-9;
/** Per observer, the indexes built so far: [xw, yw, index] (few whites are in use at once). */
const segmentIndexes = new Map<string, { xw: number; yw: number; index: Int32Array[] }[]>();

/**
 * For each direction bin seen from the white, the locus segments whose angular extent (plus a
 * margin) overlaps it, in ascending order: a ray can only hit those, so the search looks at a
 * few segments instead of all of them and finds the same first hit. Cached per white.
 */
function segmentsByDirection(
  observer: string,
  xw: number,
  yw: number,
  lx: number[],
  ly: number[],
): Int32Array[] {
  let built = segmentIndexes.get(observer);
  if (!built) segmentIndexes.set(observer, built = []);
  for (let i = 0; i < built.length; i++) {
    const e = built[i]!;
    if (e.xw === xw && e.yw === yw) return e.index;
  }
  const lists: number[][] = Array.from({ length: BINS }, () => []);
  const binOf = (angle: number) =>
    Math.min(BINS - 1, Math.max(0, Math.floor(((angle + Math.PI) / (2 * Math.PI)) * BINS)));
  const addRange = (from: number, to: number, k: number) => {
    for (let b = binOf(from - MARGIN); b <= binOf(to + MARGIN); b++) lists[b]!.push(k);
  };
  for (let k = 0; k + 1 < lx.length; k++) {
    const a0 = Math.atan2(ly[k]! - yw, lx[k]! - xw);
    const a1 = Math.atan2(ly[k + 1]! - yw, lx[k + 1]! - xw);
    const lo = Math.min(a0, a1), hi = Math.max(a0, a1);
    if (Math.abs(hi - lo - Math.PI) < 1e-6) {
      addRange(-Math.PI, Math.PI, k); // the white lies on this segment's line: every direction
    } else if (hi - lo > Math.PI) {
      addRange(hi, Math.PI, k); // the segment crosses the ±180° cut
      addRange(-Math.PI, lo, k);
    } else {
      addRange(lo, hi, k);
    }
  }
  const index = lists.map((l) => Int32Array.from(new Set(l)).sort());
  if (built.length >= 32) built.shift();
  built.push({ xw, yw, index });
  return index;
}

/** Intersection parameter t ≥ 0 of ray p + t·d with segment a–b (u in 0..1), or undefined. */
function rayHit(
  px: number,
  py: number,
  dx: number,
  dy: number,
  ax: number,
  ay: number,
  bx: number,
  by: number,
) {
  const ex = bx - ax, ey = by - ay;
  const den = dx * ey - dy * ex;
  if (Math.abs(den) < 1e-15) return undefined;
  const t = ((ax - px) * ey - (ay - py) * ex) / den;
  const u = ((ax - px) * dy - (ay - py) * dx) / den;
  return t >= 0 && u >= -1e-12 && u <= 1 + 1e-12 ? { t, u } : undefined;
}

/**
 * Dominant or complementary wavelength of chromaticity (x, y) seen against a white (xw, yw).
 *
 * @returns undefined for a stimulus at the white point (no hue direction).
 */
export function dominantWavelength(
  x: number,
  y: number,
  xw: number,
  yw: number,
  observer = "2",
): DominantWavelength | undefined {
  const dx = x - xw, dy = y - yw;
  const dist = Math.hypot(dx, dy);
  if (dist < 1e-9) return undefined;
  // Use the locus from 380 to 700 nm: beyond it the chromaticities fold back on themselves.
  const { lx, ly, ln } = visibleLocus(observer);
  const index = segmentsByDirection(observer, xw, yw, lx, ly);
  const find = (sx: number, sy: number) => {
    // rayHit inlined: u first (one division), t only for segments the ray crosses
    let bestT = Infinity, bestNm = 0;
    const angle = Math.atan2(sy, sx);
    const bin = Math.min(
      BINS - 1,
      Math.max(0, Math.floor(((angle + Math.PI) / (2 * Math.PI)) * BINS)),
    );
    const candidates = index[bin]!;
    for (let c = 0; c < candidates.length; c++) {
      const k = candidates[c]!;
      const ax = lx[k]!, ay = ly[k]!;
      const ex = lx[k + 1]! - ax, ey = ly[k + 1]! - ay;
      const den = sx * ey - sy * ex;
      if (Math.abs(den) < 1e-15) continue;
      const u = ((ax - xw) * sy - (ay - yw) * sx) / den;
      if (!(u >= -1e-12 && u <= 1 + 1e-12)) continue;
      const t = ((ax - xw) * ey - (ay - yw) * ex) / den;
      if (t >= 0 && t < bestT) {
        bestT = t;
        bestNm = ln[k]! + u * (ln[k + 1]! - ln[k]!);
      }
    }
    return bestT < Infinity ? { t: bestT, nm: bestNm } : undefined;
  };
  const forward = find(dx, dy);
  const n = lx.length - 1;
  const purple = rayHit(xw, yw, dx, dy, lx[0]!, ly[0]!, lx[n]!, ly[n]!);
  if (forward && (!purple || forward.t <= purple.t)) {
    return { wavelengthNm: forward.nm, complementary: false, purity: Math.min(1, 1 / forward.t) };
  }
  const back = find(-dx, -dy);
  if (!back || !purple) return undefined;
  return { wavelengthNm: back.nm, complementary: true, purity: Math.min(1, 1 / purple.t) };
}

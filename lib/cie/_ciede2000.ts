/**
 * The CIEDE2000 core (Sharma, Wu & Dalal, Color Res. Appl. 30, 21 (2005), eq. 1–25), one pair
 * at a time, straight from the two {L, a, b} objects, allocation-free but for the result.
 *
 * The hue terms use exact identities instead of angles: the mean hue h̄′ points along
 * S = C′₁C′₂(u₁ + u₂) for the unit hue vectors u₁, u₂ (for |Δh′| < 180°), so cos h̄′ and sin h̄′
 * are S/|S| and cos 2h̄′ … sin 4h̄′ follow by the multiple-angle formulas; sin(Δh′/2) is
 * C′₁C′₂·sin(Δh′)/|S|, so ΔH′ = 2√(C′₁C′₂)·(a′₁b₂ − b₁a′₂)/|S|. The rotation term's hue factor
 * sin(2Δθ) is read from a table of polynomials in 1 − cos(h̄′ − 275°) (`_ciede2000_rotation.ts`),
 * which also carries the formula's zero beyond h̄′ = 360°/0°. Near the places where the formula
 * itself jumps (|Δh′| above ≈ 151°, h̄′ within 1e-6° of 0°/360°) and for neutral colours the
 * literal equations are used, so the branch taken is the published one.
 *
 * Written for the latency of one pair (dependency chain, no data-dependent branches on the
 * common path, few divisions): C̄⁷/(C̄⁷ + 25⁷) is taken as s⁷/(s⁷ + 50⁷) with s = C*₁ + C*₂ (the
 * same double), SL's division is folded into the final one, RC and √(C′₁C′₂) share one root.
 */
import * as rotation from "./_ciede2000_rotation.ts";
import type { Lab } from "./spaces.ts";

const DEG = Math.PI / 180;
const POW25_7 = 6103515625; // 25^7
const POW50_7 = 128 * POW25_7; // 50^7 = 2^7·25^7
// T (eq. 15) = 1 − 0.17cos(h̄′ − 30°) + 0.24cos 2h̄′ + 0.32cos(3h̄′ + 6°) − 0.2cos(4h̄′ − 63°),
// each cos(nh̄′ ± φ) expanded as cos nh̄′·cos φ ∓ sin nh̄′·sin φ: the products of the constants
const T1C = -0.17 * Math.cos(30 * DEG), T1S = -0.17 * Math.sin(30 * DEG);
const T3C = 0.32 * Math.cos(6 * DEG), T3S = -0.32 * Math.sin(6 * DEG);
const T4C = -0.2 * Math.cos(63 * DEG), T4S = -0.2 * Math.sin(63 * DEG);
const COS275 = Math.cos(275 * DEG), SIN275 = Math.sin(275 * DEG);
/** Below this |u₁ + u₂|² (|Δh′| above ≈ 151°) the mean hue is taken from the literal branches. */
const SUM_FLOOR2 = 0.25;
/** Within this many degrees of 0°/360°, h̄′ is taken from the literal branches (Δθ jumps there). */
const WRAP_DEG = 1e-6;
const TAN_WRAP = Math.tan(WRAP_DEG * DEG);
/** Beyond this |h̄′ − 275°| (≈ 158°) 30·exp(−((h̄′ − 275)/25)²) is below 1e-16°. */
const FAR_FROM_275 = 25 * Math.sqrt(40);
// Local copies: V8 folds a module's own constants into optimised code, imported ones less well
// (measured: about 4 % a pair).
const COEFFICIENTS = rotation.ROTATION_COEFFICIENTS, SIDE_MASK = rotation.ROTATION_SIDE_MASK;
const PIECES = rotation.ROTATION_PIECES, STRIDE = rotation.ROTATION_STRIDE;
const X0 = rotation.ROTATION_X0, HALF_PER_UNIT = rotation.ROTATION_HALF_PER_UNIT;
/** Whether the rotation table has been filled (on the first pair, not at load). */
let tableFilled = false;

/**
 * ΔE00 of lab1 → lab2 with parametric factors kL, kC, kH (Sharma et al. 2005, eq. 1–25).
 */
export function ciede2000(lab1: Lab, lab2: Lab, kL: number, kC: number, kH: number): number {
  if (!tableFilled) {
    rotation.fillRotationTable();
    tableFilled = true;
  }
  const L1 = lab1.L, a1 = lab1.a, b1 = lab1.b, L2 = lab2.L, a2 = lab2.a, b2 = lab2.b;
  const aa1 = a1 * a1, aa2 = a2 * a2, bb1 = b1 * b1, bb2 = b2 * b2;
  const s = Math.sqrt(aa1 + bb1) + Math.sqrt(aa2 + bb2);
  const s2 = s * s, s7 = (s2 * s) * (s2 * s2);
  // 1 + G = 1.5 − ½√q (eq. 4); a′ and C′² = (1 + G)²a² + b² are formed around √q so that
  // only one multiplication and one subtraction follow the root
  const q = s7 / (s7 + POW50_7), rq = Math.sqrt(q);
  const ap1 = 1.5 * a1 - 0.5 * a1 * rq, ap2 = 1.5 * a2 - 0.5 * a2 * rq;
  const g2 = 2.25 + 0.25 * q; // (1 + G)² = 2.25 + ¼q − 1.5√q
  const cp1 = Math.sqrt((g2 * aa1 + bb1) - 1.5 * aa1 * rq);
  const cp2 = Math.sqrt((g2 * aa2 + bb2) - 1.5 * aa2 * rq);
  const pp = cp1 * cp2;
  // S = C′₁C′₂(u₁ + u₂) along the mean hue
  const sx = ap1 * cp2 + ap2 * cp1, sy = b1 * cp2 + b2 * cp1;
  const sum2 = sx * sx + sy * sy;
  if (sum2 <= SUM_FLOOR2 * pp * pp || Math.abs(sy) < TAN_WRAP * sx) {
    return literalCiede2000(lab1, lab2, kL, kC, kH); // also C′₁C′₂ = 0: 0 <= 0
  }
  const r = Math.sqrt(sum2), is2 = 1 / sum2;
  const inv = r * is2; // 1/|S|
  // Rotation factor sin(2Δθ) from the table at v = 1 − cos(h̄′ − 275°) = |S/|S| − u₂₇₅|²/2.
  const ex = sx - COS275 * r, ey = sy - SIN275 * r;
  const x = (ex * ex + ey * ey) * (is2 * HALF_PER_UNIT) + X0;
  const w = (x - 0.5) - Math.floor(x);
  const piece = (x | 0) & (PIECES - 1);
  // side 1 where sin(h̄′ − 275°) > 0 (h̄′ from 275° on): 1 + sin·0.999 truncates to 0 or 1
  const side = ((1 + (sy * COS275 - sx * SIN275) * inv * 0.999) | 0) & 1;
  const k = piece * STRIDE, c = COEFFICIENTS;
  const w2 = w * w, w4 = w2 * w2, w8 = w4 * w4;
  // Estrin's scheme: the polynomial is on the critical path, so a short dependency chain
  const q0 = (c[k]! + c[k + 1]! * w) + (c[k + 2]! + c[k + 3]! * w) * w2;
  const q1 = (c[k + 4]! + c[k + 5]! * w) + (c[k + 6]! + c[k + 7]! * w) * w2;
  const q2 = (c[k + 8]! + c[k + 9]! * w) + (c[k + 10]! + c[k + 11]! * w) * w2;
  const r0 = q0 + q1 * w4, r1 = q2 + c[k + 12]! * w4; // sin(2Δθ) = r0 + r1·w⁸
  const ch = sx * inv, sh = sy * inv; // cos h̄′, sin h̄′
  const hc = 2 * (ap1 * b2 - b1 * ap2) * inv; // ΔH′/√(C′₁C′₂)
  const dLp = L2 - L1, dCp = cp2 - cp1;
  const lBar = (L1 + L2) / 2, cBarP = (cp1 + cp2) / 2;
  const l50 = (lBar - 50) * (lBar - 50);
  // SL = (r20 + 0.015(L̄′ − 50)²)/r20 with r20 = √(20 + (L̄′ − 50)²)
  const r20 = Math.sqrt(20 + l50);
  const dl = kL * (r20 + 0.015 * l50), dc = kC * (1 + 0.045 * cBarP);
  const c2h = ch * ch - sh * sh, s2h = 2 * sh * ch;
  const c3h = ch * (4 * ch * ch - 3), s3h = sh * (3 - 4 * sh * sh);
  const c4h = c2h * c2h - s2h * s2h, s4h = 2 * s2h * c2h;
  const t = 1 + (T1C * ch + T1S * sh) + 0.24 * c2h + (T3C * c3h + T3S * s3h) +
    (T4C * c4h + T4S * s4h);
  const dh = kH * (1 + 0.015 * cBarP * t);
  // ΔL′/(kL·SL), ΔC′/(kC·SC), ΔH′/(kH·SH) times dl·dc·dh: ql, qc, hq·√(C′₁C′₂)
  const ql = dLp * r20 * dc * dh, qc = dCp * dl * dh, hq = hc * dl * dc;
  const den = dl * dc * dh, scale = 1 / (den * den);
  const cb2 = cBarP * cBarP, cb7 = (cb2 * cBarP) * (cb2 * cb2);
  const rp = Math.sqrt((cb7 * pp) / (cb7 + POW25_7)); // RC·√(C′₁C′₂)/2 (eq. 21)
  // RT·(ΔC′ term)·(ΔH′ term) = −sin(2Δθ)·RC·…: everything but the table value is ready
  // before it, so it enters last, already divided by den².
  const sum = (ql * ql + qc * qc + hq * hq * pp) * scale;
  const cross = 2 * rp * qc * hq * scale * SIDE_MASK[piece + side * PIECES]!;
  return Math.sqrt((sum - r0 * cross) - r1 * (w8 * cross));
}

/** Hue angle in degrees, 0 ≤ h < 360 (0 for a = b = 0), Sharma et al. eq. 7. */
function hueDeg(a: number, b: number): number {
  if (a === 0 && b === 0) return 0;
  const h = Math.atan2(b, a) / DEG;
  return h < 0 ? h + 360 : h;
}

/**
 * The equations as printed, one angle function per angle: for neutral colours, |Δh′| near 180°
 * and h̄′ near 0°/360°, where the published branches decide.
 */
function literalCiede2000(lab1: Lab, lab2: Lab, kL: number, kC: number, kH: number): number {
  const L1 = lab1.L, a1 = lab1.a, b1 = lab1.b, L2 = lab2.L, a2 = lab2.a, b2 = lab2.b;
  const cm = (Math.sqrt(a1 * a1 + b1 * b1) + Math.sqrt(a2 * a2 + b2 * b2)) / 2, cm2 = cm * cm;
  const cm7 = cm2 * cm2 * cm2 * cm;
  const g1 = 1 + 0.5 * (1 - Math.sqrt(cm7 / (cm7 + POW25_7)));
  const ap1 = g1 * a1, ap2 = g1 * a2;
  const cp1 = Math.sqrt(ap1 * ap1 + b1 * b1), cp2 = Math.sqrt(ap2 * ap2 + b2 * b2);
  const dLp = L2 - L1, dCp = cp2 - cp1;
  const lBar = (L1 + L2) / 2, cBarP = (cp1 + cp2) / 2;
  const l50 = (lBar - 50) * (lBar - 50);
  const sL = 1 + (0.015 * l50) / Math.sqrt(20 + l50);
  const sC = 1 + 0.045 * cBarP;
  const tl = dLp / (kL * sL), tc = dCp / (kC * sC);
  const pp = cp1 * cp2;
  // With a neutral colour there is no hue difference (eq. 10, 11).
  if (pp === 0) return Math.sqrt(tl * tl + tc * tc);
  const hp1 = hueDeg(ap1, b1), hp2 = hueDeg(ap2, b2);
  let dhp = hp2 - hp1;
  if (dhp > 180) dhp -= 360;
  else if (dhp < -180) dhp += 360;
  const dHp = 2 * Math.sqrt(pp) * Math.sin((dhp / 2) * DEG);
  let hBar: number;
  if (Math.abs(hp1 - hp2) <= 180) hBar = (hp1 + hp2) / 2;
  else hBar = hp1 + hp2 < 360 ? (hp1 + hp2 + 360) / 2 : (hp1 + hp2 - 360) / 2;
  const t = 1 - 0.17 * Math.cos((hBar - 30) * DEG) + 0.24 * Math.cos(2 * hBar * DEG) +
    0.32 * Math.cos((3 * hBar + 6) * DEG) - 0.2 * Math.cos((4 * hBar - 63) * DEG);
  const th = dHp / (kH * (1 + 0.015 * cBarP * t));
  // Δθ is below 1e-16° far from 275°, where the rotation term cannot change a double.
  if (hBar - 275 < -FAR_FROM_275) return Math.sqrt(tl * tl + tc * tc + th * th);
  const z = (hBar - 275) / 25;
  const cb2 = cBarP * cBarP, cb7 = cb2 * cb2 * cb2 * cBarP;
  const rT = -Math.sin(2 * 30 * Math.exp(-(z * z)) * DEG) * 2 * Math.sqrt(cb7 / (cb7 + POW25_7));
  return Math.sqrt(tl * tl + tc * tc + th * th + rT * tc * th);
}

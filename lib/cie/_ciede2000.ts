/**
 * The CIEDE2000 core on plain numbers (Sharma, Wu & Dalal, Color Res. Appl. 30, 21 (2005),
 * eq. 1–25), allocation-free. The hue terms use exact identities instead of per-angle calls:
 * cos h′ and sin h′ are a′/C′ and b/C′; the mean hue h̄′ points along the sum of the two unit
 * hue vectors and ΔH′ = 2√(C′₁C′₂)·sin(Δh′/2) = √(C′₁C′₂)·|u₂ − u₁|; cos(2h̄′), cos(3h̄′),
 * cos(4h̄′) follow from cos h̄′ and sin h̄′ by the multiple-angle formulas. Near the two places
 * where the formula itself jumps (|Δh′| close to 180°, h̄′ close to 0°/360°) it falls back to
 * the literal equations so the branch taken is the published one. The two remaining angle
 * functions (the mean hue in degrees, sin 2Δθ) use series that are exact to double precision on
 * their reduced ranges, and the rotation term is skipped where Δθ is below 1e-17° (far from
 * h̄′ = 275°), where it cannot change a double-precision result.
 */

const DEG = Math.PI / 180;
const POW25_7 = 6103515625; // 25^7
const COS30 = Math.cos(30 * DEG), SIN30 = Math.sin(30 * DEG);
const COS6 = Math.cos(6 * DEG), SIN6 = Math.sin(6 * DEG);
const COS63 = Math.cos(63 * DEG), SIN63 = Math.sin(63 * DEG);
/** Below this |u₁ + u₂| (|Δh′| above ≈ 151°) the mean hue is taken from the literal branches. */
const SUM_FLOOR = 0.5;
/** Within this many degrees of 0°/360° h̄′ is taken from the literal branches (Δθ jumps there). */
const WRAP_DEG = 1e-6;

const TAN_PI_8 = Math.SQRT2 - 1;
/** 1/(2k+1) for the arctangent series, k = 0 … 10. */
const ATAN_TERMS = Float64Array.from({ length: 11 }, (_, k) => (k % 2 ? -1 : 1) / (2 * k + 1));
/** 1/(2k+1)! for the sine series, k = 0 … 9. */
const SIN_TERMS = Float64Array.from({ length: 10 }, (_, k) => {
  let f = 1;
  for (let i = 2; i <= 2 * k + 1; i++) f *= i;
  return (k % 2 ? -1 : 1) / f;
});
/** Beyond this |h̄′ − 275°| (≈ 156°) 30·exp(−((h̄′ − 275)/25)²) is below 1e-16°. */
const FAR_FROM_275 = 25 * Math.sqrt(40);

/**
 * arctan t for 0 ≤ t ≤ 1, radians: reduced to |t| ≤ tan(π/8) by arctan t = π/4 + arctan((t−1)/(t+1)),
 * then halved once (arctan u = 2 arctan(u / (1 + √(1 + u²)))), so |u| ≤ tan(π/16) ≈ 0.199 and
 * the Taylor series to u²¹ is exact to double precision (next term < 1e-16 relative).
 */
function atanUnit(t: number): number {
  let base = 0;
  let u = t;
  if (t > TAN_PI_8) {
    base = Math.PI / 4;
    u = (t - 1) / (t + 1);
  }
  u = u / (1 + Math.sqrt(1 + u * u));
  const u2 = u * u;
  let p = ATAN_TERMS[10]!;
  for (let k = 9; k >= 0; k--) p = p * u2 + ATAN_TERMS[k]!;
  return base + 2 * u * p;
}

/** Angle of (x, y) in degrees, 0 ≤ angle < 360, for (x, y) ≠ (0, 0). */
function angleDeg(x: number, y: number): number {
  const ax = Math.abs(x), ay = Math.abs(y);
  let r = ay <= ax ? atanUnit(ay / ax) : Math.PI / 2 - atanUnit(ax / ay);
  if (x < 0) r = Math.PI - r;
  if (y < 0) r = 2 * Math.PI - r;
  const d = r / DEG;
  return d >= 360 ? d - 360 : d;
}

/** sin x for 0 ≤ x ≤ π/3 by its Taylor series to x¹⁹ (next term < 1e-19). */
function sinSmall(x: number): number {
  const x2 = x * x;
  let p = SIN_TERMS[9]!;
  for (let k = 8; k >= 0; k--) p = p * x2 + SIN_TERMS[k]!;
  return x * p;
}

/** Hue angle in degrees, 0 ≤ h < 360 (0 for a = b = 0). */
function hueDeg(a: number, b: number): number {
  if (a === 0 && b === 0) return 0;
  const h = Math.atan2(b, a) / DEG;
  return h < 0 ? h + 360 : h;
}

/** ΔE00 of (L1, a1, b1) and (L2, a2, b2) with parametric factors kL, kC, kH. */
export function ciede2000(
  L1: number,
  a1: number,
  b1: number,
  L2: number,
  a2: number,
  b2: number,
  kL: number,
  kC: number,
  kH: number,
): number {
  const c1 = Math.sqrt(a1 * a1 + b1 * b1), c2 = Math.sqrt(a2 * a2 + b2 * b2);
  const cm = (c1 + c2) / 2, cm2 = cm * cm;
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
  // Exact fast path: with a neutral colour there is no hue difference (eq. 10, 11).
  if (cp1 * cp2 === 0) return Math.sqrt(tl * tl + tc * tc);
  const i1 = 1 / cp1, i2 = 1 / cp2;
  const u1x = ap1 * i1, u1y = b1 * i1, u2x = ap2 * i2, u2y = b2 * i2;
  const sx = u1x + u2x, sy = u1y + u2y;
  const sum2 = sx * sx + sy * sy;
  let hBar = sum2 > 0 ? angleDeg(sx, sy) : 0;
  let dHp: number, ch: number, sh: number;
  if (sum2 >= SUM_FLOOR * SUM_FLOOR && hBar > WRAP_DEG && hBar < 360 - WRAP_DEG) {
    const dx = u2x - u1x, dy = u2y - u1y;
    const cross = u1x * u2y - u1y * u2x; // sin(Δh′), the sign of Δh′ for |Δh′| < 180°
    // ΔH′ = 2√(C′₁C′₂)·sin(Δh′/2) and |u₂ − u₁| = 2|sin(Δh′/2)|
    const size = Math.sqrt((dx * dx + dy * dy) * cp1 * cp2);
    dHp = cross < 0 ? -size : size;
    const inv = 1 / Math.sqrt(sum2);
    ch = sx * inv;
    sh = sy * inv;
  } else {
    const hp1 = hueDeg(ap1, b1), hp2 = hueDeg(ap2, b2);
    let dhp = hp2 - hp1;
    if (dhp > 180) dhp -= 360;
    else if (dhp < -180) dhp += 360;
    dHp = 2 * Math.sqrt(cp1 * cp2) * Math.sin((dhp / 2) * DEG);
    if (Math.abs(hp1 - hp2) <= 180) hBar = (hp1 + hp2) / 2;
    else hBar = hp1 + hp2 < 360 ? (hp1 + hp2 + 360) / 2 : (hp1 + hp2 - 360) / 2;
    ch = Math.cos(hBar * DEG);
    sh = Math.sin(hBar * DEG);
  }
  // Exact fast path: equal hues leave only the lightness and chroma terms.
  if (dHp === 0) return Math.sqrt(tl * tl + tc * tc);
  const c2h = ch * ch - sh * sh, s2h = 2 * sh * ch;
  const c3h = ch * (4 * ch * ch - 3), s3h = sh * (3 - 4 * sh * sh);
  const c4h = c2h * c2h - s2h * s2h, s4h = 2 * s2h * c2h;
  const t = 1 - 0.17 * (ch * COS30 + sh * SIN30) + 0.24 * c2h +
    0.32 * (c3h * COS6 - s3h * SIN6) - 0.2 * (c4h * COS63 + s4h * SIN63);
  const sH = 1 + 0.015 * cBarP * t;
  const th = dHp / (kH * sH);
  const d275 = hBar - 275;
  if (d275 < -FAR_FROM_275) return Math.sqrt(tl * tl + tc * tc + th * th);
  const z = d275 / 25;
  const dTheta = 30 * Math.exp(-(z * z));
  const cb2 = cBarP * cBarP;
  const cb7 = cb2 * cb2 * cb2 * cBarP;
  const rC = 2 * Math.sqrt(cb7 / (cb7 + POW25_7));
  const rT = -sinSmall(2 * dTheta * DEG) * rC;
  return Math.sqrt(tl * tl + tc * tc + th * th + rT * tc * th);
}

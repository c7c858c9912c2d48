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
const RAD = 180 / Math.PI;
const POW25_7 = 6103515625; // 25^7
const COS30 = Math.cos(30 * DEG), SIN30 = Math.sin(30 * DEG);
const COS6 = Math.cos(6 * DEG), SIN6 = Math.sin(6 * DEG);
const COS63 = Math.cos(63 * DEG), SIN63 = Math.sin(63 * DEG);
/** Below this |u₁ + u₂| (|Δh′| above ≈ 151°) the mean hue is taken from the literal branches. */
const SUM_FLOOR = 0.5;
/** Within this many degrees of 0°/360° h̄′ is taken from the literal branches (Δθ jumps there). */
const WRAP_DEG = 1e-6;

/** arctan(k/64) for k = 0 … 64, the anchors of {@linkcode atanUnit}. */
const ATAN_ANCHORS = Float64Array.from({ length: 65 }, (_, k) => Math.atan(k / 64));
/** 1/(2k+1)! for the sine series, k = 0 … 9. */
const SIN_TERMS = Float64Array.from({ length: 10 }, (_, k) => {
  let f = 1;
  for (let i = 2; i <= 2 * k + 1; i++) f *= i;
  return (k % 2 ? -1 : 1) / f;
});
/** Beyond this |h̄′ − 275°| (≈ 156°) 30·exp(−((h̄′ − 275)/25)²) is below 1e-16°. */
const FAR_FROM_275 = 25 * Math.sqrt(40);

/**
 * arctan t for 0 ≤ t ≤ 1, radians: arctan t = arctan c + arctan r with c = k/64 the nearest
 * anchor and r = (t − c)/(1 + t·c), |r| ≤ 1/128, whose Taylor series to r¹¹ is exact to double
 * precision (next term below 1e-25).
 */
function atanUnit(t: number): number {
  const k = Math.round(t * 64);
  const c = k / 64;
  const r = (t - c) / (1 + t * c);
  const r2 = r * r, r4 = r2 * r2;
  // Estrin's grouping of 1 − r²/3 + r⁴/5 − r⁶/7 + r⁸/9 − r¹⁰/11 (shorter dependency chain)
  const p = (1 - r2 / 3) + r4 * (1 / 5 - r2 / 7) + r4 * r4 * (1 / 9 - r2 / 11);
  return ATAN_ANCHORS[k]! + r * p;
}

/** Angle of (x, y) in degrees, 0 ≤ angle < 360, for (x, y) ≠ (0, 0). */
function angleDeg(x: number, y: number): number {
  const ax = Math.abs(x), ay = Math.abs(y);
  let r = ay <= ax ? atanUnit(ay / ax) : Math.PI / 2 - atanUnit(ax / ay);
  if (x < 0) r = Math.PI - r;
  if (y < 0) r = 2 * Math.PI - r;
  const d = r * RAD;
  return d >= 360 ? d - 360 : d;
}

/** sin x for 0 ≤ x ≤ π/3 by its Taylor series to x¹⁹ (next term < 1e-19). */
function sinSmall(x: number): number {
  const x2 = x * x, x4 = x2 * x2, x8 = x4 * x4;
  const c = SIN_TERMS;
  // Estrin's grouping of the series in x² (shorter dependency chain than Horner)
  const p = (c[0]! + c[1]! * x2) + x4 * (c[2]! + c[3]! * x2) +
    x8 * ((c[4]! + c[5]! * x2) + x4 * (c[6]! + c[7]! * x2)) + x8 * x8 * (c[8]! + c[9]! * x2);
  return x * p;
}

/** Hue angle in degrees, 0 ≤ h < 360 (0 for a = b = 0). */
function hueDeg(a: number, b: number): number {
  if (a === 0 && b === 0) return 0;
  const h = Math.atan2(b, a) / DEG;
  return h < 0 ? h + 360 : h;
}

/** Below this |sin h̄′| with cos h̄′ > 0, h̄′ is within 1e-6° of 0°/360° (see WRAP_DEG). */
const SIN_WRAP = Math.sin(WRAP_DEG * DEG);
/** cos of 275° − FAR_FROM_275: for 0° < h̄′ below that angle the rotation term vanishes. */
const COS_FAR = Math.cos((275 - FAR_FROM_275) * DEG);

/**
 * ΔE00 of the pairs i = from … to − 1 at lab1[3i…3i+2] and lab2[3i…3i+2] (L*, a*, b*) with
 * parametric factors factors[0…2] = kL, kC, kH, written to out[i]. The loop is inside, and only
 * arrays and indices cross the call, so no floating-point value is boxed or allocated.
 */
export function ciede2000Run(
  lab1: Float64Array,
  lab2: Float64Array,
  factors: Float64Array,
  out: Float64Array,
  from: number,
  to: number,
): void {
  const kL = factors[0]!, kC = factors[1]!, kH = factors[2]!;
  for (let i = from; i < to; i++) {
    const j = 3 * i;
    const L1 = lab1[j]!, a1 = lab1[j + 1]!, b1 = lab1[j + 2]!;
    const L2 = lab2[j]!, a2 = lab2[j + 1]!, b2 = lab2[j + 2]!;
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
    // The three terms ΔL′/(kL·SL), ΔC′/(kC·SC), ΔH′/(kH·SH) share one division at the end.
    const dl = kL * sL, dc = kC * sC;
    const pl = dLp * dc, pc = dCp * dl; // ΔL′·dc, ΔC′·dl: the first two terms times dl·dc
    const pp = cp1 * cp2;
    // Exact fast path: with a neutral colour there is no hue difference (eq. 10, 11).
    if (pp === 0) {
      out[i] = Math.sqrt(pl * pl + pc * pc) / (dl * dc);
      continue;
    }
    // S = C′₁C′₂(u₁ + u₂) and D = C′₁C′₂(u₂ − u₁) for the unit hue vectors u₁, u₂
    const sx = ap1 * cp2 + ap2 * cp1, sy = b1 * cp2 + b2 * cp1;
    const sum2 = sx * sx + sy * sy;
    let hBar = -1; // not needed when the rotation term vanishes
    let dHp: number, ch: number, sh: number;
    let far: boolean;
    const inv = sum2 >= SUM_FLOOR * SUM_FLOOR * pp * pp ? 1 / Math.sqrt(sum2) : 0;
    ch = sx * inv;
    sh = sy * inv;
    if (inv > 0 && !(ch > 0 && Math.abs(sh) < SIN_WRAP)) {
      const dx = ap2 * cp1 - ap1 * cp2, dy = b2 * cp1 - b1 * cp2;
      const cross = ap1 * b2 - b1 * ap2; // C′₁C′₂·sin(Δh′), the sign of Δh′ for |Δh′| < 180°
      // ΔH′ = 2√(C′₁C′₂)·sin(Δh′/2) and |u₂ − u₁| = 2|sin(Δh′/2)| = |D|/(C′₁C′₂)
      const size = Math.sqrt((dx * dx + dy * dy) / pp);
      dHp = cross < 0 ? -size : size;
      far = sh > 0 && ch > COS_FAR;
      if (!far) hBar = angleDeg(sx, sy);
    } else {
      const hp1 = hueDeg(ap1, b1), hp2 = hueDeg(ap2, b2);
      let dhp = hp2 - hp1;
      if (dhp > 180) dhp -= 360;
      else if (dhp < -180) dhp += 360;
      dHp = 2 * Math.sqrt(pp) * Math.sin((dhp / 2) * DEG);
      if (Math.abs(hp1 - hp2) <= 180) hBar = (hp1 + hp2) / 2;
      else hBar = hp1 + hp2 < 360 ? (hp1 + hp2 + 360) / 2 : (hp1 + hp2 - 360) / 2;
      ch = Math.cos(hBar * DEG);
      sh = Math.sin(hBar * DEG);
      far = hBar - 275 < -FAR_FROM_275;
    }
    // Exact fast path: equal hues leave only the lightness and chroma terms.
    if (dHp === 0) {
      out[i] = Math.sqrt(pl * pl + pc * pc) / (dl * dc);
      continue;
    }
    const c2h = ch * ch - sh * sh, s2h = 2 * sh * ch;
    const c3h = ch * (4 * ch * ch - 3), s3h = sh * (3 - 4 * sh * sh);
    const c4h = c2h * c2h - s2h * s2h, s4h = 2 * s2h * c2h;
    const t = 1 - 0.17 * (ch * COS30 + sh * SIN30) + 0.24 * c2h +
      0.32 * (c3h * COS6 - s3h * SIN6) - 0.2 * (c4h * COS63 + s4h * SIN63);
    const dh = kH * (1 + 0.015 * cBarP * t);
    // all three terms times dl·dc·dh
    const ql = pl * dh, qc = pc * dh, qh = dHp * dl * dc, den = dl * dc * dh;
    if (far) {
      out[i] = Math.sqrt(ql * ql + qc * qc + qh * qh) / den;
      continue;
    }
    const z = (hBar - 275) / 25;
    const dTheta = 30 * Math.exp(-(z * z));
    const cb2 = cBarP * cBarP;
    const cb7 = cb2 * cb2 * cb2 * cBarP;
    const rC = 2 * Math.sqrt(cb7 / (cb7 + POW25_7));
    const rT = -sinSmall(2 * dTheta * DEG) * rC;
    out[i] = Math.sqrt(ql * ql + qc * qc + qh * qh + rT * qc * qh) / den;
  }
}

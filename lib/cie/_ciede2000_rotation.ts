/**
 * The hue factor of the CIEDE2000 rotation term, sin(2Δθ) with Δθ = 30°·exp(−((h̄′ − 275°)/25°)²)
 * (Sharma, Wu & Dalal, Color Res. Appl. 30, 21 (2005), eq. 17–20), as a table of polynomials in
 * v = 1 − cos(h̄′ − 275°), which the core gets from the mean hue direction without an angle.
 *
 * The factor is an even function of h̄′ − 275°, so on either side of h̄′ = 275° it is one smooth
 * function of v ∈ [0, 2]. The sides differ only in where the published formula makes it zero:
 * below 275° (side 0) it vanishes to double precision beyond 275° − 25°·√40 ≈ 116.9°, where
 * 30°·exp(−40) < 1e-16°; above 275° (side 1) it drops to zero at h̄′ = 360°, where h̄′ wraps to
 * 0° (the formula's own jump), that is at v = 1 − cos 85°. The table is built once, on first
 * use, by interpolation of the formula at the Chebyshev points of pieces 1/32 wide in v, one
 * piece boundary placed exactly at 1 − cos 85°; degree 12 makes the interpolation error below
 * 2e-17 on every piece, and the table agrees with the formula to about 2e-16 (1e-15 is tested).
 * `test/cie/delta_e_test.ts` checks the table against the formula evaluated directly.
 *
 * @module
 */

const DEG = Math.PI / 180;
/** Pieces per unit of v. */
const PER_UNIT = 32;
/** Polynomial degree on each piece. */
const DEGREE = 12;
/** Slots per piece in {@linkcode ROTATION_COEFFICIENTS} (a power of two; unused ones are 0). */
export const ROTATION_STRIDE = 16;
/** Pieces per side (a power of two, so an index can be masked into range). */
export const ROTATION_PIECES = 128;
/** v = 1 − cos 85°: h̄′ = 360° on side 1, where the rotation term jumps to zero. */
const V_WRAP = 1 - Math.cos(85 * DEG);
/** v beyond which side 0 is zero: h̄′ = 275° − 25°·√40, where Δθ < 1e-16°. */
const V_FAR = 1 - Math.cos(25 * Math.sqrt(40) * DEG);
/** Index of the first piece at or above {@linkcode V_WRAP}. */
const WRAP_PIECE = Math.ceil(V_WRAP * PER_UNIT);
/** Piece position x = v·PER_UNIT + ROTATION_X0: piece ⌊x⌋, local variable x − ⌊x⌋ − ½. */
export const ROTATION_X0 = WRAP_PIECE - V_WRAP * PER_UNIT;
/** Half of PER_UNIT: x = |S/|S| − u₂₇₅|²·ROTATION_HALF_PER_UNIT + ROTATION_X0, as 2v = |…|². */
export const ROTATION_HALF_PER_UNIT = PER_UNIT / 2;

/**
 * sin(2Δθ) at v = 1 − cos(h̄′ − 275°), continued analytically to v < 0 (the first piece reaches
 * slightly below 0, where rounding can put v).
 */
export function rotationFactor(v: number): number {
  const half = v >= 0 ? Math.asin(Math.sqrt(v / 2)) : Math.asinh(Math.sqrt(-v / 2));
  const angle2 = (v >= 0 ? 4 : -4) * half * half; // (h̄′ − 275°)² in rad²
  const z2 = angle2 / (25 * DEG) ** 2;
  return Math.sin(2 * 30 * Math.exp(-z2) * DEG);
}

/**
 * Monomial coefficients in w ∈ [−½, ½) of the degree-DEGREE interpolant of
 * {@linkcode rotationFactor} on [from, to] at the Chebyshev points, by the Björck–Pereyra
 * algorithm (Math. Comp. 24, 893 (1970)): Newton divided differences on the ordered points, then
 * the Newton form expanded, which keeps the coefficients accurate to a few units in the last place
 * (a cosine-sum Chebyshev transform in doubles was off by up to 2.5e-15 at the piece ends).
 */
function piece(from: number, to: number): Float64Array {
  const n = DEGREE + 1;
  const w = Array.from({ length: n }, (_, k) => Math.cos((Math.PI * (n - k - 0.5)) / n) / 2);
  const a = Float64Array.from(w, (wk) => rotationFactor(from + (wk + 0.5) * (to - from)));
  for (let k = 0; k < n - 1; k++) {
    for (let j = n - 1; j > k; j--) a[j] = (a[j]! - a[j - 1]!) / (w[j]! - w[j - k - 1]!);
  }
  for (let k = n - 2; k >= 0; k--) {
    for (let j = k; j < n - 1; j++) a[j] = a[j]! - w[k]! * a[j + 1]!;
  }
  return a;
}

/** Piece p (p = 0 … ROTATION_PIECES − 1) at ROTATION_STRIDE·p: coefficients of w⁰ … w¹². */
export const ROTATION_COEFFICIENTS = new Float64Array(ROTATION_PIECES * ROTATION_STRIDE);
/** 1 where the rotation term is live, 0 where the formula makes it zero: side·PIECES + piece. */
export const ROTATION_SIDE_MASK = new Float64Array(2 * ROTATION_PIECES);

/**
 * Fills {@linkcode ROTATION_COEFFICIENTS} and {@linkcode ROTATION_SIDE_MASK} (idempotent). Called
 * on the first ΔE00 rather than at load: building takes 1–3 ms, which every command that merely
 * imports the colour modules would pay at start-up.
 */
export function fillRotationTable(): void {
  for (let p = 0; p < ROTATION_PIECES; p++) {
    const from = (p - ROTATION_X0) / PER_UNIT, to = from + 1 / PER_UNIT;
    ROTATION_SIDE_MASK[p] = from < V_FAR ? 1 : 0;
    ROTATION_SIDE_MASK[ROTATION_PIECES + p] = p < WRAP_PIECE ? 1 : 0;
    if (from < V_FAR) ROTATION_COEFFICIENTS.set(piece(from, to), p * ROTATION_STRIDE);
  }
}

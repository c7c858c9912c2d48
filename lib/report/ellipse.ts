/**
 * The coverage ellipse of a bivariate normal (a*, b*) for the charts: the points x with
 * (x − μ)ᵀ Σ⁻¹ (x − μ) = k², k² = −2 ln(1 − p) (the χ² quantile with 2 degrees of freedom;
 * 5.991 for p = 0.95, JCGM 102:2011 §6.5).
 *
 * @module
 */

/** Points on the ellipse of coverage probability `p` around `centre` (closed: last = first). */
export function coverageEllipse(
  centre: [number, number],
  cov: [[number, number], [number, number]],
  p = 0.95,
  points = 48,
): [number, number][] {
  const k = Math.sqrt(-2 * Math.log(1 - p));
  const [[sxx, sxy], [, syy]] = cov;
  // eigen-decomposition of the symmetric 2×2 covariance
  const mean = (sxx + syy) / 2, diff = (sxx - syy) / 2;
  const root = Math.sqrt(diff * diff + sxy * sxy);
  const l1 = Math.max(0, mean + root), l2 = Math.max(0, mean - root);
  const angle = 0.5 * Math.atan2(2 * sxy, sxx - syy);
  const [c, s] = [Math.cos(angle), Math.sin(angle)];
  const out: [number, number][] = [];
  for (let i = 0; i <= points; i++) {
    const t = (2 * Math.PI * i) / points;
    const u = k * Math.sqrt(l1) * Math.cos(t), v = k * Math.sqrt(l2) * Math.sin(t);
    out.push([centre[0] + c * u - s * v, centre[1] + s * u + c * v]);
  }
  return out;
}

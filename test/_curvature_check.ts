/**
 * Second derivatives of a separable model's basis against central differences of its first
 * derivatives (step 1e-6 of each parameter), for tests.
 *
 * @module
 */
import type { SeparableModel } from "../lib/numeric/mod.ts";

/** For each pair (k, l): the largest |central difference − d2phi| and the largest |d2phi|. */
export function curvatureAgreement(
  model: SeparableModel,
  theta: Float64Array,
  pairs: number[][],
  n: number,
): { worst: number; scale: number }[] {
  const q = theta.length, m = model.linearCount;
  const phi = new Float64Array(m * n), d2 = new Float64Array(pairs.length * n);
  const up = new Float64Array(q * n), down = new Float64Array(q * n);
  const scratch = new Float64Array(m * n);
  model.basis(theta, phi);
  model.curvature!(theta, phi, d2);
  return pairs.map(([k, l], p) => {
    const h = 1e-6 * Math.abs(theta[l!]!);
    const tp = theta.slice(), tm = theta.slice();
    tp[l!] = tp[l!]! + h;
    tm[l!] = tm[l!]! - h;
    model.basis(tp, scratch, up);
    model.basis(tm, scratch, down);
    let worst = 0, scale = 0;
    for (let i = 0; i < n; i++) {
      const fd = (up[k! * n + i]! - down[k! * n + i]!) / (2 * h);
      worst = Math.max(worst, Math.abs(fd - d2[p * n + i]!));
      scale = Math.max(scale, Math.abs(d2[p * n + i]!));
    }
    return { worst, scale };
  });
}

/**
 * Nelder–Mead downhill simplex minimisation (Nelder & Mead, Comput. J. 7, 308 (1965)) with
 * the standard coefficients (reflection 1, expansion 2, contraction ½, shrink ½).
 *
 * @module
 */

/** Result of a minimisation. */
export interface MinimumResult {
  x: number[];
  value: number;
  evaluations: number;
}

/** Minimises f from x0 with initial step sizes `steps`. */
export function nelderMead(
  f: (x: number[]) => number,
  x0: number[],
  steps: number[],
  options: { maxEvaluations?: number; tolerance?: number } = {},
): MinimumResult {
  const { maxEvaluations = 4000, tolerance = 1e-12 } = options;
  const n = x0.length;
  let evaluations = 0;
  const call = (x: number[]) => {
    evaluations++;
    const v = f(x);
    return Number.isFinite(v) ? v : Infinity;
  };
  let simplex = [x0.slice(), ...x0.map((_, i) => x0.map((v, j) => (i === j ? v + steps[i]! : v)))];
  let values = simplex.map(call);
  while (evaluations < maxEvaluations) {
    const order = values.map((_, i) => i).sort((a, b) => values[a]! - values[b]!);
    simplex = order.map((i) => simplex[i]!);
    values = order.map((i) => values[i]!);
    if (Math.abs(values[n]! - values[0]!) <= tolerance * (Math.abs(values[0]!) + 1e-20)) break;
    const centroid = x0.map((_, j) => simplex.slice(0, n).reduce((s, p) => s + p[j]!, 0) / n);
    const worst = simplex[n]!;
    const at = (t: number) => centroid.map((c, j) => c + t * (worst[j]! - c));
    const reflected = at(-1), fr = call(reflected);
    if (fr < values[0]!) {
      const expanded = at(-2), fe = call(expanded);
      [simplex[n], values[n]] = fe < fr ? [expanded, fe] : [reflected, fr];
    } else if (fr < values[n - 1]!) {
      [simplex[n], values[n]] = [reflected, fr];
    } else {
      const contracted = fr < values[n]! ? at(-0.5) : at(0.5);
      const fc = call(contracted);
      if (fc < Math.min(fr, values[n]!)) {
        [simplex[n], values[n]] = [contracted, fc];
      } else {
        for (let i = 1; i <= n; i++) {
          simplex[i] = simplex[i]!.map((v, j) => simplex[0]![j]! + 0.5 * (v - simplex[0]![j]!));
          values[i] = call(simplex[i]!);
        }
      }
    }
  }
  const best = values.indexOf(Math.min(...values));
  return { x: simplex[best]!, value: values[best]!, evaluations };
}

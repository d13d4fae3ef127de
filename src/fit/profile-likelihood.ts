import { brentRoot } from "../numeric/brent-root.js";
import type { FitProblem } from "./fit-model.js";
import { minimise } from "./minimise.js";

/** χ²₁ quantile at 0.95: the drop 2·ΔNLL that bounds a 95% profile interval. */
export const CHI2_1_95 = 3.841458820694124;

export interface ProfileInterval {
  readonly parameter: string;
  readonly estimate: number;
  readonly lower: number | null;
  readonly upper: number | null;
  /** True where the profile never rose by χ²/2 within the parameter's range: the data do not bound it. */
  readonly lowerOpen: boolean;
  readonly upperOpen: boolean;
}

/**
 * Profile-likelihood confidence interval for one parameter:
 *   { v : 2·(min over the others of NLL(v, ·) − NLL(θ̂)) ≤ χ²₁(0.95) = 3.8415 }.
 *
 * ## Method
 * 1. The profile P(v) re-minimises the other free coordinates (Nelder–Mead + Newton polish)
 *    with v held fixed, from the previous profile point and from the optimum, keeping the best.
 * 2. From the estimate, the free coordinate of v steps outward (0.05, doubling) until P rises
 *    past NLL + χ²/2 or the coordinate leaves ±25 (the range's edge: an "open" side).
 * 3. Brent's method locates each crossing.
 * Source: Venzon, D. J. & Moolgavkar, S. H. (1988). A method for computing profile-likelihood-
 * based confidence intervals. Appl. Statist. 37: 87–94; Hilborn & Mangel (1997), ch. 7.
 */
export function profileInterval(
  problem: FitProblem,
  optimum: readonly number[],
  parameter: string,
  level = CHI2_1_95,
): ProfileInterval | null {
  const i = problem.names.indexOf(parameter);
  if (i < 0) return null;
  const best = problem.objective(optimum);
  const target = best + level / 2;
  let warm = optimum.filter((_, k) => k !== i);
  const others = optimum.filter((_, k) => k !== i);
  const profile = (xi: number): number => {
    const g = (z: readonly number[]) => problem.objective([...z.slice(0, i), xi, ...z.slice(i)]);
    // Two starts — the previous profile point and the overall optimum — guard against a
    // local minimum, which would raise the profile and narrow the interval.
    const a = minimise(g, warm);
    const b = minimise(g, others);
    const r = a.value <= b.value ? a : b;
    if (Number.isFinite(r.value)) warm = r.x;
    return r.value;
  };
  // (For the Allee threshold the free coordinate is A/K; its interval is reported on that scale.)
  const natural = (xi: number) => problem.transforms[i]!.fromFree(xi);
  const side = (dir: 1 | -1): { value: number | null; open: boolean } => {
    warm = optimum.filter((_, k) => k !== i);
    const x0 = optimum[i]!;
    let inside = x0;
    let d = 0.05;
    for (let k = 0; k < 40; k++) {
      const x = x0 + dir * d;
      if (Math.abs(x) > 25) return { value: null, open: true };
      const p = profile(x);
      if (p > target) {
        const root = brentRoot((xx) => profile(xx) - target, inside, x, 1e-8);
        // Should re-minimisation make the bracket inconsistent, report the outer point
        // (a conservative, wider interval).
        return { value: natural(Number.isFinite(root) ? root : x), open: false };
      }
      inside = x;
      d *= 2;
    }
    return { value: null, open: true };
  };
  const lo = side(-1);
  const hi = side(1);
  const est = natural(optimum[i]!);
  // A logistic or log transform is increasing, so the free-coordinate sides map to lower/upper.
  return {
    parameter,
    estimate: est,
    lower: lo.value,
    upper: hi.value,
    lowerOpen: lo.open,
    upperOpen: hi.open,
  };
}

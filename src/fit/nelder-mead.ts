/** Outcome of a local minimisation. */
export interface Minimum {
  readonly x: number[];
  readonly value: number;
  readonly iterations: number;
  readonly converged: boolean;
}

/**
 * Nelder–Mead downhill simplex minimiser of f: ℝⁿ → ℝ.
 *
 * ## Method
 * Standard coefficients (reflection 1, expansion 2, contraction ½, shrink ½); the initial
 * simplex steps each coordinate by `step[i]` (default 10% of |x0[i]|, or 0.1 at 0). Stops when
 * the spread of values across the simplex is below tol·(|f_best| + tol) and the simplex is
 * smaller than xtol in every coordinate, or after maxIter iterations. Non-finite values are
 * treated as +∞, so the simplex retreats from regions where f is undefined.
 * Source: Nelder, J. A. & Mead, R. (1965). A simplex method for function minimization.
 * Computer Journal 7: 308–313; coefficients and stopping as in Lagarias, J. C. et al. (1998).
 * SIAM J. Optim. 9: 112–147.
 */
export function nelderMead(
  f: (x: readonly number[]) => number,
  x0: readonly number[],
  options: { step?: readonly number[]; maxIter?: number; tol?: number; xtol?: number } = {},
): Minimum {
  const n = x0.length;
  const maxIter = options.maxIter ?? 400 * n;
  const tol = options.tol ?? 1e-12;
  const xtol = options.xtol ?? 1e-10;
  const safe = (x: readonly number[]) => {
    const v = f(x);
    return Number.isFinite(v) ? v : Infinity;
  };
  const pts: number[][] = [Array.from(x0)];
  for (let i = 0; i < n; i++) {
    const p = Array.from(x0);
    p[i]! += options.step?.[i] ?? (p[i] !== 0 ? 0.1 * Math.abs(p[i]!) : 0.1);
    pts.push(p);
  }
  let vals = pts.map(safe);
  let it = 0;
  let converged = false;
  for (; it < maxIter; it++) {
    const order = vals.map((_, i) => i).sort((a, b) => vals[a]! - vals[b]!);
    const sortedPts = order.map((i) => pts[i]!);
    vals = order.map((i) => vals[i]!);
    for (let i = 0; i <= n; i++) pts[i] = sortedPts[i]!;
    const best = vals[0]!;
    const worst = vals[n]!;
    let size = 0;
    for (let i = 1; i <= n; i++)
      for (let j = 0; j < n; j++)
        size = Math.max(size, Math.abs(pts[i]![j]! - pts[0]![j]!) / Math.max(1, Math.abs(pts[0]![j]!)));
    if (Math.abs(worst - best) <= tol * (Math.abs(best) + tol) && size <= xtol) {
      converged = true;
      break;
    }
    const centroid = new Array<number>(n).fill(0);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) centroid[j]! += pts[i]![j]! / n;
    const along = (t: number) => centroid.map((c, j) => c + t * (pts[n]![j]! - c));
    const xr = along(-1);
    const fr = safe(xr);
    if (fr < vals[0]!) {
      const xe = along(-2);
      const fe = safe(xe);
      if (fe < fr) {
        pts[n] = xe;
        vals[n] = fe;
      } else {
        pts[n] = xr;
        vals[n] = fr;
      }
    } else if (fr < vals[n - 1]!) {
      pts[n] = xr;
      vals[n] = fr;
    } else {
      const outside = fr < vals[n]!;
      const xc = along(outside ? -0.5 : 0.5);
      const fc = safe(xc);
      if (fc < (outside ? fr : vals[n]!)) {
        pts[n] = xc;
        vals[n] = fc;
      } else {
        for (let i = 1; i <= n; i++) {
          pts[i] = pts[i]!.map((v, j) => pts[0]![j]! + 0.5 * (v - pts[0]![j]!));
          vals[i] = safe(pts[i]!);
        }
      }
    }
  }
  let bi = 0;
  for (let i = 1; i <= n; i++) if (vals[i]! < vals[bi]!) bi = i;
  return { x: pts[bi]!, value: vals[bi]!, iterations: it, converged };
}

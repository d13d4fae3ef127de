/**
 * Central finite-difference gradient and Hessian of f at x.
 *
 *   ∂f/∂x_i ≈ (f(x + h_i e_i) − f(x − h_i e_i)) / (2 h_i)
 *   ∂²f/∂x_i∂x_j ≈ (f(++) − f(+−) − f(−+) + f(−−)) / (4 h_i h_j),   diagonal from f(x ± 2h_i e_i)
 *
 * with h_i = step·|x_i| (step itself when x_i = 0), so parameters of any scale get a
 * relative step. step defaults to EPS^(1/3) ≈ 6e-6 for the gradient (its
 * optimal order) and EPS^(1/4) ≈ 1.2e-4 for the Hessian.
 * Source: Nocedal, J. & Wright, S. J. (2006). Numerical Optimization, 2nd ed. Springer, §8.1.
 */
export function gradient(
  f: (x: readonly number[]) => number,
  x: readonly number[],
  step = 6e-6,
  curvature?: readonly (readonly number[])[],
): number[] {
  const g: number[] = [];
  const f0 = curvature ? Math.abs(f(x)) + 1 : 0;
  for (let i = 0; i < x.length; i++) {
    let h = step * (x[i] !== 0 ? Math.abs(x[i]!) : 1);
    // With a known curvature c, a step of (3e-16·|f|/c)^(1/3)·… balances rounding against
    // truncation; here h = (1e-10·|f|/c)^(1/2) caps the change of f along the step.
    const c = curvature ? Math.abs(curvature[i]![i]!) : 0;
    if (c > 0 && Number.isFinite(c)) h = Math.min(h, Math.max(Math.sqrt((1e-10 * f0) / c), 1e-4 * h));
    const p = Array.from(x);
    const m = Array.from(x);
    p[i]! += h;
    m[i]! -= h;
    g.push((f(p) - f(m)) / (2 * h));
  }
  return g;
}

export function hessian(
  f: (x: readonly number[]) => number,
  x: readonly number[],
  step = 1.2e-4,
): number[][] {
  const base = x.map((v) => step * (v !== 0 ? Math.abs(v) : 1));
  const first = hessianWithSteps(f, x, base, true);
  // Second pass with steps scaled to each direction's curvature, so that f changes by about
  // 1e-7·(|f| + 1) per step: a large curvature with a fixed step would let the truncation error
  // of the difference formulas swamp the cross terms of strongly correlated parameters.
  const f0 = Math.abs(f(x)) + 1;
  const tuned = base.map((h, i) => {
    const c = Math.abs(first[i]![i]!);
    if (!(c > 0) || !Number.isFinite(c)) return h;
    return Math.min(h, Math.max(Math.sqrt((1e-7 * f0) / c), 1e-3 * h));
  });
  return hessianWithSteps(f, x, tuned);
}

function hessianWithSteps(
  f: (x: readonly number[]) => number,
  x: readonly number[],
  hs: readonly number[],
  diagonalOnly = false,
): number[][] {
  const n = x.length;
  const at = (di: number, si: number, dj: number, sj: number) => {
    const p = Array.from(x);
    p[di]! += si * hs[di]!;
    p[dj]! += sj * hs[dj]!;
    return f(p);
  };
  const f0 = f(x);
  const H: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    H[i]![i] =
      (-at(i, 2, i, 0) + 16 * at(i, 1, i, 0) - 30 * f0 + 16 * at(i, -1, i, 0) - at(i, -2, i, 0)) /
      (12 * hs[i]! * hs[i]!);
    for (let j = 0; j < i && !diagonalOnly; j++) {
      const v =
        (at(i, 1, j, 1) - at(i, 1, j, -1) - at(i, -1, j, 1) + at(i, -1, j, -1)) / (4 * hs[i]! * hs[j]!);
      H[i]![j] = v;
      H[j]![i] = v;
    }
  }
  return H;
}

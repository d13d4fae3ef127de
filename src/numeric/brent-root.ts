/**
 * Root of a continuous function in a bracket [a, b] with f(a)·f(b) ≤ 0, by Brent's method.
 *
 * ## Method
 * Inverse quadratic interpolation or the secant step when it stays inside the bracket and
 * shrinks it fast enough, bisection otherwise; stops when the bracket is below
 * 2·EPS·|x| + tol/2 or f(x) = 0. Never leaves the bracket, so it cannot diverge.
 * Source: Brent, R. P. (1973). Algorithms for Minimization without Derivatives.
 * Prentice-Hall, ch. 4 (the procedure `zero`).
 *
 * ## Special Cases
 * - f(a) = 0 or f(b) = 0: returns that end.
 * - f(a)·f(b) > 0: returns NaN (no bracket; callers check before calling).
 */
export function brentRoot(f: (x: number) => number, a: number, b: number, tol = 0, maxIter = 200): number {
  let fa = f(a);
  let fb = f(b);
  if (fa === 0) return a;
  if (fb === 0) return b;
  if (fa * fb > 0) return Number.NaN;
  let c = a;
  let fc = fa;
  let d = b - a;
  let e = d;
  for (let i = 0; i < maxIter; i++) {
    if (fb * fc > 0) {
      c = a;
      fc = fa;
      d = b - a;
      e = d;
    }
    if (Math.abs(fc) < Math.abs(fb)) {
      a = b;
      b = c;
      c = a;
      fa = fb;
      fb = fc;
      fc = fa;
    }
    const tol1 = 2 * Number.EPSILON * Math.abs(b) + 0.5 * tol;
    const m = 0.5 * (c - b);
    if (Math.abs(m) <= tol1 || fb === 0) return b;
    if (Math.abs(e) >= tol1 && Math.abs(fa) > Math.abs(fb)) {
      let p: number;
      let q: number;
      const s = fb / fa;
      if (a === c) {
        p = 2 * m * s;
        q = 1 - s;
      } else {
        const qq = fa / fc;
        const r = fb / fc;
        p = s * (2 * m * qq * (qq - r) - (b - a) * (r - 1));
        q = (qq - 1) * (r - 1) * (s - 1);
      }
      if (p > 0) q = -q;
      else p = -p;
      if (2 * p < Math.min(3 * m * q - Math.abs(tol1 * q), Math.abs(e * q))) {
        e = d;
        d = p / q;
      } else {
        d = m;
        e = m;
      }
    } else {
      d = m;
      e = m;
    }
    a = b;
    fa = fb;
    b += Math.abs(d) > tol1 ? d : m > 0 ? tol1 : -tol1;
    fb = f(b);
  }
  return b;
}

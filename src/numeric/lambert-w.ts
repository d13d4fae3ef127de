/**
 * Principal branch W0 of the Lambert W function: the w ≥ −1 with w·e^w = x, for x ≥ −1/e.
 *
 * ## Method
 * 1. Start from log1p(x) for x ≥ 0 (a standard initial guess), or from the branch-point
 *    series w ≈ −1 + p − p²/3, p = √(2(e·x + 1)), near x = −1/e.
 * 2. Halley's iteration w ← w − f/(e^w(w + 1) − (w + 2)f/(2w + 2)), f = w·e^w − x, until
 *    the step is below 4·EPS relative (cubic convergence: a handful of steps).
 *
 * Source: Corless, R. M., Gonnet, G. H., Hare, D. E. G., Jeffrey, D. J. & Knuth, D. E.
 * (1996). On the Lambert W function. Adv. Comput. Math. 5: 329–359 (eqs. 4.6 and 5.9).
 *
 * ## Special Cases
 * - x < −1/e, NaN: returns NaN (outside the real domain).
 * - x = 0: returns 0.
 * @example lambertW0(Math.E) // => 1
 */
export function lambertW0(x: number): number {
  if (!(x >= -1 / Math.E)) return Number.NaN;
  if (x === 0) return 0;
  if (x === Infinity) return Infinity;
  let w: number;
  if (x < -0.3) {
    const p = Math.sqrt(2 * (Math.E * x + 1));
    w = -1 + p - (p * p) / 3;
  } else {
    w = Math.log1p(x);
    if (x > 3) w -= Math.log(w);
  }
  for (let i = 0; i < 64; i++) {
    const ew = Math.exp(w);
    const f = w * ew - x;
    if (w === -1) break;
    const step = f / (ew * (w + 1) - ((w + 2) * f) / (2 * w + 2));
    w -= step;
    if (Math.abs(step) <= 4 * Number.EPSILON * (1 + Math.abs(w))) break;
  }
  return w;
}

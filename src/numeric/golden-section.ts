/**
 * Maximiser of a unimodal function on [lo, hi] by a grid scan then golden-section search.
 *
 * ## Method
 * 1. Evaluate f on `grid + 1` evenly spaced points and keep the best one's neighbours as
 *    the bracket (guards against a wrong bracket when f is flat or has a shoulder).
 * 2. Golden-section search in that bracket until it is below 1e-13 of its start width.
 * The argmax is accurate to about √EPS relative (f is flat at a maximum); the maximum
 * value to about EPS relative.
 * Source: Kiefer, J. (1953). Sequential minimax search for a maximum. Proc. Amer. Math.
 * Soc. 4: 502–506.
 */
export function maximiseOnInterval(
  f: (x: number) => number,
  lo: number,
  hi: number,
  grid = 256,
): { x: number; value: number } {
  let best = lo;
  let bestValue = -Infinity;
  const h = (hi - lo) / grid;
  for (let i = 0; i <= grid; i++) {
    const x = lo + i * h;
    const v = f(x);
    if (v > bestValue) {
      bestValue = v;
      best = x;
    }
  }
  let a = Math.max(lo, best - h);
  let b = Math.min(hi, best + h);
  const phi = (Math.sqrt(5) - 1) / 2;
  let c = b - phi * (b - a);
  let d = a + phi * (b - a);
  let fc = f(c);
  let fd = f(d);
  const stop = (b - a) * 1e-13;
  for (let i = 0; i < 200 && b - a > stop; i++) {
    if (fc > fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - phi * (b - a);
      fc = f(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + phi * (b - a);
      fd = f(d);
    }
  }
  const x = (a + b) / 2;
  const v = f(x);
  return v >= bestValue ? { x, value: v } : { x: best, value: bestValue };
}

import type { ClosedLoop } from "../policy/closed-loop.js";

/**
 * Largest Lyapunov exponent of the closed loop along an orbit, per year.
 *
 *   λ = (1/n) · Σ ln(‖δx[t+1]‖ / ‖δx[t]‖)
 *
 * ## Method (Benettin's two-trajectory algorithm)
 * 1. A companion orbit starts at x + δ, ‖δ‖ = 1e-8·scale, along the first coordinate.
 * 2. Both orbits step once; the separation's growth is logged and the companion is put back
 *    at distance ‖δ‖ along the new separation (renormalisation), so the estimate follows the
 *    tangent dynamics without overflowing.
 * 3. After n steps λ is the mean log growth. λ > 0: nearby orbits separate exponentially
 *    (irregular, chaotic dynamics); λ < 0: they converge (an equilibrium or a cycle).
 * If the companion collapses onto the orbit (both extinct), the growth is logged as
 * ln(1e-16) per step, a strongly negative exponent.
 * Source: Benettin, G., Galgani, L., Giorgilli, A. & Strelcyn, J.-M. (1980). Lyapunov
 * characteristic exponents for smooth dynamical systems and for Hamiltonian systems.
 * Meccanica 15: 9–20.
 * `x` is advanced in place by n steps.
 */
export function lyapunovExponent(loop: ClosedLoop, x: Float64Array, steps: number, scale: number): number {
  const d = x.length;
  const eps = 1e-8 * scale;
  if (d === 1 && loop.layout.dimension === 1) return scalarLyapunov(loop, x, steps, eps);
  const y = Float64Array.from(x);
  y[0]! += eps;
  let sum = 0;
  for (let t = 0; t < steps; t++) {
    loop.step(x, x);
    loop.step(y, y);
    let dist2 = 0;
    for (let i = 0; i < d; i++) {
      const diff = y[i]! - x[i]!;
      dist2 += diff * diff;
    }
    const dist = Math.sqrt(dist2);
    if (!(dist > 0) || !Number.isFinite(dist)) {
      sum += Math.log(1e-16);
      for (let i = 0; i < d; i++) y[i] = x[i]!;
      y[0]! += eps;
      continue;
    }
    sum += Math.log(dist / eps);
    const s = eps / dist;
    for (let i = 0; i < d; i++) y[i] = x[i]! + (y[i]! - x[i]!) * s;
  }
  return sum / steps;
}

/** The same algorithm for a one-number state through loop.next() (identical arithmetic). */
function scalarLyapunov(loop: ClosedLoop, x: Float64Array, steps: number, eps: number): number {
  let a = x[0]!;
  let b = a + eps;
  let sum = 0;
  for (let t = 0; t < steps; t++) {
    a = loop.next(a);
    b = loop.next(b);
    const diff = b - a;
    const dist = Math.sqrt(diff * diff);
    if (!(dist > 0) || !Number.isFinite(dist)) {
      sum += Math.log(1e-16);
      b = a + eps;
      continue;
    }
    sum += Math.log(dist / eps);
    b = a + (b - a) * (eps / dist);
  }
  x[0] = a;
  return sum / steps;
}

import type { ClosedLoop } from "../policy/closed-loop.js";

/**
 * The closed loop's state when abundance has stood at N in every year the lags reach:
 * all past abundances N, past spawners N − C(N) (harvest before reproduction), last year's
 * quota H(N). An equilibrium of the scalar equation below is a fixed point x* = G(x*).
 */
export function steadyState(loop: ClosedLoop, n: number, out = new Float64Array(loop.layout.dimension)): Float64Array {
  const { nHistory, bStart, bHistory, quotaIndex } = loop.layout;
  const quota = loop.rule.harvest.quota(n);
  const spawners = n - Math.min(quota, n);
  out[0] = n;
  for (let k = 1; k <= nHistory; k++) out[k] = n;
  for (let k = 0; k < bHistory; k++) out[bStart + k] = spawners;
  if (quotaIndex >= 0) out[quotaIndex] = quota;
  return out;
}

/**
 * The equilibrium residual φ(N) = G(x*(N))[0] − N: next year's abundance minus this year's
 * when the stock has stood at N. Its zeros are the equilibria of the closed loop.
 */
export function equilibriumResidual(loop: ClosedLoop): (n: number) => number {
  const x = new Float64Array(loop.layout.dimension);
  const y = new Float64Array(loop.layout.dimension);
  return (n: number) => {
    steadyState(loop, n, x);
    loop.step(x, y);
    return y[0]! - n;
  };
}

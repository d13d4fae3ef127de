import { closedLoop, type ClosedLoop } from "../policy/closed-loop.js";

/**
 * The closed loop's state when abundance has stood at N in every year the lags reach:
 * all past abundances N, past spawners N − C(N) (harvest before reproduction), last year's
 * quota H(N). An equilibrium of the scalar equation below is a fixed point x* = G(x*).
 */
export function steadyState(
  loop: ClosedLoop,
  n: number,
  out = new Float64Array(loop.layout.dimension),
): Float64Array {
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
 *
 * At a steady state every past abundance, spawner count and quota equals today's, so the
 * survey lag, the delay T and the quota-change limits drop out: φ(N) is the one-number
 * loop's next(N) − N with T = 0, L = 0 and no caps, the same arithmetic as step() on x*(N)
 * (a test checks the two agree to the last bit), without building the state vector.
 */
export function equilibriumResidual(loop: ClosedLoop): (n: number) => number {
  const scalar = loop.layout.dimension === 1 ? loop : steadyLoop(loop);
  return (n: number) => scalar.next(n) - n;
}

/** The loop with delay 0, survey lag 0 and no quota caps: the same steady states. */
function steadyLoop(loop: ClosedLoop): ClosedLoop {
  const { quotaChange: _q, ...rule } = loop.rule;
  return closedLoop({ ...loop.model, delay: 0 }, { ...rule, surveyLag: 0 });
}

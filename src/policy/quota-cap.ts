/**
 * Caps on the year-to-year change of the quota (a "TAC change limit").
 *
 *   Q[t] = clamp(H(y), Q[t−1]·(1 − d), Q[t−1]·(1 + u))     when Q[t−1] > 0
 *   Q[t] = H(y)                                            when Q[t−1] = 0
 *
 * A quota that was zero is not capped: otherwise a closed fishery could never reopen
 * (common practice, no source).
 */
export function capQuota(
  proposed: number,
  previous: number,
  maxIncrease: number,
  maxDecrease: number,
): number {
  if (!(previous > 0)) return proposed;
  const lo = previous * (1 - maxDecrease);
  const hi = previous * (1 + maxIncrease);
  return proposed < lo ? lo : proposed > hi ? hi : proposed;
}

import type { Model } from "../models/model-spec.js";
import type { Timing } from "../policy/rule-spec.js";

/**
 * Deterministic projection through recorded catches and releases (the "observation-error"
 * model of a stock assessment): the closed loop of closed-loop.ts with the rule replaced by
 * the catch C[t] actually recorded.
 *
 *   after:  N[t+1] = P[t] − min(C[t], P[t]) + A[t],   P[t] = N[t]·g(N[t−T])
 *   before: N[t+1] = B[t]·g(B[t−T]) + A[t],           B[t] = N[t] − min(C[t], N[t])
 *
 * `shortfall` sums the recorded catch the modelled stock could not supply: a model that
 * cannot have produced the recorded catches is penalised by the fit. History before the first
 * year is N0 (no catch). Stops (returning null) if the stock leaves 1e6·K or goes non-finite.
 * Source: Polacheck, Hilborn & Punt (1993), Can. J. Fish. Aquat. Sci. 50: 2597–2607 (from memory).
 */
export function projectThroughCatches(
  model: Model,
  timing: Timing,
  n0: number,
  catches: readonly number[],
  stocking: readonly number[],
  buffers?: { abundance: number[]; base: number[] },
): { abundance: number[]; shortfall: number } | null {
  const { growth, params, delay: T } = model;
  const years = catches.length;
  // Callers that project thousands of times (a fit's objective) pass reusable buffers.
  const abundance = buffers?.abundance ?? new Array<number>(years);
  const base = buffers?.base ?? new Array<number>(years); // the stock that reproduces each year
  const bound = 1e6 * params.K!;
  let n = n0;
  let shortfall = 0;
  for (let t = 0; t < years; t++) {
    abundance[t] = n;
    const c = catches[t]!;
    let next: number;
    if (timing === "before") {
      const taken = c < n ? c : n;
      shortfall += c - taken;
      const b = n - taken;
      base[t] = b;
      const dens = T === 0 ? b : t - T >= 0 ? base[t - T]! : n0;
      const p = b > 0 ? b * growth.factor(dens, params) : 0;
      next = (p < 0 ? 0 : p) + stocking[t]!;
    } else {
      base[t] = n;
      const dens = T === 0 ? n : t - T >= 0 ? base[t - T]! : n0;
      let p = n > 0 ? n * growth.factor(dens, params) : 0;
      if (p < 0) p = 0;
      const taken = c < p ? c : p;
      shortfall += c - taken;
      next = p - taken + stocking[t]!;
    }
    if (!(next <= bound)) return null;
    n = next;
  }
  return { abundance, shortfall };
}

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
  const { params, delay: T } = model;
  const years = catches.length;
  // Callers that project thousands of times (a fit's objective) pass reusable buffers.
  const abundance = buffers?.abundance ?? new Array<number>(years);
  const base = buffers?.base ?? new Array<number>(years); // the stock that reproduces each year
  const bound = 1e6 * params.K!;
  let n = n0;
  let shortfall = 0;
  const year: YearWithCatch = { next: 0, base: 0, shortfall: 0 };
  for (let t = 0; t < years; t++) {
    abundance[t] = n;
    const past = T === 0 ? null : t - T >= 0 ? base[t - T]! : n0;
    yearWithCatch(model, timing, n, past, catches[t]!, stocking[t]!, year);
    base[t] = year.base;
    shortfall += year.shortfall;
    if (!(year.next <= bound)) return null;
    n = year.next;
  }
  return { abundance, shortfall };
}

/** One year with a recorded catch: next abundance, the stock that reproduced, the catch it could not supply. */
export interface YearWithCatch {
  next: number;
  base: number;
  shortfall: number;
}

/**
 * One year of the closed loop with the recorded catch C and release A in place of a rule:
 *   after:  P = N·g(M),  N' = P − min(C, P) + A,       base = N
 *   before: B = N − min(C, N),  N' = B·g(M) + A,       base = B
 * M is this year's base when `pastBase` is null (no delay), else `pastBase` (the base T years
 * back). A negative growth step is set to zero, as in closed-loop.ts. Writes into `out`.
 */
export function yearWithCatch(
  model: Model,
  timing: Timing,
  n: number,
  pastBase: number | null,
  c: number,
  a: number,
  out: YearWithCatch,
): YearWithCatch {
  const { growth, params } = model;
  if (timing === "before") {
    const taken = c < n ? c : n;
    const b = n - taken;
    const p = b > 0 ? b * growth.factor(pastBase ?? b, params) : 0;
    out.next = (p < 0 ? 0 : p) + a;
    out.base = b;
    out.shortfall = c - taken;
  } else {
    let p = n > 0 ? n * growth.factor(pastBase ?? n, params) : 0;
    if (p < 0) p = 0;
    const taken = c < p ? c : p;
    out.next = p - taken + a;
    out.base = n;
    out.shortfall = c - taken;
  }
  return out;
}

import { carryingCapacity, growthRate, MAX_ABUNDANCE, param } from "../params.js";
import type { GrowthFamily } from "./growth-family.js";

export interface AlleeRickerParams {
  readonly r: number;
  readonly K: number;
  readonly A: number;
  readonly [k: string]: number;
}

/**
 * Ricker map with a strong Allee effect.
 *
 *   N[t+1] = N[t] · exp(r · (1 − N[t−T] / K) · (N[t−T] / A − 1)),   0 < A < K
 *
 * Per-capita growth is negative below the Allee threshold A, so a stock pushed below A
 * collapses to zero without any harvest. Equilibria 0 (stable, g(0) = e^(−r)), A (unstable)
 * and K with f'(K) = 1 − r·(K/A − 1). The cubic per-capita rate r(1 − N/K)(N/A − 1) is the
 * standard strong-Allee form; here it sits in the exponent (Ricker form) so abundance stays
 * positive. No closed-form MSY: found numerically.
 * Sources: Lewis, M. A. & Kareiva, P. (1993). Allee dynamics and the spread of invading
 * organisms. Theor. Popul. Biol. 43: 141–158; Courchamp, F., Berec, L. & Gascoigne, J.
 * (2008). Allee Effects in Ecology and Conservation. Oxford University Press.
 */
export const alleeRicker: GrowthFamily<AlleeRickerParams> = {
  id: "allee-ricker",
  label: "Ricker with strong Allee effect",
  equation: "N[t+1] = N[t]·exp(r·(1 − N[t−T]/K)·(N[t−T]/A − 1))",
  source: "Lewis & Kareiva (1993). Theor. Popul. Biol. 43: 141–158; Courchamp et al. (2008)",
  params: [
    growthRate("strength of per-capita growth", 10, 0.5),
    carryingCapacity,
    param({
      name: "A",
      label: "Allee threshold A",
      unitKind: "abundance",
      description: "below it the stock declines",
      range: { min: 0, max: MAX_ABUNDANCE },
      default: 200,
      defaultTimesK: 0.2,
      sweep: [0, 0.9],
    }),
  ],
  constraints: [{ lower: "A", upper: "K", field: "A" }],
  factor: (m, { r, K, A }) => Math.exp(r * (1 - m / K) * (m / A - 1)),
  logFactor: (m, { r, K, A }) => r * (1 - m / K) * (m / A - 1),
  factorSlope: (m, { r, K, A }) => {
    const g = Math.exp(r * (1 - m / K) * (m / A - 1));
    return g * r * ((1 - m / K) / A - (m / A - 1) / K);
  },
  equilibria: ({ K, A }) => [0, A, K],
};

import { carryingCapacity, maxReproduction } from "../params.js";
import type { GrowthFamily } from "./growth-family.js";

export interface BevertonHoltParams {
  readonly R0: number;
  readonly K: number;
  readonly [k: string]: number;
}

/**
 * Beverton–Holt map.
 *
 *   N[t+1] = R0 · N[t] / (1 + (R0 − 1) · N[t−T] / K)
 *
 * Undelayed, it has the closed-form solution N[t] = K·N0 / (N0 + (K − N0)·R0^(−t)) and
 * f'(K) = 1/R0, so K is always stable (monotone approach). The surplus peaks at
 * S = K/(√R0 + 1) with MSY = K·(√R0 − 1)/(√R0 + 1).
 * Source: Beverton, R. J. H. & Holt, S. J. (1957). On the Dynamics of Exploited Fish
 * Populations. Fishery Investigations Ser. II, 19. HMSO, London.
 * @example bevertonHolt.factor(100, { R0: 2, K: 100 }) // => 1
 */
export const bevertonHolt: GrowthFamily<BevertonHoltParams> = {
  id: "beverton-holt",
  label: "Beverton–Holt",
  equation: "N[t+1] = R0·N[t] / (1 + (R0 − 1)·N[t−T]/K)",
  source: "Beverton, R. J. H. & Holt, S. J. (1957). Fishery Investigations Ser. II, 19",
  params: [maxReproduction, carryingCapacity],
  constraints: [],
  factor: (m, { R0, K }) => R0 / (1 + ((R0 - 1) * m) / K),
  factorSlope: (m, { R0, K }) => {
    const d = 1 + ((R0 - 1) * m) / K;
    return (-R0 * (R0 - 1)) / (K * d * d);
  },
  equilibria: ({ K }) => [0, K],
  surplusPeak: ({ R0, K }) => {
    const q = Math.sqrt(R0);
    return {
      escapement: K / (q + 1),
      msy: (K * (q - 1)) / (q + 1),
      source: "derived from Beverton & Holt (1957): f'(S) = 1 at 1 + (R0 − 1)S/K = √R0",
    };
  },
};

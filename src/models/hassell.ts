import { carryingCapacity, maxReproduction, param } from "../params.js";
import type { GrowthFamily } from "./growth-family.js";

export interface HassellParams {
  readonly R0: number;
  readonly K: number;
  readonly beta: number;
  readonly [k: string]: number;
}

/**
 * Hassell map, written so that K is the unharvested equilibrium.
 *
 *   N[t+1] = R0 · N[t] / (1 + a · N[t−T])^β,   a = (R0^(1/β) − 1) / K
 *
 * Hassell's form is N' = λN/(1 + aN)^b with λ = R0, b = β. f'(K) = 1 − β·(1 − R0^(−1/β)),
 * so K is stable while β·(1 − R0^(−1/β)) < 2. No closed-form MSY: found numerically.
 * Source: Hassell, M. P. (1975). Density-dependence in single-species populations.
 * J. Anim. Ecol. 44: 283–295.
 */
export const hassell: GrowthFamily<HassellParams> = {
  id: "hassell",
  label: "Hassell",
  equation: "N[t+1] = R0·N[t] / (1 + a·N[t−T])^β, a = (R0^(1/β) − 1)/K",
  source: "Hassell, M. P. (1975). J. Anim. Ecol. 44: 283–295",
  params: [
    maxReproduction,
    carryingCapacity,
    param({
      name: "beta",
      label: "competition exponent β",
      unitKind: "dimensionless",
      description: "1 is Beverton–Holt; large values are scramble competition",
      range: { min: 0, max: 20 },
      default: 2,
      sweep: [0.2, 6],
    }),
  ],
  constraints: [],
  factor: (m, { R0, K, beta }) => {
    const a = (Math.pow(R0, 1 / beta) - 1) / K;
    return R0 / Math.pow(1 + a * m, beta);
  },
  factorSlope: (m, { R0, K, beta }) => {
    const a = (Math.pow(R0, 1 / beta) - 1) / K;
    return -R0 * beta * a * Math.pow(1 + a * m, -beta - 1);
  },
  equilibria: ({ K }) => [0, K],
};

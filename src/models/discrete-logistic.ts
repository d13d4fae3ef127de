import { carryingCapacity, growthRate } from "../params.js";
import type { GrowthFamily } from "./growth-family.js";

export interface DiscreteLogisticParams {
  readonly r: number;
  readonly K: number;
  readonly [k: string]: number;
}

/**
 * Discrete logistic map.
 *
 *   N[t+1] = N[t] + r · N[t] · (1 − N[t−T] / K)
 *
 * Equilibria 0 and K; f'(K) = 1 − r, so K is stable for 0 < r < 2 and period-doubles at
 * r = 2. The map is only meaningful for N < K(1 + r)/r: beyond that it would make the next
 * abundance negative, and the closed loop sets it to zero (the stock is extinct).
 * Source: May, R. M. (1976). Simple mathematical models with very complicated dynamics.
 * Nature 261: 459–467 (the map x' = a·x(1 − x) with a = 1 + r, x = rN/((1 + r)K)).
 * @example discreteLogistic.factor(50, { r: 1.5, K: 100 }) // => 1.75
 */
export const discreteLogistic: GrowthFamily<DiscreteLogisticParams> = {
  id: "discrete-logistic",
  label: "Discrete logistic",
  equation: "N[t+1] = N[t] + r·N[t]·(1 − N[t−T]/K)",
  source: "May, R. M. (1976). Nature 261: 459–467",
  params: [growthRate("intrinsic rate of increase", 3, 1), carryingCapacity],
  constraints: [],
  factor: (m, { r, K }) => 1 + r * (1 - m / K),
  factorSlope: (_m, { r, K }) => -r / K,
  equilibria: ({ K }) => [0, K],
  surplusPeak: ({ r, K }) => ({
    escapement: K / 2,
    msy: (r * K) / 4,
    source: "Schaefer, M. B. (1954). Bull. Inter-Am. Trop. Tuna Comm. 1: 27–56",
  }),
};

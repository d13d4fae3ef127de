import { carryingCapacity, maxReproduction, param } from "../params.js";
import type { GrowthFamily } from "./growth-family.js";

export interface ShepherdParams {
  readonly R0: number;
  readonly K: number;
  readonly delta: number;
  readonly [k: string]: number;
}

/**
 * Shepherd map, written so that K is the unharvested equilibrium.
 *
 *   N[t+1] = R0 · N[t] / (1 + (R0 − 1) · (N[t−T] / K)^δ)
 *
 * Shepherd's own form R = a·S / (1 + (S/k)^β) has a = R0, β = δ, k = K/(R0 − 1)^(1/δ).
 * δ = 1 is Beverton–Holt; δ > 1 overcompensates. f'(K) = 1 − δ·(1 − 1/R0), so K is stable
 * while δ·(1 − 1/R0) < 2. No closed-form MSY: it is found numerically.
 * Source: Shepherd, J. G. (1982). A versatile new stock–recruitment relationship for
 * fisheries, and the construction of sustainable yield curves. J. Cons. int. Explor. Mer
 * 40: 67–75.
 */
export const shepherd: GrowthFamily<ShepherdParams> = {
  id: "shepherd",
  label: "Shepherd",
  equation: "N[t+1] = R0·N[t] / (1 + (R0 − 1)·(N[t−T]/K)^δ)",
  source: "Shepherd, J. G. (1982). J. Cons. int. Explor. Mer 40: 67–75",
  params: [
    maxReproduction,
    carryingCapacity,
    param({
      name: "delta",
      label: "compensation exponent δ",
      unitKind: "dimensionless",
      description: "1 is Beverton–Holt; above 1 the stock overcompensates",
      range: { min: 0, max: 10 },
      default: 2,
      sweep: [0.2, 6],
    }),
  ],
  constraints: [],
  factor: (m, { R0, K, delta }) => R0 / (1 + (R0 - 1) * Math.pow(m / K, delta)),
  factorSlope: (m, { R0, K, delta }) => {
    const u = m / K;
    const d = 1 + (R0 - 1) * Math.pow(u, delta);
    return (-R0 * (R0 - 1) * delta * Math.pow(u, delta - 1)) / (K * d * d);
  },
  equilibria: ({ K }) => [0, K],
};

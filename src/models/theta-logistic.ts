import { carryingCapacity, growthRate, param } from "../params.js";
import type { GrowthFamily } from "./growth-family.js";

export interface ThetaLogisticParams {
  readonly r: number;
  readonly K: number;
  readonly theta: number;
  readonly [k: string]: number;
}

/**
 * Theta-logistic map (discrete Pella–Tomlinson production).
 *
 *   N[t+1] = N[t] + r · N[t] · (1 − (N[t−T] / K)^θ)
 *
 * θ = 1 is the discrete logistic. f'(K) = 1 − r·θ. The surplus r·S·(1 − (S/K)^θ) peaks at
 * S = K·(1 + θ)^(−1/θ) with MSY = r·K·θ·(1 + θ)^(−(1+θ)/θ). As for the discrete logistic, a
 * step that would make the abundance negative sets it to zero.
 * Sources: Gilpin, M. E. & Ayala, F. J. (1973). PNAS 70: 3590–3593; Pella, J. J. &
 * Tomlinson, P. K. (1969). A generalized stock production model. Bull. Inter-Am. Trop. Tuna
 * Comm. 13: 419–496.
 */
export const thetaLogistic: GrowthFamily<ThetaLogisticParams> = {
  id: "theta-logistic",
  label: "Theta-logistic (Pella–Tomlinson)",
  equation: "N[t+1] = N[t] + r·N[t]·(1 − (N[t−T]/K)^θ)",
  source: "Pella, J. J. & Tomlinson, P. K. (1969). Bull. Inter-Am. Trop. Tuna Comm. 13: 419–496",
  params: [
    growthRate("intrinsic rate of increase", 3, 1),
    carryingCapacity,
    param({
      name: "theta",
      label: "shape exponent θ",
      unitKind: "dimensionless",
      description: "1 is the logistic; production peaks above K/2 for θ above 1",
      range: { min: 0, max: 20 },
      default: 1,
      sweep: [0.2, 6],
    }),
  ],
  constraints: [],
  factor: (m, { r, K, theta }) => 1 + r * (1 - Math.pow(m / K, theta)),
  factorSlope: (m, { r, K, theta }) => (-r * theta * Math.pow(m / K, theta - 1)) / K,
  equilibria: ({ K }) => [0, K],
  surplusPeak: ({ r, K, theta }) => ({
    escapement: K * Math.pow(1 + theta, -1 / theta),
    msy: r * K * theta * Math.pow(1 + theta, -(1 + theta) / theta),
    source: "derived from Pella & Tomlinson (1969): d/dS of r·S·(1 − (S/K)^θ) = 0",
  }),
};

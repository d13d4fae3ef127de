import { carryingCapacity, growthRate } from "../params.js";
import { lambertW0 } from "../numeric/lambert-w.js";
import type { GrowthFamily } from "./growth-family.js";

export interface RickerParams {
  readonly r: number;
  readonly K: number;
  readonly [k: string]: number;
}

/**
 * Ricker stock–recruitment map.
 *
 *   N[t+1] = N[t] · exp(r · (1 − N[t−T] / K))
 *
 * Equilibria 0 and K; f'(K) = 1 − r, so K is stable for 0 < r < 2; it period-doubles at
 * r = 2. The surplus f(S) − S peaks at S = K·(1 − W(e^(1−r)))/r, W the Lambert W function.
 * Source: Ricker, W. E. (1954). Stock and recruitment. J. Fish. Res. Board Can. 11: 559–623.
 * Stability: May, R. M. (1976). Nature 261: 459–467.
 * Peak: Scheuerell, M. D. (2016). PeerJ 4: e1623.
 * @example ricker.factor(50, { r: 1.5, K: 100 }) * 50 // ≈ 105.85
 */
export const ricker: GrowthFamily<RickerParams> = {
  id: "ricker",
  label: "Ricker",
  equation: "N[t+1] = N[t]·exp(r·(1 − N[t−T]/K))",
  source: "Ricker, W. E. (1954). J. Fish. Res. Board Can. 11: 559–623",
  params: [growthRate("log of the maximum per-capita growth", 10, 1), carryingCapacity],
  constraints: [],
  factor: (m, { r, K }) => Math.exp(r * (1 - m / K)),
  logFactor: (m, { r, K }) => r * (1 - m / K),
  factorSlope: (m, { r, K }) => (-r / K) * Math.exp(r * (1 - m / K)),
  equilibria: ({ K }) => [0, K],
  surplusPeak: ({ r, K }) => {
    const s = (K * (1 - lambertW0(Math.exp(1 - r)))) / r;
    return {
      escapement: s,
      msy: s * Math.exp(r * (1 - s / K)) - s,
      source: "Scheuerell, M. D. (2016). PeerJ 4: e1623",
    };
  },
};

import { carryingCapacity, growthRate } from "../params.js";
import type { GrowthFamily } from "./growth-family.js";

export interface GompertzParams {
  readonly r: number;
  readonly K: number;
  readonly [k: string]: number;
}

/** Smallest density term, as a fraction of K, the log-linear map is evaluated at. */
export const GOMPERTZ_FLOOR = 1e-12;
const FLOOR = GOMPERTZ_FLOOR;

/**
 * Gompertz map in its log-linear (stochastic-Gompertz) form.
 *
 *   N[t+1] = N[t] · exp(r · ln(K / N[t−T]))      i.e.  ln N' = ln N + r·(ln K − ln N[t−T])
 *
 * Equilibrium K with f'(K) = 1 − r, stable for 0 < r < 2. The model lives on N > 0 (log
 * scale): a density term below 1e-12·K is evaluated at that floor so a stock restored from
 * zero does not produce an infinite step. No closed-form discrete MSY: found numerically.
 * Sources: Gompertz, B. (1825). Phil. Trans. R. Soc. Lond. 115: 513–583; log-linear form as
 * in Dennis, B. et al. (2006). Estimating density dependence, process noise, and
 * observation error. Ecol. Monogr. 76: 323–341.
 */
export const gompertz: GrowthFamily<GompertzParams> = {
  id: "gompertz",
  label: "Gompertz (log-linear)",
  equation: "N[t+1] = N[t]·exp(r·ln(K/N[t−T]))",
  source: "Dennis, B. et al. (2006). Ecol. Monogr. 76: 323–341",
  params: [growthRate("strength of density dependence on the log scale", 3, 0.5), carryingCapacity],
  constraints: [],
  factor: (m, { r, K }) => Math.exp(r * Math.log(K / Math.max(m, FLOOR * K))),
  logFactor: (m, { r, K }) => r * Math.log(K / Math.max(m, FLOOR * K)),
  factorSlope: (m, { r, K }) => {
    const mm = Math.max(m, FLOOR * K);
    return (-r / mm) * Math.exp(r * Math.log(K / mm));
  },
  equilibria: ({ K }) => [K],
  finiteMsy: ({ r }) => r < 1,
  surplusPeak: ({ r, K }) => ({
    escapement: K * Math.pow(1 - r, 1 / r),
    msy: K * r * Math.pow(1 - r, (1 - r) / r),
    source: "derived: d/dS (K^r·S^(1−r) − S) = 0 at S = K·(1 − r)^(1/r)",
  }),
};

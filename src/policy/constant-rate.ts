import type { HarvestRule } from "./harvest-rule.js";

/**
 * Constant harvest-rate (constant fishing mortality) rule.
 *
 *   Q[t] = h · y[t − L],   0 ≤ h < 1
 *
 * Source: Schaefer, M. B. (1954). Bull. Inter-Am. Trop. Tuna Comm. 1: 27–56 (catch
 * proportional to effort and stock).
 */
export function constantRate(rate: number): HarvestRule {
  return { kind: "constant-rate", quota: (y) => rate * y, quotaSlope: () => rate };
}

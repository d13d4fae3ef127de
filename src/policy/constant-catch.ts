import type { HarvestRule } from "./harvest-rule.js";

/**
 * Constant-catch (fixed quota) rule.
 *
 *   Q[t] = Q       whatever the survey says
 *
 * Under the logistic (Schaefer) model with harvest after reproduction the equilibria are
 * N = K/2·(1 ± √(1 − 4Q/(rK))), the lower one unstable, and none exist when Q > rK/4.
 * Source: Schaefer, M. B. (1954). Bull. Inter-Am. Trop. Tuna Comm. 1: 27–56.
 */
export function constantCatch(quota: number): HarvestRule {
  return { kind: "constant-catch", quota: () => quota, quotaSlope: () => 0 };
}

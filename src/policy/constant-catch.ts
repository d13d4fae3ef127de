import type { HarvestRule } from "./harvest-rule.js";

// Rules are small classes rather than closures so that every rule of a kind shares one
// hidden class and the closed loop's call to quota() stays monomorphic (and inlined) in
// sweeps that build thousands of rules.
class ConstantCatch implements HarvestRule {
  readonly kind = "constant-catch" as const;
  constructor(private readonly q: number) {}
  quota(): number {
    return this.q;
  }
  quotaSlope(): number {
    return 0;
  }
}

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
  return new ConstantCatch(quota);
}

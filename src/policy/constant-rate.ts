import type { HarvestRule } from "./harvest-rule.js";

class ConstantRate implements HarvestRule {
  readonly kind = "constant-rate" as const;
  constructor(private readonly h: number) {}
  quota(y: number): number {
    return this.h * y;
  }
  quotaSlope(): number {
    return this.h;
  }
}

/**
 * Constant harvest-rate (constant fishing mortality) rule.
 *
 *   Q[t] = h · y[t − L],   0 ≤ h < 1
 *
 * Source: Schaefer, M. B. (1954). Bull. Inter-Am. Trop. Tuna Comm. 1: 27–56 (catch
 * proportional to effort and stock).
 */
export function constantRate(rate: number): HarvestRule {
  return new ConstantRate(rate);
}

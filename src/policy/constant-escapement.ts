import type { HarvestRule } from "./harvest-rule.js";

class ConstantEscapement implements HarvestRule {
  readonly kind = "constant-escapement" as const;
  constructor(private readonly e: number) {}
  quota(y: number): number {
    return y > this.e ? y - this.e : 0;
  }
  quotaSlope(y: number): number {
    return y > this.e ? 1 : 0;
  }
}

/**
 * Constant-escapement rule: take everything above the escapement target E.
 *
 *   Q[t] = max(y[t − L] − E, 0)
 *
 * Source: Reed, W. J. (1979). Optimal escapement levels in stochastic and deterministic
 * harvesting models. J. Environ. Econ. Manage. 6: 350–363 (from memory).
 */
export function constantEscapement(escapement: number): HarvestRule {
  return new ConstantEscapement(escapement);
}

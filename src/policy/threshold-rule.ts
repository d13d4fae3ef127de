import type { HarvestRule } from "./harvest-rule.js";

/** Settings of the threshold (hockey-stick) rule. */
export interface ThresholdSettings {
  /** Survey level at and below which the fishery is closed. */
  readonly lowerTrigger: number;
  /** Survey level at and above which the full rate applies. */
  readonly upperTrigger: number;
  /** The full harvest rate, 0 ≤ h_max < 1. */
  readonly maxRate: number;
}

class ThresholdRule implements HarvestRule {
  readonly kind = "threshold" as const;
  private readonly width: number;
  constructor(
    private readonly lo: number,
    private readonly hi: number,
    private readonly h: number,
  ) {
    this.width = hi - lo;
  }
  quota(y: number): number {
    return y <= this.lo ? 0 : y >= this.hi ? this.h * y : ((this.h * (y - this.lo)) / this.width) * y;
  }
  quotaSlope(y: number): number {
    return y < this.lo ? 0 : y >= this.hi ? this.h : (this.h * (2 * y - this.lo)) / this.width;
  }
}

/**
 * Threshold harvest rule: closed below a lower trigger, a rate rising linearly to h_max at an
 * upper trigger, flat above.
 *
 *   h(y) = 0                                   y ≤ lower
 *        = h_max · (y − lower)/(upper − lower)   lower < y < upper
 *        = h_max                               y ≥ upper
 *   Q[t] = h(y) · y,   y = y[t − L]
 *
 * Source: the "40-10" style of rule in Restrepo, V. R. & Powers, J. E. (1999). Precautionary
 * control rules in US fisheries management. ICES J. Mar. Sci. 56: 846–852 (from memory).
 */
export function thresholdRule({ lowerTrigger, upperTrigger, maxRate }: ThresholdSettings): HarvestRule {
  return new ThresholdRule(lowerTrigger, upperTrigger, maxRate);
}

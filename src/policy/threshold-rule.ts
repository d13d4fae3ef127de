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
export function thresholdRule({ lowerTrigger: lo, upperTrigger: hi, maxRate: h }: ThresholdSettings): HarvestRule {
  const width = hi - lo;
  return {
    kind: "threshold",
    quota: (y) => (y <= lo ? 0 : y >= hi ? h * y : ((h * (y - lo)) / width) * y),
    quotaSlope: (y) => (y < lo ? 0 : y >= hi ? h : (h * (2 * y - lo)) / width),
  };
}

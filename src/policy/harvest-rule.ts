/**
 * A harvest rule: the quota Q it sets from the survey y that it sees.
 *
 *   Q[t] = H(y[t − L])
 *
 * `quota` must be ≥ 0 for y ≥ 0; `quotaSlope` is dH/dy (the right-hand derivative at a kink),
 * used for the Jacobian of the closed loop.
 */
export interface HarvestRule {
  /** The rule kind id (a key of RULE_CATALOGUE in rule-catalogue.ts). */
  readonly kind: string;
  quota(y: number): number;
  quotaSlope(y: number): number;
}

/** Identifiers of the harvest rules, as used in a rule spec's `kind` field. */
export const RULE_KINDS = [
  "no-harvest",
  "constant-catch",
  "constant-rate",
  "constant-escapement",
  "threshold",
] as const;

export type RuleKind = (typeof RULE_KINDS)[number];

/**
 * A harvest rule: the quota Q it sets from the survey y that it sees.
 *
 *   Q[t] = H(y[t − L])
 *
 * `quota` must be ≥ 0 for y ≥ 0; `quotaSlope` is dH/dy (the right-hand derivative at a kink),
 * used for the Jacobian of the closed loop.
 */
export interface HarvestRule {
  readonly kind: RuleKind;
  quota(y: number): number;
  quotaSlope(y: number): number;
}

import type { HarvestRule } from "./harvest-rule.js";

/**
 * Constant-escapement rule: take everything above the escapement target E.
 *
 *   Q[t] = max(y[t − L] − E, 0)
 *
 * Source: Reed, W. J. (1979). Optimal escapement levels in stochastic and deterministic
 * harvesting models. J. Environ. Econ. Manage. 6: 350–363 (from memory).
 */
export function constantEscapement(escapement: number): HarvestRule {
  return {
    kind: "constant-escapement",
    quota: (y) => Math.max(y - escapement, 0),
    quotaSlope: (y) => (y > escapement ? 1 : 0),
  };
}

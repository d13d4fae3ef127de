import type { HarvestRule } from "./harvest-rule.js";

/** No harvest: Q = 0 (use with stocking alone, or for the unexploited stock). */
export function noHarvest(): HarvestRule {
  return { kind: "no-harvest", quota: () => 0, quotaSlope: () => 0 };
}

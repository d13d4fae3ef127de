import type { HarvestRule } from "./harvest-rule.js";

class NoHarvest implements HarvestRule {
  readonly kind = "no-harvest" as const;
  quota(): number {
    return 0;
  }
  quotaSlope(): number {
    return 0;
  }
}

/** No harvest: Q = 0 (use with stocking alone, or for the unexploited stock). */
export function noHarvest(): HarvestRule {
  return new NoHarvest();
}

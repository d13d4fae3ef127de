import { alleeRicker } from "./allee-ricker.js";
import { bevertonHolt } from "./beverton-holt.js";
import { discreteLogistic } from "./discrete-logistic.js";
import { gompertz } from "./gompertz.js";
import type { GrowthFamily, Params } from "./growth-family.js";
import { hassell } from "./hassell.js";
import { ricker } from "./ricker.js";
import { shepherd } from "./shepherd.js";
import { thetaLogistic } from "./theta-logistic.js";

/**
 * Every growth family by id: the catalogue of families. A family added here is known to the
 * schemas, the fits, the page, the command line and (through its kernel entry) the projection.
 */
export const families = {
  "discrete-logistic": discreteLogistic as GrowthFamily<Params>,
  ricker: ricker as GrowthFamily<Params>,
  "beverton-holt": bevertonHolt as GrowthFamily<Params>,
  shepherd: shepherd as GrowthFamily<Params>,
  hassell: hassell as GrowthFamily<Params>,
  "theta-logistic": thetaLogistic as GrowthFamily<Params>,
  gompertz: gompertz as GrowthFamily<Params>,
  "allee-ricker": alleeRicker as GrowthFamily<Params>,
} as const satisfies Record<string, GrowthFamily<Params>>;

/** Identifiers of the growth families, as used in a model spec's `family` field. */
export type FamilyId = keyof typeof families;

/** The family ids in catalogue order. */
export const FAMILY_IDS = Object.keys(families) as [FamilyId, ...FamilyId[]];

import { alleeRicker } from "./allee-ricker.js";
import { bevertonHolt } from "./beverton-holt.js";
import { discreteLogistic } from "./discrete-logistic.js";
import { gompertz } from "./gompertz.js";
import type { FamilyId, GrowthFamily, Params } from "./growth-family.js";
import { hassell } from "./hassell.js";
import { ricker } from "./ricker.js";
import { shepherd } from "./shepherd.js";
import { thetaLogistic } from "./theta-logistic.js";

/** Every growth family by id. Add a new family here and in FAMILY_IDS. */
export const families: Readonly<Record<FamilyId, GrowthFamily<Params>>> = {
  "discrete-logistic": discreteLogistic as GrowthFamily<Params>,
  ricker: ricker as GrowthFamily<Params>,
  "beverton-holt": bevertonHolt as GrowthFamily<Params>,
  shepherd: shepherd as GrowthFamily<Params>,
  hassell: hassell as GrowthFamily<Params>,
  "theta-logistic": thetaLogistic as GrowthFamily<Params>,
  gompertz: gompertz as GrowthFamily<Params>,
  "allee-ricker": alleeRicker as GrowthFamily<Params>,
};

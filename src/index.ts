// Results and issues
export { ok, fail, type Result } from "./result.js";
export { describeIssue, rangeText, type Issue, type IssueCode } from "./issues.js";
export { MAX_ABUNDANCE, type ParamInfo } from "./params.js";

// Growth models
export { FAMILY_IDS, production, productionSlope, densityTerm, type FamilyId, type GrowthFamily, type Params } from "./models/growth-family.js";
export { families } from "./models/families.js";
export { parseModel, modelSpecSchema, MAX_DELAY, type Model, type ModelSpec } from "./models/model-spec.js";
export { discreteLogistic } from "./models/discrete-logistic.js";
export { ricker } from "./models/ricker.js";
export { bevertonHolt } from "./models/beverton-holt.js";
export { shepherd } from "./models/shepherd.js";
export { hassell } from "./models/hassell.js";
export { thetaLogistic } from "./models/theta-logistic.js";
export { gompertz } from "./models/gompertz.js";
export { alleeRicker } from "./models/allee-ricker.js";
export {
  rickerFromStockRecruitment,
  rickerToStockRecruitment,
  bevertonHoltFromStockRecruitment,
  bevertonHoltToStockRecruitment,
  type StockRecruitmentParams,
} from "./models/stock-recruitment.js";

// Harvest and stocking rules
export { RULE_KINDS, type HarvestRule, type RuleKind } from "./policy/harvest-rule.js";
export { parseRule, ruleSpecSchema, RULE_SETTINGS, TIMINGS, MAX_SURVEY_LAG, type Rule, type RuleSpec, type RuleSpecInput, type Timing } from "./policy/rule-spec.js";
export { closedLoop, stateLayout, type ClosedLoop, type StateLayout, type StepRecord } from "./policy/closed-loop.js";
export { capQuota } from "./policy/quota-cap.js";
export { msy, type MsyQuantities } from "./policy/msy.js";

// Projection
export { parseScenario, MAX_HORIZON, type Scenario } from "./sim/scenario.js";
export { project, projectLoop, UNBOUNDED_FACTOR, type Projection } from "./sim/project.js";

// Numerics
export { lambertW0 } from "./numeric/lambert-w.js";
export { maximiseOnInterval } from "./numeric/golden-section.js";

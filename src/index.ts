// Results and issues
export { ok, fail, type Result } from "./result.js";
export { describeIssue, rangeText, type Issue, type IssueCode } from "./issues.js";
export { MAX_ABUNDANCE, type ParamInfo } from "./params.js";

// Growth models
export {
  production,
  productionSlope,
  densityTerm,
  type GrowthFamily,
  type Params,
} from "./models/growth-family.js";
export { families, FAMILY_IDS, type FamilyId } from "./models/families.js";
export {
  parseModel,
  withParams,
  modelSpecSchema,
  MAX_DELAY,
  type Model,
  type ModelSpec,
} from "./models/model-spec.js";
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
export type { HarvestRule } from "./policy/harvest-rule.js";
export {
  RULE_CATALOGUE,
  RULE_KINDS,
  TIMING_LABELS,
  type RuleKind,
  type RuleKindInfo,
} from "./policy/rule-catalogue.js";
export {
  parseRule,
  ruleSpecSchema,
  RULE_SETTINGS,
  TIMINGS,
  MAX_SURVEY_LAG,
  type Rule,
  type RuleSpec,
  type RuleSpecInput,
  type Timing,
} from "./policy/rule-spec.js";
export {
  closedLoop,
  stateLayout,
  type ClosedLoop,
  type StateLayout,
  type StepRecord,
  type StepNoise,
} from "./policy/closed-loop.js";
export { capQuota } from "./policy/quota-cap.js";
export { msy, type MsyQuantities } from "./policy/msy.js";

// Projection
export { parseScenario, MAX_HORIZON, type Scenario } from "./sim/scenario.js";
export { project, projectLoop, UNBOUNDED_FACTOR, type Projection } from "./sim/project.js";
export {
  parseUncertainty,
  uncertaintySchema,
  UNCERTAINTY_SETTINGS,
  MAX_REPLICATES,
  MAX_PARAMETER_SETS,
  type Uncertainty,
  type UncertaintyInput,
} from "./sim/uncertainty.js";
export { simulateBlocks, projectionBlocks } from "./sim/simulate-blocks.js";
export type { ProjectionParts } from "./sim/projection-parts.js";
export {
  summariseProjection,
  PERCENTILE_LEVELS,
  type StochasticProjection,
  type RiskMetrics,
  type Estimate,
} from "./sim/risk-metrics.js";
export { projectStochastic } from "./sim/stochastic-projection.js";
export {
  compareRules,
  ruleOutcome,
  parseRules,
  MAX_COMPARED_RULES,
  type RuleOutcome,
} from "./sim/rule-comparison.js";
export { robustVerdict, ROBUST_CLASSES, type RobustVerdict, type RobustClass } from "./sim/robust-verdict.js";
export { zigguratNormal, type IntSource } from "./sim/ziggurat.js";

// Numerics
export { lambertW0 } from "./numeric/lambert-w.js";
export { maximiseOnInterval } from "./numeric/golden-section.js";

// Equilibria and stability
export { findEquilibria, type Equilibrium, type EquilibriumSet } from "./equilibria/equilibria.js";
export { steadyState, equilibriumResidual } from "./equilibria/steady-state.js";
export { linearise, characteristicPolynomial, type Linearisation } from "./equilibria/jacobian.js";
export {
  juryTest,
  JURY_TOLERANCE,
  type JuryTable,
  type JuryCondition,
  type JuryVerdict,
} from "./equilibria/jury.js";
export { juryVerdict, type JuryCode } from "./equilibria/jury-verdict.js";
export {
  eigenvalues,
  companionMatrix,
  polynomialRoots,
  modulus,
  type Complex,
} from "./equilibria/eigenvalues.js";
export {
  classifyEquilibrium,
  STABILITY_KINDS,
  type StabilityKind,
  type StabilityVerdict,
} from "./equilibria/classify.js";
export {
  analyseStability,
  equilibriumStability,
  type StabilityAnalysis,
  type EquilibriumStability,
} from "./equilibria/stability.js";
export { stabilityMargin, type StabilityMargin, type MarginSide } from "./equilibria/margin.js";
export {
  parameterAxis,
  parameterPaths,
  withParameter,
  type ParameterAxis,
} from "./equilibria/parameter-path.js";
export {
  longRun,
  longRunBatch,
  REGIMES,
  MAX_PERIOD,
  type LongRun,
  type Regime,
  type LongRunOptions,
} from "./equilibria/long-run.js";
export { lyapunovExponent } from "./equilibria/lyapunov.js";
export {
  bifurcationDiagram,
  axisValues,
  type BifurcationDiagram,
  type SweepAxis,
} from "./equilibria/bifurcation.js";
export { regimeMap, type RegimeMap, type RegimeMapOptions } from "./equilibria/regime-map.js";
export { operatingVerdict } from "./equilibria/operating-verdict.js";

// Randomness
export { seededUniform, type Uniform } from "./sim/rng.js";
export { brentRoot } from "./numeric/brent-root.js";

// Fitting
export { parseSeriesCsv, MAX_SERIES_ROWS, type Series, type SeriesWarning } from "./fit/series.js";
export { LIKELIHOODS, negLogLikelihood, cvWeights, type LikelihoodKind } from "./fit/likelihood.js";
export {
  fitProblem,
  optimiseFit,
  FIT_METHODS,
  type FitMethod,
  type FitOptions,
  type FitProblem,
} from "./fit/fit-model.js";
export { fitSeries, summarise, type SeriesFit, type IdentifiabilityProblem } from "./fit/fit-series.js";
export { compareModels, type ModelComparison } from "./fit/compare-models.js";
export { profileInterval, CHI2_1_95, type ProfileInterval } from "./fit/profile-likelihood.js";
export { parametricBootstrap, type Bootstrap } from "./fit/bootstrap.js";
export { minimise, type Optimum } from "./fit/minimise.js";
export { nelderMead } from "./fit/nelder-mead.js";
export { residualDiagnostics, normalCdf, type ResidualDiagnostics } from "./fit/diagnostics.js";
export { projectThroughCatches } from "./sim/project-through-catches.js";
export { standardNormal } from "./sim/rng.js";
export { logGamma } from "./numeric/log-gamma.js";

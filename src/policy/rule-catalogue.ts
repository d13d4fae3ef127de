import { MAX_ABUNDANCE, type OrderConstraint, type ParamInfo, param } from "../params.js";
import { constantCatch } from "./constant-catch.js";
import { constantEscapement } from "./constant-escapement.js";
import { constantRate } from "./constant-rate.js";
import type { HarvestRule } from "./harvest-rule.js";
import { noHarvest } from "./no-harvest.js";
import { thresholdRule } from "./threshold-rule.js";

/** Longest survey lag L (years) accepted. */
export const MAX_SURVEY_LAG = 50;

/** When the catch is taken within the year, with the words a person reads. */
export const TIMING_LABELS = {
  before: "before reproduction (Ricker's convention)",
  after: "after reproduction (Schaefer's convention)",
} as const;
export type Timing = keyof typeof TIMING_LABELS;
export const TIMINGS = Object.keys(TIMING_LABELS) as [Timing, ...Timing[]];
/** The timing of a rule spec that gives none. */
export const DEFAULT_TIMING: Timing = "after";

/** Every numeric rule setting, described once: label, unit kind, range, default and sweep. */
export const RULE_SETTINGS = {
  quota: param({
    name: "quota",
    label: "annual quota Q",
    unitKind: "abundance-per-year",
    description: "the fixed catch taken each year",
    range: { min: 0, max: MAX_ABUNDANCE, minInclusive: true },
    default: 100,
    defaultTimesK: 0.1,
    sweep: [0, 0.6],
  }),
  rate: param({
    name: "rate",
    label: "harvest rate h",
    unitKind: "fraction-per-year",
    description: "the share of the surveyed stock taken each year",
    range: { min: 0, max: 1, minInclusive: true, maxInclusive: false },
    default: 0.2,
    sweep: [0, 0.95],
  }),
  escapement: param({
    name: "escapement",
    label: "escapement target E",
    unitKind: "abundance",
    description: "the stock left after the catch; everything above it is taken",
    range: { min: 0, max: MAX_ABUNDANCE, minInclusive: true },
    default: 500,
    defaultTimesK: 0.5,
    sweep: [0, 1.5],
  }),
  lowerTrigger: param({
    name: "lowerTrigger",
    label: "lower trigger",
    unitKind: "abundance",
    description: "the survey level at and below which the fishery closes",
    range: { min: 0, max: MAX_ABUNDANCE, minInclusive: true },
    default: 200,
    defaultTimesK: 0.2,
    sweep: [0, 1.5],
  }),
  upperTrigger: param({
    name: "upperTrigger",
    label: "upper trigger",
    unitKind: "abundance",
    description: "the survey level from which the full harvest rate applies",
    range: { min: 0, max: MAX_ABUNDANCE },
    default: 500,
    defaultTimesK: 0.5,
    sweep: [0, 1.5],
  }),
  maxRate: param({
    name: "maxRate",
    label: "maximum harvest rate h_max",
    unitKind: "fraction-per-year",
    description: "the harvest rate above the upper trigger",
    range: { min: 0, max: 1, minInclusive: true, maxInclusive: false },
    default: 0.3,
    sweep: [0, 0.95],
  }),
  stocking: param({
    name: "stocking",
    label: "stocking A",
    unitKind: "abundance-per-year",
    description: "animals released at the end of each year",
    range: { min: 0, max: MAX_ABUNDANCE, minInclusive: true },
    default: 0,
    sweep: [0, 0.5],
  }),
  surveyLag: param({
    name: "surveyLag",
    label: "survey lag L",
    unitKind: "years",
    description: "the rule acts on the survey of L years earlier",
    range: { min: 0, max: MAX_SURVEY_LAG, minInclusive: true },
    default: 0,
    sweep: [0, 5],
    integer: true,
  }),
  maxIncrease: param({
    name: "maxIncrease",
    label: "largest quota rise",
    unitKind: "fraction",
    description: "the largest rise of the quota from one year to the next, as a fraction of last year's",
    range: { min: 0, max: 10, minInclusive: true },
    default: 0.15,
    sweep: [0, 1],
  }),
  maxDecrease: param({
    name: "maxDecrease",
    label: "largest quota cut",
    unitKind: "fraction",
    description: "the largest cut of the quota from one year to the next, as a fraction of last year's",
    range: { min: 0, max: 1, minInclusive: true },
    default: 0.15,
    sweep: [0, 1],
  }),
} as const satisfies Record<string, ParamInfo>;

export type RuleSettingName = keyof typeof RULE_SETTINGS;

/** Settings every rule kind has (besides `timing` and the optional `quotaChange` caps). */
export const COMMON_RULE_SETTINGS = ["stocking", "surveyLag"] as const;
/** The settings of the optional `quotaChange` caps. */
export const QUOTA_CHANGE_SETTINGS = ["maxIncrease", "maxDecrease"] as const;

/** One harvest rule kind: its words, its own settings, the orders between them and its builder. */
export interface RuleKindInfo {
  readonly label: string;
  readonly equation: string;
  /** The rule's own numeric settings (names in RULE_SETTINGS), in the order a form shows them. */
  readonly settings: readonly RuleSettingName[];
  /** The parameter path a margin or a first slider varies. */
  readonly main: string;
  readonly constraints: readonly OrderConstraint[];
  build(settings: Readonly<Record<string, number>>): HarvestRule;
}

/**
 * Every harvest rule kind by its `kind` id: the catalogue of rules. The schema, the kernel
 * table, the page's rule forms and the command line's help are read from it.
 */
export const RULE_CATALOGUE = {
  "no-harvest": {
    label: "no harvest",
    equation: "Q = 0",
    settings: [],
    main: "model.params.K",
    constraints: [],
    build: () => noHarvest(),
  },
  "constant-catch": {
    label: "constant catch (a fixed quota)",
    equation: "Q[t] = Q",
    settings: ["quota"],
    main: "rule.quota",
    constraints: [],
    build: (s) => constantCatch(s.quota!),
  },
  "constant-rate": {
    label: "constant harvest rate",
    equation: "Q[t] = h·y[t−L]",
    settings: ["rate"],
    main: "rule.rate",
    constraints: [],
    build: (s) => constantRate(s.rate!),
  },
  "constant-escapement": {
    label: "constant escapement",
    equation: "Q[t] = max(y[t−L] − E, 0)",
    settings: ["escapement"],
    main: "rule.escapement",
    constraints: [],
    build: (s) => constantEscapement(s.escapement!),
  },
  threshold: {
    label: "threshold rule (closed below a trigger, rising to a full rate)",
    equation: "Q[t] = h(y)·y, h rising from 0 at the lower to h_max at the upper trigger",
    settings: ["lowerTrigger", "upperTrigger", "maxRate"],
    main: "rule.maxRate",
    constraints: [{ lower: "lowerTrigger", upper: "upperTrigger", field: "upperTrigger" }],
    build: (s) =>
      thresholdRule({ lowerTrigger: s.lowerTrigger!, upperTrigger: s.upperTrigger!, maxRate: s.maxRate! }),
  },
} as const satisfies Record<string, RuleKindInfo>;

/** Identifiers of the harvest rules, as used in a rule spec's `kind` field. */
export type RuleKind = keyof typeof RULE_CATALOGUE;
/** The rule kinds in catalogue order. */
export const RULE_KINDS = Object.keys(RULE_CATALOGUE) as [RuleKind, ...RuleKind[]];

/** The description of a rule kind (its settings typed loosely, for generic code). */
export function ruleKindInfo(kind: RuleKind): RuleKindInfo {
  return RULE_CATALOGUE[kind];
}

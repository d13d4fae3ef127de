import { z } from "zod";
import { MAX_ABUNDANCE, param, type ParamInfo, numberSchema } from "../params.js";
import { fail, ok, type Result } from "../result.js";
import { issueFromZod } from "../zod-issue.js";
import { constantCatch } from "./constant-catch.js";
import { constantEscapement } from "./constant-escapement.js";
import { constantRate } from "./constant-rate.js";
import { RULE_KINDS, type HarvestRule, type RuleKind } from "./harvest-rule.js";
import { noHarvest } from "./no-harvest.js";
import { thresholdRule } from "./threshold-rule.js";

/** Longest survey lag L (years) accepted. */
export const MAX_SURVEY_LAG = 50;

/** When the catch is taken within the year. */
export const TIMINGS = ["before", "after"] as const;
export type Timing = (typeof TIMINGS)[number];

const abundanceUnit = "same unit as the abundance";

/** Every numeric rule setting, with its unit and range. */
export const RULE_SETTINGS: Readonly<Record<string, ParamInfo>> = {
  quota: param(
    "quota",
    `${abundanceUnit} per year`,
    "fixed annual catch Q",
    { min: 0, max: MAX_ABUNDANCE, minInclusive: true },
    100,
  ),
  rate: param(
    "rate",
    "fraction of the surveyed stock per year",
    "harvest rate h",
    { min: 0, max: 1, minInclusive: true, maxInclusive: false },
    0.2,
  ),
  escapement: param(
    "escapement",
    abundanceUnit,
    "escapement target E left after the catch",
    { min: 0, max: MAX_ABUNDANCE, minInclusive: true },
    500,
  ),
  lowerTrigger: param(
    "lowerTrigger",
    abundanceUnit,
    "survey level at and below which the fishery closes",
    { min: 0, max: MAX_ABUNDANCE, minInclusive: true },
    200,
  ),
  upperTrigger: param(
    "upperTrigger",
    abundanceUnit,
    "survey level from which the full rate applies",
    { min: 0, max: MAX_ABUNDANCE },
    500,
  ),
  maxRate: param(
    "maxRate",
    "fraction of the surveyed stock per year",
    "full harvest rate h_max above the upper trigger",
    { min: 0, max: 1, minInclusive: true, maxInclusive: false },
    0.3,
  ),
  stocking: param(
    "stocking",
    `${abundanceUnit} per year`,
    "animals released each year, A",
    { min: 0, max: MAX_ABUNDANCE, minInclusive: true },
    0,
  ),
  maxIncrease: param(
    "maxIncrease",
    "fraction of last year's quota",
    "largest rise of the quota from one year to the next",
    { min: 0, max: 10, minInclusive: true },
    0.15,
  ),
  maxDecrease: param(
    "maxDecrease",
    "fraction of last year's quota",
    "largest cut of the quota from one year to the next",
    { min: 0, max: 1, minInclusive: true },
    0.15,
  ),
};

const n = (name: string) => numberSchema(RULE_SETTINGS[name]!);

const common = {
  stocking: n("stocking").default(0),
  surveyLag: z
    .int()
    .min(0)
    .max(MAX_SURVEY_LAG)
    .default(0)
    .describe("survey lag L: the rule acts on the survey of L years earlier [years]"),
  timing: z.enum(TIMINGS).default("after").describe("harvest before or after reproduction"),
  quotaChange: z
    .strictObject({ maxIncrease: n("maxIncrease"), maxDecrease: n("maxDecrease") })
    .optional()
    .describe("caps on the year-to-year change of the quota, as fractions"),
};

/** The zod schema of a harvest-and-stocking rule spec, discriminated by `kind`. */
export const ruleSpecSchema = z.discriminatedUnion("kind", [
  z.strictObject({ kind: z.literal("no-harvest"), ...common }),
  z.strictObject({ kind: z.literal("constant-catch"), quota: n("quota"), ...common }),
  z.strictObject({ kind: z.literal("constant-rate"), rate: n("rate"), ...common }),
  z.strictObject({ kind: z.literal("constant-escapement"), escapement: n("escapement"), ...common }),
  z.strictObject({
    kind: z.literal("threshold"),
    lowerTrigger: n("lowerTrigger"),
    upperTrigger: n("upperTrigger"),
    maxRate: n("maxRate"),
    ...common,
  }),
]);

/** A rule spec as plain JSON (after defaults). */
export type RuleSpec = z.output<typeof ruleSpecSchema>;
/** A rule spec as a caller may write it (defaults optional). */
export type RuleSpecInput = z.input<typeof ruleSpecSchema>;

/** A rule spec with its harvest rule built: what the closed loop takes. */
export type Rule = RuleSpec & { readonly harvest: HarvestRule };

/**
 * Validates a rule spec from untrusted input and builds its harvest rule.
 * Fails with an issue that names the field (`rule.rate`) and its allowed range.
 */
export function parseRule(input: unknown, prefix = "rule"): Result<Rule> {
  if (input === null || typeof input !== "object" || Array.isArray(input)) {
    return fail({
      code: "wrong_type",
      field: prefix,
      expected: "object",
      received: input === null ? "null" : Array.isArray(input) ? "array" : typeof input,
    });
  }
  const kind = (input as { kind?: unknown }).kind;
  if (kind === undefined) return fail({ code: "missing_field", field: `${prefix}.kind` });
  if (typeof kind !== "string" || !(RULE_KINDS as readonly string[]).includes(kind)) {
    return fail({ code: "unknown_rule", field: `${prefix}.kind`, value: String(kind), allowed: RULE_KINDS });
  }
  const parsed = ruleSpecSchema.safeParse(input);
  if (!parsed.success) {
    return fail(
      issueFromZod(parsed.error, input, (path) => RULE_SETTINGS[String(path[path.length - 1])], prefix),
    );
  }
  const spec = parsed.data;
  if (spec.kind === "threshold" && !(spec.lowerTrigger < spec.upperTrigger)) {
    return fail({
      code: "constraint_violated",
      field: `${prefix}.upperTrigger`,
      constraint: "the upper trigger must be above the lower trigger",
    });
  }
  return ok({ ...spec, harvest: buildHarvest(spec) });
}

/** Builds the harvest rule of an already validated spec. */
export function buildHarvest(spec: RuleSpec): HarvestRule {
  switch (spec.kind) {
    case "no-harvest":
      return noHarvest();
    case "constant-catch":
      return constantCatch(spec.quota);
    case "constant-rate":
      return constantRate(spec.rate);
    case "constant-escapement":
      return constantEscapement(spec.escapement);
    case "threshold":
      return thresholdRule(spec);
  }
}

export type { RuleKind };

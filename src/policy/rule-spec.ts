import { z } from "zod";
import { brokenOrder, numberSchema, orderIssue } from "../params.js";
import { fail, ok, type Result } from "../result.js";
import { issueFromZod } from "../zod-issue.js";
import type { HarvestRule } from "./harvest-rule.js";
import { objectIssue } from "../object-input.js";
import {
  COMMON_RULE_SETTINGS,
  DEFAULT_TIMING,
  QUOTA_CHANGE_SETTINGS,
  RULE_CATALOGUE,
  RULE_KINDS,
  RULE_SETTINGS,
  type RuleKind,
  type RuleSettingName,
  TIMINGS,
  type Timing,
} from "./rule-catalogue.js";

export {
  MAX_SURVEY_LAG,
  RULE_KINDS,
  RULE_SETTINGS,
  TIMINGS,
  type RuleKind,
  type Timing,
} from "./rule-catalogue.js";

/** The settings every rule spec has, after defaults. */
export interface CommonRuleSpec {
  readonly stocking: number;
  readonly surveyLag: number;
  readonly timing: Timing;
  readonly quotaChange?: { readonly maxIncrease: number; readonly maxDecrease: number } | undefined;
}

type OwnSettings<K extends RuleKind> = {
  readonly [S in (typeof RULE_CATALOGUE)[K]["settings"][number]]: number;
};

/** A rule spec as plain JSON (after defaults), one member per kind of the catalogue. */
export type RuleSpec = { [K in RuleKind]: { readonly kind: K } & OwnSettings<K> & CommonRuleSpec }[RuleKind];
/** A rule spec as a caller may write it (the common settings optional). */
export type RuleSpecInput = {
  [K in RuleKind]: { readonly kind: K } & OwnSettings<K> & Partial<CommonRuleSpec>;
}[RuleKind];

/** A rule spec with its harvest rule built: what the closed loop takes. */
export type Rule = RuleSpec & { readonly harvest: HarvestRule };

const n = (name: RuleSettingName) => numberSchema(RULE_SETTINGS[name]);

function kindSchema(kind: RuleKind) {
  const shape: Record<string, z.ZodType> = { kind: z.literal(kind) };
  for (const s of RULE_CATALOGUE[kind].settings) shape[s] = n(s);
  for (const s of COMMON_RULE_SETTINGS) shape[s] = n(s).default(RULE_SETTINGS[s].default);
  shape.timing = z.enum(TIMINGS).default(DEFAULT_TIMING).describe("harvest before or after reproduction");
  const caps: Record<string, z.ZodNumber> = {};
  for (const s of QUOTA_CHANGE_SETTINGS) caps[s] = n(s);
  shape.quotaChange = z
    .strictObject(caps)
    .optional()
    .describe("caps on the year-to-year change of the quota, as fractions");
  return z.strictObject(shape);
}

/** The zod schema of a harvest-and-stocking rule spec, discriminated by `kind`, built from the catalogue. */
export const ruleSpecSchema = z.discriminatedUnion(
  "kind",
  RULE_KINDS.map(kindSchema) as unknown as [
    ReturnType<typeof kindSchema>,
    ...ReturnType<typeof kindSchema>[],
  ],
) as unknown as z.ZodType<RuleSpec, RuleSpecInput>;

/**
 * Validates a rule spec from untrusted input and builds its harvest rule.
 * Fails with an issue that names the field (`rule.rate`) and its allowed range.
 */
export function parseRule(input: unknown, prefix = "rule"): Result<Rule> {
  const notObject = objectIssue(input, prefix);
  if (notObject) return fail(notObject);
  const kind = (input as { kind?: unknown }).kind;
  if (kind === undefined) return fail({ code: "missing_field", field: `${prefix}.kind` });
  if (typeof kind !== "string" || !(RULE_KINDS as readonly string[]).includes(kind)) {
    return fail({ code: "unknown_rule", field: `${prefix}.kind`, value: String(kind), allowed: RULE_KINDS });
  }
  const parsed = ruleSpecSchema.safeParse(input);
  if (!parsed.success) {
    return fail(
      issueFromZod(
        parsed.error,
        input,
        (path) => RULE_SETTINGS[String(path[path.length - 1]) as RuleSettingName],
        prefix,
      ),
    );
  }
  const spec = parsed.data;
  const broken = brokenOrder(RULE_CATALOGUE[spec.kind].constraints, spec);
  if (broken) return fail(orderIssue(broken, spec, prefix));
  return ok({ ...spec, harvest: buildHarvest(spec) });
}

/** Builds the harvest rule of an already validated spec, with the catalogue's builder. */
export function buildHarvest(spec: RuleSpec): HarvestRule {
  return RULE_CATALOGUE[spec.kind].build(spec as unknown as Readonly<Record<string, number>>);
}

// Request bodies of the API as zod schemas: validated at the edge and turned into the
// OpenAPI document. The core specs inside them (model, rule, scenario, uncertainty) are
// validated again by src/, whose issues name the exact field.
import { z } from "zod";
import { FIT_METHODS } from "../../src/fit/fit-model.js";
import { LIKELIHOODS } from "../../src/fit/likelihood.js";
import { FAMILY_IDS } from "../../src/models/families.js";
import { modelSpecSchema } from "../../src/models/model-spec.js";
import { ruleSpecSchema, TIMINGS } from "../../src/policy/rule-spec.js";
import { MAX_COMPARED_RULES } from "../../src/sim/rule-comparison.js";
import { MAX_HORIZON } from "../../src/sim/scenario.js";
import { uncertaintySchema } from "../../src/sim/uncertainty.js";

const name = z.string().min(1).max(200).describe("a label of your own");
const id = z.string().min(1).max(100);

export const scenarioSpecSchema = z
  .strictObject({
    model: modelSpecSchema,
    rule: ruleSpecSchema,
    start: z
      .union([z.number().min(0), z.array(z.number().min(0)).min(1).max(101)])
      .describe("N in the first year, or [N0, N−1, …] for delays and lags"),
    horizon: z.int().min(1).max(MAX_HORIZON).describe("years to project"),
    startYear: z.int().min(-100000).max(100000).optional(),
    uncertainty: uncertaintySchema.optional().describe("the scenario's default uncertainty for projections"),
  })
  .describe("model + rule + start + horizon (+ uncertainty)");

export const seriesJsonSchema = z.strictObject({
  name,
  csv: z.string().min(1).describe("the series as RFC 4180 CSV text"),
});
export const modelBodySchema = z.strictObject({ name, spec: modelSpecSchema });
export const ruleBodySchema = z.strictObject({ name, spec: ruleSpecSchema });
export const scenarioBodySchema = z.strictObject({ name, spec: scenarioSpecSchema });

export const fitBodySchema = z.strictObject({
  seriesId: id,
  families: z.array(z.enum(FAMILY_IDS)).min(1).max(FAMILY_IDS.length).optional(),
  delays: z.array(z.int().min(0).max(3)).min(1).max(4).optional(),
  method: z.enum(FIT_METHODS).optional(),
  likelihood: z.enum(LIKELIHOODS).optional(),
  timing: z.enum(TIMINGS).optional(),
  seed: z.int().min(0).max(2147483647).optional(),
});

const scenarioRef = {
  scenarioId: id.optional().describe("a stored scenario"),
  scenario: scenarioSpecSchema.optional().describe("or a scenario given inline"),
};
const axis = z.strictObject({
  path: z.string(),
  from: z.number(),
  to: z.number(),
  count: z.int().min(2).max(2000),
});
const longRunOptions = z
  .strictObject({
    burnIn: z.int().min(0).max(100000).optional(),
    observe: z.int().min(8).max(4096).optional(),
    start: z.array(z.number().min(0)).min(1).max(101).optional(),
  })
  .optional();

const preview = z
  .boolean()
  .optional()
  .describe("false: answer 200 without storing (a preview while a slider moves)");

export const analysisBodySchema = z.discriminatedUnion("kind", [
  z.strictObject({ kind: z.literal("stability"), ...scenarioRef, store: preview }),
  z.strictObject({
    kind: z.literal("margin"),
    ...scenarioRef,
    parameter: z.string().describe("e.g. rule.rate, rule.surveyLag, model.params.r"),
    store: preview,
  }),
  z.strictObject({ kind: z.literal("bifurcation"), ...scenarioRef, axis, options: longRunOptions }),
  z.strictObject({
    kind: z.literal("regime-map"),
    ...scenarioRef,
    x: axis,
    y: axis,
    options: longRunOptions,
  }),
  z.strictObject({
    kind: z.literal("robust"),
    ...scenarioRef,
    fitId: id.describe("a stored fit: its models, weighted by Akaike weight, under the scenario's rule"),
    store: preview,
  }),
]);

export const projectionBodySchema = z.strictObject({
  ...scenarioRef,
  uncertainty: uncertaintySchema.optional().describe("defaults to the scenario's own"),
});

export const comparisonBodySchema = z.strictObject({
  ...scenarioRef,
  rules: z.array(ruleSpecSchema).min(1).max(MAX_COMPARED_RULES).optional(),
  ruleIds: z.array(id).min(1).max(MAX_COMPARED_RULES).optional(),
  uncertainty: uncertaintySchema.optional(),
});

export const pageSchema = z.object({
  limit: z.coerce.number().int().min(1).max(1000).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});

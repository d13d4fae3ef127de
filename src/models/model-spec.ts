import { z } from "zod";
import { brokenOrder, numberSchema, orderIssue, param, paramsSchema, valueIssue } from "../params.js";
import { fail, ok, type Result } from "../result.js";
import { issueFromZod } from "../zod-issue.js";
import { FAMILY_IDS, type FamilyId, families } from "./families.js";
import type { GrowthFamily, Params } from "./growth-family.js";
import { objectIssue } from "../object-input.js";

/** Longest delay T (years) accepted in a model's density term. */
export const MAX_DELAY = 50;

/** The delay T of a model's density term, described like every other setting. */
export const DELAY = param({
  name: "delay",
  label: "delay T in the density term",
  unitKind: "years",
  description: "reproduction responds to the abundance T years earlier",
  range: { min: 0, max: MAX_DELAY, minInclusive: true },
  default: 0,
  sweep: [0, 5],
  integer: true,
});

/** A growth model as plain JSON: family, parameters by symbol, delay T in years. */
export interface ModelSpec {
  readonly family: FamilyId;
  readonly params: Params;
  readonly delay: number;
}

/** A model spec with its family resolved: what every core function takes. */
export interface Model extends ModelSpec {
  readonly growth: GrowthFamily<Params>;
}

/** The zod schema of one family's model spec. */
export function familySchema(id: FamilyId) {
  return z.strictObject({
    family: z.literal(id),
    params: paramsSchema(families[id].params),
    delay: numberSchema(DELAY).default(0),
  });
}

/** The zod schema of any model spec (a union discriminated by `family`), for JSON Schema. */
export const modelSpecSchema = z.discriminatedUnion(
  "family",
  FAMILY_IDS.map((id) => familySchema(id)) as unknown as [
    ReturnType<typeof familySchema>,
    ...ReturnType<typeof familySchema>[],
  ],
);

// Building a zod schema costs far more than using one: one per family, built on first use.
const schemas = new Map<FamilyId, ReturnType<typeof familySchema>>();
function cachedSchema(id: FamilyId): ReturnType<typeof familySchema> {
  let s = schemas.get(id);
  if (!s) schemas.set(id, (s = familySchema(id)));
  return s;
}

/**
 * Validates a model spec from untrusted input and resolves its family.
 * Fails with an issue that names the field (`model.params.K`) and its allowed range.
 */
export function parseModel(input: unknown, prefix = "model"): Result<Model> {
  const notObject = objectIssue(input, prefix);
  if (notObject) return fail(notObject);
  const family = (input as { family?: unknown }).family;
  if (family === undefined) return fail({ code: "missing_field", field: `${prefix}.family` });
  if (typeof family !== "string" || !(FAMILY_IDS as readonly string[]).includes(family)) {
    return fail({
      code: "unknown_family",
      field: `${prefix}.family`,
      value: String(family),
      allowed: FAMILY_IDS,
    });
  }
  const id = family as FamilyId;
  const growth = families[id];
  const parsed = cachedSchema(id).safeParse(input);
  if (!parsed.success) {
    return fail(
      issueFromZod(
        parsed.error,
        input,
        (path) => (path[0] === "params" ? growth.params.find((p) => p.name === path[1]) : undefined),
        prefix,
      ),
    );
  }
  const params = parsed.data.params as Params;
  const broken = brokenOrder(growth.constraints, params);
  if (broken) return fail(orderIssue(broken, params, `${prefix}.params`));
  return ok({ family: id, params, delay: parsed.data.delay, growth });
}

/**
 * The model with new parameter values, checked against each parameter's range and the
 * family's cross-parameter constraints without re-parsing the spec (fast enough for tens
 * of thousands of parameter draws). Fails naming `${prefix}.${name}`.
 */
export function withParams(model: Model, params: Params, prefix = "model.params"): Result<Model> {
  for (const info of model.growth.params) {
    const issue = valueIssue(info, params[info.name], `${prefix}.${info.name}`);
    if (issue) return fail(issue);
  }
  const broken = brokenOrder(model.growth.constraints, params);
  if (broken) return fail(orderIssue(broken, params, prefix));
  return ok({ ...model, params });
}

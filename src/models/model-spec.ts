import { z } from "zod";
import type { Issue } from "../issues.js";
import { paramsSchema } from "../params.js";
import { fail, ok, type Result } from "../result.js";
import { issueFromZod } from "../zod-issue.js";
import { families } from "./families.js";
import { FAMILY_IDS, type FamilyId, type GrowthFamily, type Params } from "./growth-family.js";

/** Longest delay T (years) accepted in a model's density term. */
export const MAX_DELAY = 50;

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
    delay: z.int().min(0).max(MAX_DELAY).default(0).describe("delay T in the density term [years]"),
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
  if (input === null || typeof input !== "object" || Array.isArray(input)) {
    return fail({
      code: "wrong_type",
      field: prefix,
      expected: "object",
      received: input === null ? "null" : Array.isArray(input) ? "array" : typeof input,
    });
  }
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
  const broken = checkConstraints(growth, params, prefix);
  if (broken) return fail(broken);
  return ok({ family: id, params, delay: parsed.data.delay, growth });
}

function checkConstraints(growth: GrowthFamily<Params>, p: Params, prefix: string): Issue | undefined {
  for (const c of growth.constraints) {
    if (!c.holds(p))
      return { code: "constraint_violated", field: `${prefix}.${c.field}`, constraint: c.text };
  }
  return undefined;
}

/**
 * The model with new parameter values, checked against each parameter's range and the
 * family's cross-parameter constraints without re-parsing the spec (fast enough for tens
 * of thousands of parameter draws). Fails naming `${prefix}.${name}`.
 */
export function withParams(model: Model, params: Params, prefix = "model.params"): Result<Model> {
  for (const info of model.growth.params) {
    const v = params[info.name];
    const field = `${prefix}.${info.name}`;
    if (v === undefined) return fail({ code: "missing_field", field });
    if (!Number.isFinite(v)) return fail({ code: "not_finite", field, received: String(v) });
    const below = info.minInclusive ? v < info.min : v <= info.min;
    const above = info.maxInclusive ? v > info.max : v >= info.max;
    if (below || above)
      return fail({
        code: "param_out_of_range",
        field,
        value: v,
        min: info.min,
        max: info.max,
        minInclusive: info.minInclusive,
        maxInclusive: info.maxInclusive,
      });
  }
  for (const c of model.growth.constraints)
    if (!c.holds(params))
      return fail({
        code: "constraint_violated",
        field: `${prefix}.${c.field.replace(/^params\./, "")}`,
        constraint: c.text,
      });
  return ok({ ...model, params });
}

import type { Model } from "../models/model-spec.js";
import { MAX_DELAY } from "../models/model-spec.js";
import type { ParamInfo } from "../params.js";
import { buildHarvest, MAX_SURVEY_LAG, RULE_SETTINGS, type Rule } from "../policy/rule-spec.js";
import { fail, ok, type Result } from "../result.js";

/** A parameter that margins, diagrams and maps can vary, with its allowed range. */
export interface ParameterAxis {
  /** `model.params.r`, `model.delay`, `rule.rate`, `rule.surveyLag`, … */
  readonly path: string;
  readonly min: number;
  readonly max: number;
  readonly minInclusive: boolean;
  readonly maxInclusive: boolean;
  readonly integer: boolean;
  readonly current: number;
}

/** The parameters of this model and rule that can be varied. */
export function parameterPaths(model: Model, rule: Rule): string[] {
  const paths = model.growth.params.map((p) => `model.params.${p.name}`);
  paths.push("model.delay");
  for (const key of Object.keys(rule))
    if (key in RULE_SETTINGS && typeof (rule as Record<string, unknown>)[key] === "number")
      paths.push(`rule.${key}`);
  paths.push("rule.surveyLag");
  return paths;
}

/** The allowed range and current value of a parameter path, or an issue naming it. */
export function parameterAxis(
  model: Model,
  rule: Rule,
  path: string,
  field = "parameter",
): Result<ParameterAxis> {
  const allowed = parameterPaths(model, rule);
  if (!allowed.includes(path)) return fail({ code: "unknown_option", field, value: path, allowed });
  if (path === "model.delay")
    return ok({
      path,
      min: 0,
      max: MAX_DELAY,
      minInclusive: true,
      maxInclusive: true,
      integer: true,
      current: model.delay,
    });
  if (path === "rule.surveyLag")
    return ok({
      path,
      min: 0,
      max: MAX_SURVEY_LAG,
      minInclusive: true,
      maxInclusive: true,
      integer: true,
      current: rule.surveyLag,
    });
  const info = infoOf(model, path);
  const current = path.startsWith("model.")
    ? model.params[info.name]!
    : ((rule as Record<string, unknown>)[info.name] as number);
  return ok({
    path,
    min: info.min,
    max: info.max,
    minInclusive: info.minInclusive,
    maxInclusive: info.maxInclusive,
    integer: false,
    current,
  });
}

function infoOf(model: Model, path: string): ParamInfo {
  const name = path.split(".").pop()!;
  const info = path.startsWith("model.params.")
    ? model.growth.params.find((p) => p.name === name)
    : RULE_SETTINGS[name];
  if (!info) throw new Error(`parameterAxis: no info for ${path}`);
  return info;
}

/**
 * The model and rule with one parameter set to a new value, checked against the
 * parameter's range and the cross-parameter constraints (A < K, lower < upper trigger),
 * without re-parsing the whole spec (cheap enough for every cell of a regime map).
 */
export function withParameter(
  model: Model,
  rule: Rule,
  axis: ParameterAxis,
  value: number,
): Result<{ model: Model; rule: Rule }> {
  const field = axis.path;
  if (!Number.isFinite(value)) return fail({ code: "not_finite", field, received: String(value) });
  if (axis.integer && !Number.isInteger(value)) return fail({ code: "not_an_integer", field, value });
  const below = axis.minInclusive ? value < axis.min : value <= axis.min;
  const above = axis.maxInclusive ? value > axis.max : value >= axis.max;
  if (below || above) {
    return fail({
      code: "param_out_of_range",
      field,
      value,
      min: axis.min,
      max: axis.max,
      minInclusive: axis.minInclusive,
      maxInclusive: axis.maxInclusive,
    });
  }
  if (field === "model.delay") return ok({ model: { ...model, delay: value }, rule });
  if (field.startsWith("model.params.")) {
    const params = { ...model.params, [field.slice("model.params.".length)]: value };
    for (const c of model.growth.constraints)
      if (!c.holds(params))
        return fail({ code: "constraint_violated", field: `model.${c.field}`, constraint: c.text });
    return ok({ model: { ...model, params }, rule });
  }
  const spec = { ...rule, [field.slice("rule.".length)]: value } as Rule & Record<string, unknown>;
  if (spec.kind === "threshold" && !(spec.lowerTrigger < spec.upperTrigger)) {
    return fail({
      code: "constraint_violated",
      field: "rule.upperTrigger",
      constraint: "the upper trigger must be above the lower trigger",
    });
  }
  (spec as { harvest: Rule["harvest"] }).harvest = buildHarvest(spec);
  return ok({ model, rule: spec });
}

import { DELAY, type Model } from "../models/model-spec.js";
import { brokenOrder, orderIssue, type ParamInfo, valueIssue } from "../params.js";
import { RULE_CATALOGUE, RULE_SETTINGS } from "../policy/rule-catalogue.js";
import { buildHarvest, type Rule } from "../policy/rule-spec.js";
import { fail, ok, type Result } from "../result.js";

/** A parameter that margins, diagrams and maps can vary, with its description and current value. */
export interface ParameterAxis {
  /** `model.params.r`, `model.delay`, `rule.rate`, `rule.surveyLag`, … */
  readonly path: string;
  /** The catalogue's description of the parameter (range, unit kind, label). */
  readonly info: ParamInfo;
  readonly min: number;
  readonly max: number;
  readonly minInclusive: boolean;
  readonly maxInclusive: boolean;
  readonly integer: boolean;
  readonly current: number;
}

/** Every parameter of this model and rule that can be varied, with its catalogue description. */
function variable(model: Model, rule: Rule): Map<string, ParamInfo> {
  const out = new Map<string, ParamInfo>();
  for (const p of model.growth.params) out.set(`model.params.${p.name}`, p);
  out.set("model.delay", DELAY);
  for (const s of RULE_CATALOGUE[rule.kind].settings) out.set(`rule.${s}`, RULE_SETTINGS[s]);
  out.set("rule.stocking", RULE_SETTINGS.stocking);
  out.set("rule.surveyLag", RULE_SETTINGS.surveyLag);
  return out;
}

/** The parameters of this model and rule that can be varied. */
export function parameterPaths(model: Model, rule: Rule): string[] {
  return [...variable(model, rule).keys()];
}

/** The allowed range and current value of a parameter path, or an issue naming it. */
export function parameterAxis(
  model: Model,
  rule: Rule,
  path: string,
  field = "parameter",
): Result<ParameterAxis> {
  const infos = variable(model, rule);
  const info = infos.get(path);
  if (!info) return fail({ code: "unknown_option", field, value: path, allowed: [...infos.keys()] });
  const current =
    path === "model.delay"
      ? model.delay
      : path.startsWith("model.params.")
        ? model.params[info.name]!
        : ((rule as unknown as Record<string, number>)[info.name] ?? 0);
  const { min, max, minInclusive, maxInclusive, integer } = info;
  return ok({ path, info, min, max, minInclusive, maxInclusive, integer, current });
}

/**
 * The model and rule with one parameter set to a new value, checked against the
 * parameter's range and the catalogue's order constraints (A < K, lower < upper trigger),
 * without re-parsing the whole spec (cheap enough for every cell of a regime map).
 */
export function withParameter(
  model: Model,
  rule: Rule,
  axis: ParameterAxis,
  value: number,
): Result<{ model: Model; rule: Rule }> {
  const field = axis.path;
  const issue = valueIssue(axis.info, value, field);
  if (issue) return fail(issue);
  if (field === "model.delay") return ok({ model: { ...model, delay: value }, rule });
  if (field.startsWith("model.params.")) {
    const params = { ...model.params, [axis.info.name]: value };
    const broken = brokenOrder(model.growth.constraints, params);
    if (broken) return fail(orderIssue(broken, params, "model.params"));
    return ok({ model: { ...model, params }, rule });
  }
  const spec = { ...rule, [axis.info.name]: value } as Rule;
  const broken = brokenOrder(RULE_CATALOGUE[spec.kind].constraints, spec);
  if (broken) return fail(orderIssue(broken, spec, "rule"));
  return ok({ model, rule: { ...spec, harvest: buildHarvest(spec) } });
}

import { analyseStability } from "../equilibria/stability.js";
import { stabilityMargin, type StabilityMargin } from "../equilibria/margin.js";
import type { StabilityKind } from "../equilibria/classify.js";
import { closedLoop } from "../policy/closed-loop.js";
import { RULE_CATALOGUE } from "../policy/rule-catalogue.js";
import { parseRule, type Rule } from "../policy/rule-spec.js";
import { fail, ok, type Result } from "../result.js";
import type { StochasticProjection } from "./risk-metrics.js";
import type { Scenario } from "./scenario.js";
import { projectStochastic } from "./stochastic-projection.js";
import type { Uncertainty } from "./uncertainty.js";

/** Most candidate rules in one comparison. */
export const MAX_COMPARED_RULES = 12;

/** One candidate rule's deterministic verdict, margin and stochastic outcome. */
export interface RuleOutcome {
  readonly rule: Rule;
  /** The operating equilibrium's kind, or "collapse" when there is no positive equilibrium. */
  readonly verdict: StabilityKind | "collapse";
  readonly verdictLabel: string;
  readonly equilibrium: number | null;
  readonly margin: StabilityMargin | null;
  readonly projection: StochasticProjection;
}

/** Validates a list of candidate rule specs, naming `rules[i].field` on failure. */
export function parseRules(input: unknown, field = "rules"): Result<Rule[]> {
  if (!Array.isArray(input))
    return fail({
      code: "wrong_type",
      field,
      expected: "array of rule specs",
      received: input === null ? "null" : typeof input,
    });
  if (input.length < 1 || input.length > MAX_COMPARED_RULES) {
    return fail({
      code: "constraint_violated",
      field,
      constraint: `give between 1 and ${MAX_COMPARED_RULES} rules`,
    });
  }
  const out: Rule[] = [];
  for (let i = 0; i < input.length; i++) {
    const r = parseRule(input[i], `${field}[${i}]`);
    if (!r.ok) return r;
    out.push(r.value);
  }
  return ok(out);
}

/**
 * The deterministic side of a rule comparison: the scenario model's operating equilibrium
 * under the rule (analyseStability), its verdict in plain words, and the stability margin
 * in the rule's main setting (the catalogue's `main`; stabilityMargin). Runs in a few
 * milliseconds; the stochastic side (one projection per rule on the same seed, hence the
 * same draws) is run by the caller, in-thread or on the worker pool, and joined here.
 */
export function ruleOutcome(scenario: Scenario, rule: Rule, projection: StochasticProjection): RuleOutcome {
  const analysis = analyseStability(closedLoop(scenario.model, rule));
  const op = analysis.operating === null ? null : analysis.equilibria[analysis.operating]!;
  const margin = stabilityMargin(scenario.model, rule, RULE_CATALOGUE[rule.kind].main);
  return {
    rule,
    verdict: op ? op.verdict.kind : "collapse",
    verdictLabel: op ? op.verdict.label : "no positive equilibrium: the stock collapses",
    equilibrium: op ? op.equilibrium.abundance : null,
    margin: margin.ok ? margin.value : null,
    projection,
  };
}

/**
 * Compares candidate rules on the scenario's model under the same uncertainty and seed,
 * so every rule sees the same random draws (common random numbers): differences between
 * rows are due to the rules, not to luck. On the calling thread; the worker pool's
 * compareRules gives the same numbers.
 */
export function compareRules(
  scenario: Scenario,
  rules: readonly Rule[],
  uncertainty: Uncertainty,
): RuleOutcome[] {
  return rules.map((rule) => ruleOutcome(scenario, rule, projectStochastic(scenario, uncertainty, { rule })));
}

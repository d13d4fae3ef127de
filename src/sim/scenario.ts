import { z } from "zod";
import type { Issue } from "../issues.js";
import { parseModel, type Model } from "../models/model-spec.js";
import { MAX_ABUNDANCE } from "../params.js";
import { closedLoop, type ClosedLoop } from "../policy/closed-loop.js";
import { parseRule, type Rule } from "../policy/rule-spec.js";
import { fail, ok, type Result } from "../result.js";
import { objectIssue } from "../object-input.js";

/** Longest projection horizon, in years. */
export const MAX_HORIZON = 1000;

/** A deterministic scenario: model, rule, start abundance (with optional history), horizon. */
export interface Scenario {
  readonly model: Model;
  readonly rule: Rule;
  /** start[0] = N in the first year; start[k] = N k years before it (for delays and lags). */
  readonly start: readonly number[];
  readonly horizon: number;
  readonly startYear: number;
  readonly loop: ClosedLoop;
}

const startSchema = z.union([
  z.number().min(0).max(MAX_ABUNDANCE),
  z.array(z.number().min(0).max(MAX_ABUNDANCE)).min(1).max(101),
]);

/**
 * Validates a scenario from untrusted input: `{ model, rule, start, horizon, startYear? }`.
 * Fails with an issue naming the field, such as `start[1]` or `horizon`.
 */
export function parseScenario(input: unknown): Result<Scenario> {
  const notObject = objectIssue(input, "(scenario)");
  if (notObject) return fail(notObject);
  const raw = input as Record<string, unknown>;
  const model = parseModel(raw.model, "model");
  if (!model.ok) return model;
  const rule = parseRule(raw.rule, "rule");
  if (!rule.ok) return rule;
  const start = checkStart(raw.start);
  if (!start.ok) return start;
  const horizon = checkInteger(raw.horizon, "horizon", 1, MAX_HORIZON);
  if (!horizon.ok) return horizon;
  const startYear =
    raw.startYear === undefined ? ok(0) : checkInteger(raw.startYear, "startYear", -100000, 100000);
  if (!startYear.ok) return startYear;
  for (const key of Object.keys(raw)) {
    if (!["model", "rule", "start", "horizon", "startYear"].includes(key))
      return fail({ code: "unknown_field", field: key });
  }
  return ok({
    model: model.value,
    rule: rule.value,
    start: start.value,
    horizon: horizon.value,
    startYear: startYear.value,
    loop: closedLoop(model.value, rule.value),
  });
}

function checkStart(v: unknown): Result<number[]> {
  if (v === undefined) return fail({ code: "missing_field", field: "start" });
  const parsed = startSchema.safeParse(v);
  if (parsed.success) return ok(typeof parsed.data === "number" ? [parsed.data] : parsed.data);
  const values = Array.isArray(v) ? v : [v];
  if (values.length === 0)
    return fail({
      code: "constraint_violated",
      field: "start",
      constraint: "give at least one start abundance",
    });
  if (values.length > 101)
    return fail({
      code: "constraint_violated",
      field: "start",
      constraint: "at most 101 values (the start and 100 years of history)",
    });
  for (let i = 0; i < values.length; i++) {
    const field = Array.isArray(v) ? `start[${i}]` : "start";
    const issue = abundanceIssue(values[i], field);
    if (issue) return fail(issue);
  }
  return fail({
    code: "wrong_type",
    field: "start",
    expected: "a number or an array of numbers",
    received: typeof v,
  });
}

function abundanceIssue(x: unknown, field: string): Issue | undefined {
  if (typeof x !== "number")
    return { code: "wrong_type", field, expected: "number", received: x === null ? "null" : typeof x };
  if (!Number.isFinite(x)) return { code: "not_finite", field, received: String(x) };
  if (x < 0 || x > MAX_ABUNDANCE) {
    return {
      code: "param_out_of_range",
      field,
      value: x,
      min: 0,
      max: MAX_ABUNDANCE,
      minInclusive: true,
      maxInclusive: true,
    };
  }
  return undefined;
}

function checkInteger(v: unknown, field: string, min: number, max: number): Result<number> {
  if (v === undefined) return fail({ code: "missing_field", field });
  if (typeof v !== "number")
    return fail({ code: "wrong_type", field, expected: "integer", received: v === null ? "null" : typeof v });
  if (!Number.isFinite(v)) return fail({ code: "not_finite", field, received: String(v) });
  if (!Number.isInteger(v)) return fail({ code: "not_an_integer", field, value: v });
  if (v < min || v > max)
    return fail({
      code: "param_out_of_range",
      field,
      value: v,
      min,
      max,
      minInclusive: true,
      maxInclusive: true,
    });
  return ok(v);
}

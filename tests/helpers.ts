import { expect } from "vitest";
import { parseModel, type Model } from "../src/models/model-spec.js";
import { parseRule, type Rule, type RuleSpecInput } from "../src/policy/rule-spec.js";
import type { Result } from "../src/result.js";

/** Unwraps a Result that a test expects to succeed, failing with the issue otherwise. */
export function unwrap<T>(r: Result<T>): T {
  if (!r.ok) throw new Error(`expected ok, got issue ${JSON.stringify(r.issue)}`);
  return r.value;
}

/** A validated model from a family, parameters and delay. */
export function model(family: string, params: Record<string, number>, delay = 0): Model {
  return unwrap(parseModel({ family, params, delay }));
}

/** A validated rule. */
export function rule(spec: RuleSpecInput): Rule {
  return unwrap(parseRule(spec));
}

/**
 * Asserts |actual − expected| ≤ tol·max(1, |expected|) and prints input, expected, actual,
 * delta and tol on failure.
 */
export function expectClose(actual: number, expected: number, tol: number, what: string): void {
  const delta = Math.abs(actual - expected);
  const bound = tol * Math.max(1, Math.abs(expected));
  expect(
    delta <= bound,
    `${what}: expected ${expected}, actual ${actual}, delta ${delta}, tol ${bound}`,
  ).toBe(true);
}

// Specs from request bodies: validated by src/ (whose issues name the exact field) and
// normalised to plain JSON for storage.
import { createHash } from "node:crypto";
import type { Model } from "../../src/models/model-spec.js";
import type { Rule } from "../../src/policy/rule-spec.js";
import { fail, ok, type Result } from "../../src/result.js";
import { parseScenario, type Scenario } from "../../src/sim/scenario.js";
import { parseUncertainty, type Uncertainty } from "../../src/sim/uncertainty.js";
import type { Repository } from "../store/repository.js";
import { objectIssue } from "../../src/object-input.js";

export function modelJson(m: Model) {
  return { family: m.family, params: { ...m.params }, delay: m.delay };
}

export function ruleJson(r: Rule): Record<string, unknown> {
  const { harvest: _h, ...spec } = r;
  return spec;
}

export interface ScenarioInput {
  /** The normalised scenario spec (model, rule, start, horizon, startYear, uncertainty?). */
  readonly spec: Record<string, unknown>;
  readonly scenario: Scenario;
  /** The scenario's own uncertainty, when it has one. */
  readonly uncertainty: unknown;
  readonly scenarioId: string | null;
}

/** Validates a scenario spec (with its optional uncertainty), naming fields under `prefix`. */
export function parseScenarioSpec(
  input: unknown,
  prefix = "scenario",
): Result<{ spec: Record<string, unknown>; scenario: Scenario }> {
  const notObject = objectIssue(input, prefix);
  if (notObject) return fail(notObject);
  const { uncertainty, ...rest } = input as Record<string, unknown>;
  const sc = parseScenario(rest);
  if (!sc.ok)
    return fail(
      "field" in sc.issue
        ? ({ ...sc.issue, field: `${prefix}.${sc.issue.field}` } as typeof sc.issue)
        : sc.issue,
    );
  if (uncertainty !== undefined) {
    const u = parseUncertainty(uncertainty, sc.value.model, `${prefix}.uncertainty`);
    if (!u.ok) return u;
  }
  const s = sc.value;
  const spec: Record<string, unknown> = {
    model: modelJson(s.model),
    rule: ruleJson(s.rule),
    start: [...s.start],
    horizon: s.horizon,
    startYear: s.startYear,
  };
  if (uncertainty !== undefined) spec.uncertainty = uncertainty;
  return ok({ spec, scenario: s });
}

/** The scenario of a request body: `scenarioId` (stored) or `scenario` (inline), exactly one. */
export function scenarioFrom(
  body: Record<string, unknown>,
  repo: Repository,
): Result<ScenarioInput> | "not-found" {
  if ((body.scenarioId === undefined) === (body.scenario === undefined)) {
    return fail({
      code: "constraint_violated",
      field: "scenarioId",
      constraint: "give either scenarioId (a stored scenario) or scenario (inline), not both or neither",
    });
  }
  let raw: unknown = body.scenario;
  let prefix = "scenario";
  let scenarioId: string | null = null;
  if (body.scenarioId !== undefined) {
    if (typeof body.scenarioId !== "string")
      return fail({
        code: "wrong_type",
        field: "scenarioId",
        expected: "string",
        received: typeof body.scenarioId,
      });
    const rec = repo.getSpec("scenario", body.scenarioId);
    if (!rec) return "not-found";
    raw = rec.spec;
    prefix = "scenarioId";
    scenarioId = rec.id;
  }
  const parsed = parseScenarioSpec(raw, prefix);
  if (!parsed.ok) return parsed;
  return ok({
    spec: parsed.value.spec,
    scenario: parsed.value.scenario,
    uncertainty: parsed.value.spec.uncertainty,
    scenarioId,
  });
}

/** The uncertainty of a projection: the body's, else the scenario's own. */
export function uncertaintyFrom(
  body: Record<string, unknown>,
  input: ScenarioInput,
): Result<{ raw: unknown; value: Uncertainty }> {
  const raw = body.uncertainty ?? input.uncertainty;
  if (raw === undefined) return fail({ code: "missing_field", field: "uncertainty" });
  const u = parseUncertainty(raw, input.scenario.model, "uncertainty");
  if (!u.ok) return u;
  return ok({ raw, value: u.value });
}

/** SHA-256 of a value's JSON (the content hash in a result's provenance). */
export function contentHash(value: unknown): string {
  return createHash("sha256").update(JSON.stringify(value)).digest("hex");
}

/** A scenario spec without its uncertainty (what parseScenario and the worker pool take). */
export function scenarioOnly(spec: Record<string, unknown>): Record<string, unknown> {
  const { uncertainty: _u, ...rest } = spec;
  return rest;
}

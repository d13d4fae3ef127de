import { describe, expect, it } from "vitest";
import { describeIssue, type Issue } from "../src/issues.js";
import { parseModel } from "../src/models/model-spec.js";
import { parseRule } from "../src/policy/rule-spec.js";
import { parseScenario } from "../src/sim/scenario.js";
import { project } from "../src/sim/project.js";
import { unwrap } from "./helpers.js";

// Bad input gets a typed issue naming the field and, for ranges, the allowed range.
// The ranges asserted here are the documented ones in src/models/*.ts and rule-spec.ts.

describe("model spec validation", () => {
  it("an unknown family lists the allowed ones", () => {
    const r = parseModel({ family: "logistik", params: { r: 1, K: 10 } });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.issue).toMatchObject({ code: "unknown_family", field: "model.family", value: "logistik" });
    expect(describeIssue(r.issue)).toContain("ricker");
  });

  it("a missing parameter is named", () => {
    const r = parseModel({ family: "ricker", params: { r: 1 } });
    expect(r).toEqual({ ok: false, issue: { code: "missing_field", field: "model.params.K" } });
  });

  it("K ≤ 0 names the field and the range (0, 1e12]", () => {
    const r = parseModel({ family: "ricker", params: { r: 1, K: 0 } });
    expect(r).toEqual({
      ok: false,
      issue: {
        code: "param_out_of_range",
        field: "model.params.K",
        value: 0,
        min: 0,
        max: 1e12,
        minInclusive: false,
        maxInclusive: true,
      },
    });
    if (!r.ok)
      expect(describeIssue(r.issue)).toBe(
        "model.params.K = 0 is outside the allowed range (0, 1000000000000]",
      );
  });

  it("NaN and Infinity are refused as not finite", () => {
    for (const bad of [Number.NaN, Infinity, -Infinity]) {
      const r = parseModel({ family: "beverton-holt", params: { R0: bad, K: 10 } });
      expect(r.ok || r.issue).toEqual({
        code: "not_finite",
        field: "model.params.R0",
        received: String(bad),
      });
    }
  });

  it("a string where a number belongs is a wrong type", () => {
    const r = parseModel({ family: "ricker", params: { r: "1.2", K: 100 } });
    expect(r.ok || r.issue).toEqual({
      code: "wrong_type",
      field: "model.params.r",
      expected: "number",
      received: "string",
    });
  });

  it("a negative or fractional delay is refused", () => {
    expect(parseModel({ family: "ricker", params: { r: 1, K: 100 }, delay: -1 }).ok).toBe(false);
    const frac = parseModel({ family: "ricker", params: { r: 1, K: 100 }, delay: 1.5 });
    expect(frac.ok || frac.issue).toMatchObject({ field: "model.delay" });
  });

  it("an unknown parameter is named, not silently ignored", () => {
    const r = parseModel({ family: "ricker", params: { r: 1, K: 100, q: 2 } });
    expect(r.ok || r.issue).toEqual({ code: "unknown_field", field: "model.params.q" });
  });

  it("a cross-parameter constraint (Allee threshold A < K) is checked", () => {
    const r = parseModel({ family: "allee-ricker", params: { r: 1, K: 100, A: 150 } });
    expect(r.ok || r.issue).toEqual({
      code: "settings_out_of_order",
      field: "model.params.A",
      value: 150,
      other: "model.params.K",
      otherValue: 100,
      relation: "below",
    });
    expect(describeIssue((r as { issue: Issue }).issue)).toBe(
      "model.params.A = 150 must be below model.params.K = 100",
    );
  });
});

describe("rule spec validation", () => {
  it("an unknown rule kind lists the allowed ones", () => {
    const r = parseRule({ kind: "fixed-effort" });
    expect(r.ok || r.issue).toMatchObject({
      code: "unknown_rule",
      field: "rule.kind",
      value: "fixed-effort",
    });
  });

  it("a harvest rate h ≥ 1 names the range [0, 1)", () => {
    const r = parseRule({ kind: "constant-rate", rate: 1 });
    expect(r.ok || r.issue).toEqual({
      code: "param_out_of_range",
      field: "rule.rate",
      value: 1,
      min: 0,
      max: 1,
      minInclusive: true,
      maxInclusive: false,
    });
  });

  it("a negative survey lag is refused", () => {
    const r = parseRule({ kind: "constant-rate", rate: 0.2, surveyLag: -2 });
    expect(r.ok || r.issue).toMatchObject({ code: "param_out_of_range", field: "rule.surveyLag", value: -2 });
  });

  it("an unknown timing lists before and after", () => {
    const r = parseRule({ kind: "constant-rate", rate: 0.2, timing: "during" });
    expect(r.ok || r.issue).toEqual({
      code: "unknown_option",
      field: "rule.timing",
      value: "during",
      allowed: ["before", "after"],
    });
  });

  it("threshold triggers out of order are refused", () => {
    const r = parseRule({ kind: "threshold", lowerTrigger: 500, upperTrigger: 200, maxRate: 0.2 });
    expect(r.ok || r.issue).toEqual({
      code: "settings_out_of_order",
      field: "rule.upperTrigger",
      value: 200,
      other: "rule.lowerTrigger",
      otherValue: 500,
      relation: "above",
    });
  });

  it("a missing setting of the chosen rule is named", () => {
    expect(parseRule({ kind: "constant-catch" })).toEqual({
      ok: false,
      issue: { code: "missing_field", field: "rule.quota" },
    });
  });
});

describe("scenario validation and unbounded runs", () => {
  const base = {
    model: { family: "ricker", params: { r: 1, K: 100 } },
    rule: { kind: "no-harvest" },
    start: 50,
    horizon: 10,
  };

  it("names a bad start value by its index", () => {
    const r = parseScenario({ ...base, start: [50, -3] });
    expect(r.ok || r.issue).toMatchObject({ code: "param_out_of_range", field: "start[1]", value: -3 });
  });

  it("refuses a fractional or missing horizon", () => {
    expect(parseScenario({ ...base, horizon: 2.5 }).ok).toBe(false);
    const { horizon: _h, ...noHorizon } = base;
    expect(parseScenario(noHorizon)).toEqual({
      ok: false,
      issue: { code: "missing_field", field: "horizon" },
    });
  });

  it("an exploding run is reported as unbounded with only finite numbers", () => {
    // Log-linear Gompertz with r = 2.9: ln N − ln K is multiplied by 1 − r = −1.9 each year,
    // so the abundance leaves every bound within a few dozen years.
    const p = project(
      unwrap(
        parseScenario({
          model: { family: "gompertz", params: { r: 2.9, K: 100 } },
          rule: { kind: "no-harvest" },
          start: 50,
          horizon: 500,
        }),
      ),
    );
    expect(p.status).toBe("unbounded");
    expect(p.years.length).toBeLessThan(500);
    for (const series of [p.abundance, p.catch, p.survey, p.quota]) {
      for (const v of series) expect(Number.isFinite(v)).toBe(true);
    }
  });
});

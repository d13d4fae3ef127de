import { afterAll, describe, expect, it } from "vitest";
import { scenarioSpec, testRuntime } from "./helpers.js";

// Every error is an RFC 9457 problem (application/problem+json with type, title, status,
// detail) that names the failing field or CSV row and column, and stores nothing.
const { rt, api } = testRuntime();
afterAll(() => rt.close());

const problem = (
  r: { status: number; headers: Record<string, string>; body: Record<string, unknown> },
  status: number,
) => {
  expect(r.status).toBe(status);
  expect(r.headers["content-type"]).toMatch(/^application\/problem\+json/);
  expect(r.body).toHaveProperty("type");
  expect(r.body).toHaveProperty("title");
  expect(r.body.status).toBe(status);
  expect(typeof r.body.detail).toBe("string");
  expect(JSON.stringify(r.body)).not.toMatch(/at .*\.ts:\d+/); // no stack trace
  return r.body;
};

describe("malformed and oversized bodies", () => {
  it("malformed JSON is 400", async () => {
    const r = await api
      .post("/api/v1/scenarios")
      .set("Content-Type", "application/json")
      .send('{"name": "x", "spec": {');
    expect(problem(r, 400).type).toBe("urn:yieldloop:problem:malformed-json");
  });
  it("a JSON body over 1 MB is 413, a CSV over 2 MB too", async () => {
    const big = JSON.stringify({ name: "x", spec: { pad: "x".repeat(1_100_000) } });
    problem(await api.post("/api/v1/scenarios").set("Content-Type", "application/json").send(big), 413);
    const csv = `year,count\n${Array.from({ length: 200_000 }, (_, i) => `${1000 + i},123456.789`).join("\n")}`;
    problem(await api.post("/api/v1/series?name=big").set("Content-Type", "text/csv").send(csv), 413);
  });
  it("a body that is not an object, or not JSON, is refused", async () => {
    // RFC 9110 §15.5.1: a request the server cannot read as one is a 400 (Bad Request).
    const notObject = problem(await api.post("/api/v1/scenarios").send([1, 2]), 400);
    expect(notObject).toMatchObject({
      type: "urn:yieldloop:problem:body-not-object",
      issue: { code: "body_not_object", received: "array" },
    });
    problem(await api.post("/api/v1/scenarios").set("Content-Type", "application/xml").send("<a/>"), 415);
  });
});

describe("fields are named, with the allowed range", () => {
  it("a name that is too long says how long it is and the limit", async () => {
    const b = problem(
      await api.post("/api/v1/rules").send({ name: "x".repeat(300), spec: { kind: "no-harvest" } }),
      422,
    );
    expect(b.issue).toEqual({
      code: "too_long",
      field: "name",
      length: 300,
      maximum: 200,
      unit: "characters",
    });
    expect(b.detail).toBe("name is 300 characters; at most 200");
  });
  it("a model parameter out of range", async () => {
    const r = await api
      .post("/api/v1/models")
      .send({ name: "m", spec: { family: "ricker", params: { r: -1, K: 1000 } } });
    const b = problem(r, 422);
    expect(b.field).toBe("spec.params.r");
    expect(b.issue).toMatchObject({ code: "param_out_of_range", min: 0, max: 10 });
    expect(b.detail).toMatch(/spec\.params\.r = -1 is outside the allowed range/);
  });
  it("wrong types and unknown fields", async () => {
    expect(
      problem(
        await api.post("/api/v1/rules").send({ name: "r", spec: { kind: "constant-rate", rate: "high" } }),
        422,
      ).field,
    ).toBe("spec.rate");
    expect(
      problem(await api.post("/api/v1/rules").send({ name: "r", spec: { kind: "quota-ish" } }), 422).issue,
    ).toMatchObject({ code: "unknown_rule", field: "spec.kind" });
    expect(
      problem(
        await api.post("/api/v1/rules").send({ name: "r", spec: { kind: "no-harvest" }, colour: "red" }),
        422,
      ).field,
    ).toBe("colour");
    expect(problem(await api.post("/api/v1/rules").send({ spec: { kind: "no-harvest" } }), 422).field).toBe(
      "name",
    );
  });
  it("inside a scenario and its uncertainty", async () => {
    const bad = { ...scenarioSpec, rule: { ...scenarioSpec.rule, maxRate: 1.2 } };
    expect(problem(await api.post("/api/v1/scenarios").send({ name: "s", spec: bad }), 422).field).toBe(
      "spec.rule.maxRate",
    );
    const badU = { ...scenarioSpec, uncertainty: { ...scenarioSpec.uncertainty, processSd: 9 } };
    expect(problem(await api.post("/api/v1/scenarios").send({ name: "s", spec: badU }), 422).field).toBe(
      "spec.uncertainty.processSd",
    );
    expect(
      problem(await api.post("/api/v1/projections").send({ scenario: { ...scenarioSpec, horizon: 0 } }), 422)
        .field,
    ).toBe("scenario.horizon");
    const noU = { ...scenarioSpec } as Record<string, unknown>;
    delete noU.uncertainty;
    expect(problem(await api.post("/api/v1/projections").send({ scenario: noU }), 422).issue).toMatchObject({
      code: "missing_field",
      field: "uncertainty",
    });
    expect(problem(await api.post("/api/v1/analyses").send({ kind: "stability" }), 422).field).toBe(
      "scenarioId",
    );
    expect(
      problem(await api.post("/api/v1/analyses").send({ kind: "wobble", scenario: scenarioSpec }), 422).field,
    ).toBe("kind");
    expect(
      problem(
        await api
          .post("/api/v1/comparisons")
          .send({ scenario: scenarioSpec, rules: [{ kind: "constant-rate", rate: 2 }] }),
        422,
      ).field,
    ).toBe("rules[0].rate");
    expect(problem(await api.get("/api/v1/series?limit=0"), 422).field).toBe("limit");
  });
  it("CSV errors give the row and column (422)", async () => {
    const r = await api
      .post("/api/v1/series?name=bad")
      .set("Content-Type", "text/csv")
      .send("year,count,catch\n2000,10,1\n2001,ten,1\n");
    const b = problem(r, 422);
    expect(b.type).toBe("urn:yieldloop:problem:csv-cell");
    expect(b.title).toBe("The CSV could not be read");
    expect(b).toMatchObject({ row: 3, column: "count" });
    expect(b.detail).toMatch(/row 3, column "count"/);
    // Every problem is listed, row by row, with its own sentence.
    const many = problem(
      await api
        .post("/api/v1/series?name=bad")
        .set("Content-Type", "text/csv")
        .send("year,count\n2000,x\n2001,1\n2002,-1\n"),
      422,
    );
    expect((many.problems as { row: number; detail: string }[]).map((p) => p.row)).toEqual([2, 4]);
    expect((many.problems as { detail: string }[])[1]!.detail).toMatch(/row 4, column "count"/);
    const dup = problem(
      await api.post("/api/v1/series").send({ name: "dup", csv: "year,count\n2000,1\n2000,2\n" }),
      422,
    );
    expect(dup.issue).toMatchObject({ code: "csv_duplicate_year", row: 3 });
    expect(
      problem(await api.post("/api/v1/series?name=x").set("Content-Type", "text/csv").send(""), 422).detail,
    ).toMatch(/empty/);
  });
});

describe("unknown ids are 404 problems", () => {
  for (const path of [
    "series",
    "models",
    "rules",
    "scenarios",
    "fits",
    "analyses",
    "projections",
    "comparisons",
    "jobs",
  ]) {
    it(`GET /api/v1/${path}/<unknown>`, async () => {
      expect(problem(await api.get(`/api/v1/${path}/00000000-0000-0000-0000-000000000000`), 404).type).toBe(
        "urn:yieldloop:problem:not-found",
      );
    });
  }
  it("references to unknown series, scenarios and rules", async () => {
    expect(problem(await api.post("/api/v1/fits").send({ seriesId: "nope" }), 404).detail).toMatch(/series/);
    expect(problem(await api.post("/api/v1/projections").send({ scenarioId: "nope" }), 404).detail).toMatch(
      /scenario/,
    );
    expect(
      problem(await api.post("/api/v1/comparisons").send({ scenario: scenarioSpec, ruleIds: ["nope"] }), 404)
        .detail,
    ).toMatch(/rule/);
    expect(problem(await api.get("/api/v1/no-such-thing"), 404).detail).toMatch(/no route/);
  });
});

describe("nothing is stored by a refused request", () => {
  it("leaves every table empty", async () => {
    for (const table of ["series", "series_rows", "specs", "results", "jobs"]) {
      const row = rt.db.prepare(`SELECT COUNT(*) AS n FROM ${table}`).get() as { n: number };
      expect(row.n, table).toBe(0);
    }
  });
});

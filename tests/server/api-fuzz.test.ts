import fc from "fast-check";
import { afterAll, describe, expect, it } from "vitest";
import { parseSeriesCsv } from "../../src/fit/series.js";
import { parseScenarioSpec } from "../../server/http/scenario-input.js";
import type { IssueCode } from "../../src/issues.js";
import { ISSUE_TABLE } from "../../server/issue-table.js";
import { scenarioSpec, testRuntime } from "./helpers.js";

// Property-based fuzzing (fast-check) of the series and scenario endpoints: random and
// malformed inputs never give a 5xx, and whatever is stored is valid. Property: common
// practice, no source.
const { rt, api } = testRuntime();
afterAll(() => rt.close());

const cell = fc.oneof(
  fc.constantFrom(
    "",
    "NA",
    "-",
    "1e309",
    "-5",
    "0",
    "1.5",
    '"7"',
    "x,y",
    '"a""b"',
    "\r",
    "  3 ",
    "1e-320",
    "Infinity",
    "NaN",
  ),
  fc.double({ noNaN: false }).map(String),
  fc.integer({ min: -3000, max: 3000 }).map(String),
  fc.string({ maxLength: 6 }),
);
const header = fc.constantFrom(
  "year,count",
  "year,count,catch",
  "year,index,catch,stocking,cv",
  "Year,Count",
  "count,year",
  "year",
  "",
  "year,count,count",
  "year,abundance,extra",
);
const csv = fc
  .tuple(header, fc.array(fc.array(cell, { maxLength: 6 }), { maxLength: 30 }), fc.constantFrom("\n", "\r\n"))
  .map(([h, rows, eol]) => [h, ...rows.map((r) => r.join(","))].join(eol));

const number = fc.oneof(
  fc.double({ noNaN: true, noDefaultInfinity: true }),
  fc.integer(),
  fc.constantFrom(0, -0, 1e308, -1e-308, 0.5, 2, 1000),
);
const mutate = (base: Record<string, unknown>) =>
  fc
    .record({
      path: fc.constantFrom(
        "model.params.r",
        "model.params.K",
        "model.delay",
        "model.family",
        "rule.kind",
        "rule.maxRate",
        "rule.lowerTrigger",
        "rule.surveyLag",
        "start",
        "horizon",
        "startYear",
        "uncertainty.replicates",
        "uncertainty.processSd",
        "extra",
      ),
      value: fc.oneof(
        number,
        fc.string({ maxLength: 5 }),
        fc.constant(null),
        fc.array(number, { maxLength: 3 }),
        fc.boolean(),
        fc.object({ maxDepth: 1 }),
      ),
    })
    .map(({ path, value }) => {
      const copy = structuredClone(base);
      const keys = path.split(".");
      let o = copy as Record<string, unknown>;
      for (const k of keys.slice(0, -1)) o = (o[k] ??= {}) as Record<string, unknown>;
      o[keys[keys.length - 1]!] = value;
      return copy;
    });
const spec = fc.oneof(mutate(scenarioSpec), fc.anything({ maxDepth: 3 }), fc.constant(scenarioSpec));

/**
 * A problem a person can read: its status and title are the issue-table's for its code, and
 * its detail never shows a JavaScript artefact ("NaN", "undefined", "[object Object]")
 * outside the quotes around what the user sent.
 */
function readableProblem(body: {
  status: number;
  title: string;
  detail: string;
  issue: { code: IssueCode };
}) {
  expect(body.issue?.code).toBeDefined();
  expect(ISSUE_TABLE[body.issue.code]).toEqual({ status: body.status, title: body.title });
  // What the user typed is quoted ("NaN" is not a number) and may say anything.
  const own = body.detail.replace(/"(?:[^"\\]|\\.)*"/g, '""');
  expect(own, body.detail).not.toMatch(/NaN|undefined|\[object|Infinity/);
}

describe("fuzzing the series and scenario endpoints", () => {
  it("CSV uploads: never a 5xx; 201 or a 4xx problem", async () => {
    await fc.assert(
      fc.asyncProperty(csv, fc.boolean(), async (text, asJson) => {
        const r = asJson
          ? await api.post("/api/v1/series").send({ name: "f", csv: text })
          : await api.post("/api/v1/series?name=f").set("Content-Type", "text/csv").send(text);
        expect(r.status, text).toBeLessThan(500);
        if (r.status !== 201) {
          expect(r.headers["content-type"]).toMatch(/problem\+json/);
          readableProblem(r.body);
        }
      }),
      { numRuns: 1500, seed: 20261202 },
    );
  }, 120_000);

  it("scenario bodies: never a 5xx", async () => {
    await fc.assert(
      fc.asyncProperty(spec, fc.oneof(fc.string({ maxLength: 8 }), fc.constant("s")), async (s, name) => {
        const r = await api.post("/api/v1/scenarios").send({ name, spec: s });
        expect(r.status).toBeLessThan(500);
        expect([201, 400, 413, 415, 422]).toContain(r.status);
        if (r.status !== 201) readableProblem(r.body);
      }),
      { numRuns: 1500, seed: 20261203 },
    );
  }, 120_000);

  it("raw bodies of any bytes and types: never a 5xx", async () => {
    await fc.assert(
      fc.asyncProperty(
        fc.string({ maxLength: 200 }),
        fc.constantFrom("application/json", "text/csv", "text/plain", "application/octet-stream"),
        fc.constantFrom("/api/v1/series", "/api/v1/scenarios"),
        async (body, type, path) => {
          const r = await api.post(path).set("Content-Type", type).send(body);
          expect(r.status).toBeLessThan(500);
        },
      ),
      { numRuns: 500, seed: 20261204 },
    );
  }, 120_000);

  it("nothing invalid was stored", () => {
    const scenarios = rt.db.prepare("SELECT spec FROM specs WHERE kind = 'scenario'").all() as {
      spec: string;
    }[];
    expect(scenarios.length).toBeGreaterThan(0);
    for (const s of scenarios) expect(parseScenarioSpec(JSON.parse(s.spec)).ok).toBe(true);
    const series = rt.db.prepare("SELECT id, csv, years FROM series").all() as {
      id: string;
      csv: string;
      years: number;
    }[];
    expect(series.length).toBeGreaterThan(0);
    for (const s of series) {
      const parsed = parseSeriesCsv(s.csv);
      expect(parsed.ok).toBe(true);
      const rows = rt.db.prepare("SELECT COUNT(*) AS n FROM series_rows WHERE series_id = ?").get(s.id) as {
        n: number;
      };
      expect(rows.n).toBe(s.years);
    }
  });
});

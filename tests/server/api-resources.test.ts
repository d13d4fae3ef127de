import { afterAll, describe, expect, it } from "vitest";
import { jsonSafe } from "../../server/http/json-safe.js";
import { stabilityMargin } from "../../src/equilibria/margin.js";
import { analyseStability } from "../../src/equilibria/stability.js";
import { parseScenario } from "../../src/sim/scenario.js";
import { unwrap } from "../helpers.js";
import { deerCsv, finished, scenarioSpec, testRuntime } from "./helpers.js";

// Every resource route: create, get, list, delete, with stored provenance. Problem bodies
// follow RFC 9457 (type, title, status, detail); CSV follows RFC 4180 (CRLF, one header row).
const { rt, api } = testRuntime();
afterAll(() => rt.close());

describe("series", () => {
  let id = "";
  it("uploads a CSV (text/csv) and reads it back, rows and original text", async () => {
    const r = await api.post("/api/v1/series?name=deer").set("Content-Type", "text/csv").send(deerCsv);
    expect(r.status).toBe(201);
    expect(r.headers.location).toBe(`/api/v1/series/${r.body.id}`);
    expect(r.body).toMatchObject({ name: "deer", years: 28 });
    expect(r.body.contentHash).toMatch(/^[0-9a-f]{64}$/);
    id = r.body.id;
    const g = await api.get(`/api/v1/series/${id}`);
    expect(g.status).toBe(200);
    expect(g.body.rows).toHaveLength(28);
    expect(g.body.rows[0]).toEqual({ year: 2000, count: 700, catch: 60, stocking: 0, cv: null });
    const c = await api.get(`/api/v1/series/${id}/csv`);
    expect(c.headers["content-type"]).toMatch(/text\/csv/);
    expect(c.text).toBe(deerCsv);
  });
  it("uploads JSON { name, csv } too, and lists and deletes", async () => {
    const r = await api.post("/api/v1/series").send({ name: "deer again", csv: deerCsv });
    expect(r.status).toBe(201);
    const list = await api.get("/api/v1/series?limit=10");
    expect(list.body.items.map((s: { name: string }) => s.name)).toEqual(["deer", "deer again"]);
    expect((await api.delete(`/api/v1/series/${r.body.id}`)).status).toBe(204);
    expect((await api.get(`/api/v1/series/${r.body.id}`)).status).toBe(404);
    expect((await api.delete(`/api/v1/series/${r.body.id}`)).status).toBe(404);
  });
  it("fits every family to a stored series as a job, with the series hash as provenance", async () => {
    const r = await api.post("/api/v1/fits").send({
      seriesId: id,
      families: ["beverton-holt", "ricker"],
      delays: [0],
      likelihood: "poisson",
      timing: "before",
    });
    expect(r.status).toBe(202);
    const job = await finished(rt, api, r.body.job.id);
    expect(job.status).toBe("done");
    const fit = await api.get((job.links as { result: string }).result);
    expect(fit.body.result.fits).toHaveLength(2);
    const series = await api.get(`/api/v1/series/${id}`);
    expect(fit.body).toMatchObject({
      seriesId: id,
      dataHash: series.body.contentHash,
      programVersion: "0.1.0",
      seed: 1,
    });
    // The generating values (data-demo/skerra-deer/README.md): B–H R0 = 1.6, K = 2,400, within 5%.
    const bh = fit.body.result.fits.find((f: { family: string }) => f.family === "beverton-holt");
    expect(Math.abs(bh.estimates.K / 2400 - 1)).toBeLessThan(0.05);
    expect((await api.get("/api/v1/fits")).body.items).toHaveLength(1);
    // The robust verdict of a rule over the fitted models, weighted by Akaike weight
    // (src/sim/robust-verdict.ts): the weights of the classes sum to one and match the fits'.
    const rv = await api.post("/api/v1/analyses").send({
      kind: "robust",
      fitId: fit.body.id,
      scenario: {
        model: { family: "beverton-holt", params: { R0: 1.6, K: 2400 } },
        rule: { kind: "constant-catch", quota: 180, timing: "before" },
        start: 780,
        horizon: 20,
      },
    });
    expect(rv.status).toBe(201);
    const w = rv.body.result.weights as Record<string, number>;
    expect(Object.values(w).reduce((a, b) => a + b, 0)).toBeCloseTo(1, 12);
    rv.body.result.perModel.forEach((m: { weight: number }, i: number) =>
      expect(m.weight).toBeCloseTo(fit.body.result.fits[i].weight, 12),
    );
    expect(rv.body.result.summary).toMatch(/under \d+% of the weighted model set/);
    const rvt = await api.get(`/api/v1/analyses/${rv.body.id}/table.csv`);
    expect(rvt.text.split("\r\n")[0]).toBe("model,Akaike weight,behaviour under the rule,verdict");
    const table = await api.get(`/api/v1/fits/${fit.body.id}/table.csv`);
    const [head, first] = table.text.split("\r\n");
    expect(head).toBe(
      "model,AICc,delta AICc,Akaike weight,r or R0,r or R0 lower 95%,r or R0 upper 95%,K (stock units),K lower 95%,K upper 95%,MSY (stock units per year),unharvested verdict,trustworthy",
    );
    const cells = first!.split(",");
    expect(Number(cells[8])).toBeLessThan(Number(cells[7]));
    expect(Number(cells[9])).toBeGreaterThan(Number(cells[7]));
  });
});

describe("models, rules and scenarios", () => {
  for (const [path, spec] of [
    ["models", { family: "ricker", params: { r: 1.2, K: 1000 } }],
    ["rules", { kind: "constant-rate", rate: 0.2 }],
    ["scenarios", scenarioSpec],
  ] as const) {
    it(`${path}: create (normalised), get, list, delete`, async () => {
      const r = await api.post(`/api/v1/${path}`).send({ name: `a ${path}`, spec });
      expect(r.status).toBe(201);
      const g = await api.get(`/api/v1/${path}/${r.body.id}`);
      expect(g.body.name).toBe(`a ${path}`);
      if (path === "models")
        expect(g.body.spec).toEqual({ family: "ricker", params: { r: 1.2, K: 1000 }, delay: 0 });
      if (path === "rules")
        expect(g.body.spec).toMatchObject({
          kind: "constant-rate",
          rate: 0.2,
          surveyLag: 0,
          timing: "after",
          stocking: 0,
        });
      expect((await api.get(`/api/v1/${path}`)).body.items.length).toBeGreaterThan(0);
      expect((await api.delete(`/api/v1/${path}/${r.body.id}`)).status).toBe(204);
      expect((await api.get(`/api/v1/${path}/${r.body.id}`)).body).toMatchObject({
        status: 404,
        type: "urn:yieldloop:problem:not-found",
      });
    });
  }
});

describe("analyses, projections and comparisons", () => {
  let scenarioId = "";
  it("stability and margin answer at once (201) and are stored", async () => {
    scenarioId = (await api.post("/api/v1/scenarios").send({ name: "threshold", spec: scenarioSpec })).body
      .id;
    const s = await api.post("/api/v1/analyses").send({ kind: "stability", scenarioId });
    expect(s.status).toBe(201);
    expect(s.body.result.equilibria.length).toBeGreaterThan(0);
    expect(s.body.scenarioId).toBe(scenarioId);
    const m = await api
      .post("/api/v1/analyses")
      .send({ kind: "margin", scenario: scenarioSpec, parameter: "rule.maxRate" });
    expect(m.status).toBe(201);
    expect(m.body.result.parameter).toBe("rule.maxRate");
    expect(m.body.scenarioId).toBeNull();
    expect((await api.get(`/api/v1/analyses/${m.body.id}`)).body.result).toEqual(m.body.result);
    // The answer to the POST (assembled from the stored JSON text) is the stored record exactly.
    for (const created of [s, m]) {
      const { links, ...record } = created.body;
      expect(links).toEqual({
        self: `/api/v1/analyses/${created.body.id}`,
        table: `/api/v1/analyses/${created.body.id}/table.csv`,
        tableJson: `/api/v1/analyses/${created.body.id}/table.json`,
      });
      const { links: _l, ...stored } = (await api.get(`/api/v1/analyses/${created.body.id}`)).body;
      expect(record).toEqual(stored);
      expect(Object.keys(record)).toEqual([
        "id",
        "kind",
        "request",
        "result",
        "scenarioId",
        "seriesId",
        "dataHash",
        "programVersion",
        "seed",
        "createdAt",
      ]);
    }
    const t = await api.get(`/api/v1/analyses/${s.body.id}/table.csv`);
    expect(t.text.split("\r\n")[0]).toBe(
      "equilibrium (stock units),verdict,dominant eigenvalue modulus,return time (years),oscillation period (years),operating",
    );
    // A preview (a slider moving) answers 200 and stores nothing.
    const before = (await api.get("/api/v1/analyses")).body.items.length;
    const p = await api.post("/api/v1/analyses").send({ kind: "stability", scenarioId, store: false });
    expect(p.status).toBe(200);
    expect(p.body.result).toEqual(s.body.result);
    expect((await api.get("/api/v1/analyses")).body.items.length).toBe(before);
  });
  it("bifurcation diagrams and regime maps run as jobs", async () => {
    const b = await api.post("/api/v1/analyses").send({
      kind: "bifurcation",
      scenarioId,
      axis: { path: "model.params.r", from: 0.5, to: 3, count: 40 },
    });
    expect(b.status).toBe(202);
    const jb = await finished(rt, api, b.body.job.id);
    const diagram = (await api.get((jb.links as { result: string }).result)).body.result;
    expect(diagram.values).toHaveLength(40);
    const m = await api.post("/api/v1/analyses").send({
      kind: "regime-map",
      scenarioId,
      x: { path: "model.params.r", from: 0.5, to: 3, count: 12 },
      y: { path: "rule.maxRate", from: 0, to: 0.6, count: 10 },
    });
    const jm = await finished(rt, api, m.body.job.id);
    const map = (await api.get((jm.links as { result: string }).result)).body.result;
    expect(map.regimes).toHaveLength(120);
    expect(map.regimes).toContain("equilibrium");
  });
  it("a projection job stores its result with the seed, and exports CSV and JSON tables", async () => {
    const p = await api.post("/api/v1/projections").send({ scenarioId });
    expect(p.status).toBe(202);
    expect(p.headers.location).toBe(`/api/v1/jobs/${p.body.job.id}`);
    const job = await finished(rt, api, p.body.job.id);
    expect(job).toMatchObject({ status: "done", progress: 1 });
    const res = await api.get((job.links as { result: string }).result);
    expect(res.body).toMatchObject({ kind: "projection", seed: 3, scenarioId, programVersion: "0.1.0" });
    expect(res.body.result.replicates).toBe(2000);
    const id = res.body.id;
    const csv = await api.get(`/api/v1/projections/${id}/table.csv`);
    const lines = csv.text.split("\r\n");
    expect(lines[0]).toBe(
      "year,abundance p5 (stock units),abundance p10 (stock units),abundance p25 (stock units),abundance p50 (stock units),abundance p75 (stock units),abundance p90 (stock units),abundance p95 (stock units),catch p5 (stock units per year),catch p10 (stock units per year),catch p25 (stock units per year),catch p50 (stock units per year),catch p75 (stock units per year),catch p90 (stock units per year),catch p95 (stock units per year)",
    );
    expect(lines).toHaveLength(1 + 21 + 1); // header, years 0…20, and the final CRLF
    expect(lines[1]!.startsWith("0,600,600,")).toBe(true);
    const json = await api.get(`/api/v1/projections/${id}/table.json`);
    expect(json.body.rows[4][4]).toBeCloseTo(res.body.result.abundance[3][4], 6);
    const risk = await api.get(`/api/v1/projections/${id}/risk.csv`);
    expect(risk.text.split("\r\n")[1]!.startsWith("probability of falling below the limit,")).toBe(true);
  });
  it("a rule comparison by rule ids or inline rules; the same request gives the same numbers", async () => {
    const rid = (
      await api.post("/api/v1/rules").send({ name: "rate", spec: { kind: "constant-rate", rate: 0.2 } })
    ).body.id;
    const a = await api.post("/api/v1/comparisons").send({ scenarioId, ruleIds: [rid] });
    const b = await api
      .post("/api/v1/comparisons")
      .send({ scenarioId, rules: [{ kind: "constant-rate", rate: 0.2 }] });
    const ja = await finished(rt, api, a.body.job.id);
    const jb = await finished(rt, api, b.body.job.id);
    const ra = (await api.get((ja.links as { result: string }).result)).body;
    const rb = (await api.get((jb.links as { result: string }).result)).body;
    expect(ra.result).toEqual(rb.result);
    const csv = await api.get(`/api/v1/comparisons/${ra.id}/table.csv`);
    expect(
      csv.text.split("\r\n")[1]!.startsWith("constant-rate rate=0.2 catch after reproduction,stable"),
    ).toBe(true);
  });
  it("a printable report with the caution, the verdict, the charts and the provenance", async () => {
    const projections = (await api.get("/api/v1/projections")).body.items;
    const r = await api.get(`/api/v1/report?scenario=${scenarioId}&projection=${projections[0].id}`);
    expect(r.status).toBe(200);
    expect(r.headers["content-type"]).toMatch(/text\/html/);
    expect(r.headers["content-security-policy"]).toMatch(/default-src 'none'; style-src 'nonce-/);
    expect(r.text).toContain("management authority");
    expect(r.text).toContain("stable (damped oscillation)");
    expect((r.text.match(/<svg /g) ?? []).length).toBe(2);
    expect(r.text).toContain(projections[0].id);
    expect((await api.get(`/api/v1/report?scenario=${scenarioId}&projection=nope`)).status).toBe(404);
  });
});

describe("the API index and the OpenAPI document (OpenAPI 3.1)", () => {
  it("lists the resources", async () => {
    const r = await api.get("/api/v1/");
    expect(Object.keys(r.body.links)).toEqual([
      "series",
      "models",
      "rules",
      "scenarios",
      "fits",
      "analyses",
      "projections",
      "comparisons",
    ]);
  });
  it("is generated from the request schemas", async () => {
    const r = await api.get("/api/v1/openapi.json");
    expect(r.body.openapi).toBe("3.1.0");
    const post = r.body.paths["/api/v1/scenarios"].post;
    const schema = post.requestBody.content["application/json"].schema;
    expect(schema.required).toEqual(["name", "spec"]);
    // The rule settings' ranges come from the same table that validates them.
    const text = JSON.stringify(r.body.paths["/api/v1/rules"].post.requestBody);
    expect(text).toContain('"exclusiveMaximum":1');
    expect(r.body.paths["/api/v1/jobs/{id}/events"].get.responses["200"].content).toHaveProperty(
      "text/event-stream",
    );
  });
});

describe("stability results are plain JSON", () => {
  it("JSON.stringify of an analysis or a margin equals the text of its jsonSafe copy (no typed arrays, functions or built objects in it)", () => {
    for (const rule of [
      { kind: "threshold", lowerTrigger: 200, upperTrigger: 500, maxRate: 0.3, surveyLag: 2 },
      { kind: "constant-catch", quota: 100, quotaChange: { maxIncrease: 0.1, maxDecrease: 0.1 } },
    ]) {
      const sc = unwrap(
        parseScenario({
          model: { family: "ricker", params: { r: 1.5, K: 1000 }, delay: 1 },
          rule,
          start: 600,
          horizon: 10,
        }),
      );
      const a = analyseStability(sc.loop);
      expect(JSON.stringify(a)).toBe(JSON.stringify(jsonSafe(a)));
      const m = unwrap(stabilityMargin(sc.model, sc.rule, "model.params.r"));
      expect(JSON.stringify(m)).toBe(JSON.stringify(jsonSafe(m)));
    }
  });
});

// /api/v1/fits, /analyses, /projections, /comparisons: results with their provenance.
// Quick analyses (stability, margin, robust verdict) answer 201 at once, computed on the
// quick-analysis thread; long work answers 202 with a job.
import { Router, type Request, type Response } from "express";
import { parseRule } from "../../src/policy/rule-spec.js";
import type { Provenance, ResultKind } from "../store/repository.js";
import type { JobOutcome } from "../jobs/job-runner.js";
import { core, jsonObject, pageOf, parseWith, type AppContext } from "./context.js";
import { jsonSafe } from "./json-safe.js";
import { JsonText, serialise } from "./json-text.js";
import { notFound, sendIssue, sendProblem } from "./problem.js";
import {
  contentHash,
  scenarioFrom,
  scenarioOnly,
  uncertaintyFrom,
  type ScenarioInput,
} from "./scenario-input.js";
import { analysisBodySchema, comparisonBodySchema, fitBodySchema, projectionBodySchema } from "./schemas.js";

const PATHS: Record<ResultKind, string> = {
  fit: "fits",
  analysis: "analyses",
  projection: "projections",
  comparison: "comparisons",
};

export function resultLinks(kind: ResultKind, id: string): Record<string, string> {
  const self = `/api/v1/${PATHS[kind]}/${id}`;
  if (kind === "projection")
    return { self, table: `${self}/table.csv`, risk: `${self}/risk.csv`, tableJson: `${self}/table.json` };
  return { self, table: `${self}/table.csv`, tableJson: `${self}/table.json` };
}

export function resultRoutes(ctx: AppContext): Router {
  const r = Router();
  const provenance = (input: ScenarioInput | null, extra: Partial<Provenance> = {}): Provenance => ({
    scenarioId: input?.scenarioId ?? null,
    seriesId: null,
    dataHash: input ? contentHash(input.spec) : null,
    programVersion: ctx.version,
    seed: null,
    ...extra,
  });
  const accepted = (
    res: Response,
    kind: string,
    request: unknown,
    work: Parameters<AppContext["jobs"]["start"]>[2],
  ) => {
    const job = ctx.jobs.start(kind, request, work);
    res
      .status(202)
      .location(`/api/v1/jobs/${job.id}`)
      .json({ job: { ...job, links: jobLinks(job.id) } });
  };
  const scenario = (body: Record<string, unknown>, res: Response): ScenarioInput | undefined => {
    const s = scenarioFrom(body, ctx.repo);
    if (s === "not-found") {
      sendProblem(res, notFound("scenario", String(body.scenarioId)));
      return undefined;
    }
    return core(s, res);
  };
  // The body, its scenario and its uncertainty (the body's, else the scenario's own), or
  // undefined once the request has been answered with the problem.
  const simulationInput = (req: Request, res: Response) => {
    const body = jsonObject(req, res);
    if (!body) return undefined;
    const input = scenario(body, res);
    if (!input) return undefined;
    const u = core(uncertaintyFrom(body, input), res);
    return u ? { body, input, u } : undefined;
  };
  const outcome = (kind: ResultKind, result: unknown, p: Provenance): JobOutcome => ({
    ok: true,
    kind,
    result: jsonSafe(result),
    provenance: p,
  });

  r.post("/fits", (req, res) => {
    const body = jsonObject(req, res);
    if (!body) return;
    const b = parseWith(fitBodySchema, body, res);
    if (!b) return;
    const series = ctx.repo.getSeries(b.seriesId);
    if (!series) return sendProblem(res, notFound("series", b.seriesId));
    const csv = ctx.repo.seriesCsv(b.seriesId)!;
    const { seriesId: _s, ...options } = b;
    accepted(res, "fit", b, async (signal) => {
      const r2 = await ctx.pool.run({ kind: "fit-compare", csv, options }, signal);
      if (!r2.ok) return r2;
      return outcome(
        "fit",
        r2.value,
        provenance(null, { seriesId: series.id, dataHash: series.contentHash, seed: b.seed ?? 1 }),
      );
    });
  });

  r.post("/analyses", async (req, res) => {
    const body = jsonObject(req, res);
    if (!body) return;
    // The scenario first, so its issues name the exact field; then the rest of the body.
    const input = scenario(body, res);
    if (!input) return;
    const { scenario: _sc, ...rest } = body;
    const b = parseWith(analysisBodySchema, rest, res);
    if (!b) return;
    const request = { ...b, scenario: input.spec };
    if (b.kind === "stability" || b.kind === "margin" || b.kind === "robust") {
      const scenarioSpec = scenarioOnly(input.spec);
      let fit: ReturnType<typeof ctx.repo.getResult> = null;
      if (b.kind === "robust") {
        fit = ctx.repo.getResult("fit", b.fitId);
        if (!fit) return sendProblem(res, notFound("fit", b.fitId));
      }
      // Computed on the quick-analysis thread, which answers with the result's JSON text.
      const done = await ctx.quick.run(
        b.kind === "stability"
          ? { kind: "stability", scenario: scenarioSpec }
          : b.kind === "margin"
            ? { kind: "margin", scenario: scenarioSpec, parameter: b.parameter }
            : { kind: "robust", scenario: scenarioSpec, fit: fit!.result },
      );
      if (!done.ok) return sendIssue(res, done.issue);
      const result = new JsonText(done.json);
      if (b.store === false) {
        res
          .status(200)
          .type("json")
          .send(serialise({ kind: "analysis", request, result, stored: false }));
        return;
      }
      // The JSON text is made once, for the row and for the answer.
      const requestJson = JSON.stringify(request);
      const p = fit
        ? provenance(input, { seriesId: fit.seriesId, dataHash: fit.dataHash })
        : provenance(input);
      const { id, createdAt } = await ctx.repo.insertResultText("analysis", requestJson, done.json, p);
      res
        .status(201)
        .location(`/api/v1/analyses/${id}`)
        .type("json")
        .send(
          serialise({
            id,
            kind: "analysis",
            request: new JsonText(requestJson),
            result,
            ...p,
            createdAt,
            links: resultLinks("analysis", id),
          }),
        );
      return;
    }
    const specModel = input.spec.model;
    const specRule = input.spec.rule;
    if (b.kind === "bifurcation") {
      accepted(res, "bifurcation", request, async (signal) => {
        const d = await ctx.pool.run(
          { kind: "bifurcation", model: specModel, rule: specRule, axis: b.axis, options: b.options ?? {} },
          signal,
        );
        return d.ok ? outcome("analysis", d.value, provenance(input)) : d;
      });
      return;
    }
    accepted(res, "regime-map", request, async (signal, progress) => {
      const m = await ctx.pool.regimeMap(
        { model: specModel, rule: specRule, x: b.x, y: b.y, options: b.options ?? {} },
        signal,
        (d, t) => progress(d / t),
      );
      if (!m.ok) return m;
      const { ok: _ok, ...map } = m;
      return outcome("analysis", map, provenance(input));
    });
  });

  r.post("/projections", (req, res) => {
    const got = simulationInput(req, res);
    if (!got) return;
    const { body, input, u } = got;
    const { scenario: _sc, uncertainty: _u, ...rest } = body;
    if (!parseWith(projectionBodySchema, rest, res)) return;
    const request = { scenarioId: input.scenarioId, scenario: input.spec, uncertainty: u.raw };
    accepted(res, "projection", request, async (signal, progress) => {
      const p = await ctx.pool.projection(
        { scenario: scenarioOnly(input.spec), uncertainty: u.raw },
        signal,
        (d, t) => progress(d / t),
      );
      if (!p.ok) return p;
      return outcome("projection", p.value, {
        ...provenance(input),
        dataHash: contentHash(request),
        seed: u.value.seed,
      });
    });
  });

  r.post("/comparisons", (req, res) => {
    const got = simulationInput(req, res);
    if (!got) return;
    const { body, input, u } = got;
    let rules: unknown[];
    if (Array.isArray(body.ruleIds)) {
      rules = [];
      for (const id of body.ruleIds) {
        const rec = typeof id === "string" ? ctx.repo.getSpec("rule", id) : null;
        if (!rec) return sendProblem(res, notFound("rule", String(id)));
        rules.push(rec.spec);
      }
    } else if (Array.isArray(body.rules)) {
      rules = body.rules;
      for (let i = 0; i < rules.length; i++)
        if (core(parseRule(rules[i], `rules[${i}]`), res) === undefined) return;
    } else return sendIssue(res, { code: "missing_field", field: "rules" });
    const { scenario: _sc, uncertainty: _u, ...rest } = body;
    if (!parseWith(comparisonBodySchema, rest, res)) return;
    const request = { scenarioId: input.scenarioId, scenario: input.spec, uncertainty: u.raw, rules };
    accepted(res, "comparison", request, async (signal, progress) => {
      const c = await ctx.pool.compareRules(
        { scenario: scenarioOnly(input.spec), uncertainty: u.raw, rules },
        signal,
        (d, t) => progress(d / t),
      );
      if (!c.ok) return c;
      return outcome("comparison", c.value, {
        ...provenance(input),
        dataHash: contentHash(request),
        seed: u.value.seed,
      });
    });
  });

  for (const kind of ["fit", "analysis", "projection", "comparison"] as const) {
    const path = PATHS[kind];
    r.get(`/${path}`, (req, res) => {
      const page = pageOf(req, res);
      if (page)
        res.json({
          items: ctx.repo.listResults(kind, page).map((x) => ({ ...x, links: resultLinks(kind, x.id) })),
          ...page,
        });
    });
    r.get(`/${path}/:id`, (req, res) => {
      const rec = ctx.repo.getResult(kind, req.params.id);
      if (!rec) return sendProblem(res, notFound(kind, req.params.id));
      res.json({ ...rec, links: resultLinks(kind, rec.id) });
    });
    r.delete(`/${path}/:id`, (req, res) => {
      if (!ctx.repo.deleteResult(kind, req.params.id)) return sendProblem(res, notFound(kind, req.params.id));
      res.status(204).end();
    });
  }
  return r;
}

export function jobLinks(id: string) {
  return { self: `/api/v1/jobs/${id}`, events: `/api/v1/jobs/${id}/events` };
}

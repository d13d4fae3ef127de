// /api/v1/models, /rules, /scenarios: named specs kept for reuse.
import { Router, type Response } from "express";
import { parseModel } from "../../src/models/model-spec.js";
import { parseRule } from "../../src/policy/rule-spec.js";
import { ok, type Result } from "../../src/result.js";
import type { SpecKind } from "../store/repository.js";
import { core, jsonObject, pageOf, parseWith, type AppContext } from "./context.js";
import { issueProblem, notFound, sendProblem } from "./problem.js";
import { modelJson, parseScenarioSpec, ruleJson } from "./scenario-input.js";
import { z } from "zod";

const envelope = z.strictObject({ name: z.string().min(1).max(200), spec: z.unknown() });

const KINDS: { kind: SpecKind; path: string; what: string; parse: (spec: unknown) => Result<unknown> }[] = [
  { kind: "model", path: "models", what: "model", parse: (s) => mapOk(parseModel(s, "spec"), modelJson) },
  { kind: "rule", path: "rules", what: "rule", parse: (s) => mapOk(parseRule(s, "spec"), ruleJson) },
  {
    kind: "scenario",
    path: "scenarios",
    what: "scenario",
    parse: (s) => mapOk(parseScenarioSpec(s, "spec"), (v) => v.spec),
  },
];

function mapOk<T, U>(r: Result<T>, f: (v: T) => U): Result<U> {
  return r.ok ? ok(f(r.value)) : r;
}

export function specRoutes(ctx: AppContext): Router {
  const r = Router();
  for (const { kind, path, what, parse } of KINDS) {
    const link = (id: string) => ({ self: `/api/v1/${path}/${id}` });
    r.post(`/${path}`, (req, res: Response) => {
      const body = jsonObject(req, res);
      if (!body) return;
      const b = parseWith(envelope, body, res);
      if (!b) return;
      if (b.spec === undefined)
        return sendProblem(res, issueProblem({ code: "missing_field", field: "spec" }));
      const spec = core(parse(b.spec), res);
      if (spec === undefined) return;
      const rec = ctx.repo.insertSpec(kind, b.name, spec);
      res
        .status(201)
        .location(`/api/v1/${path}/${rec.id}`)
        .json({ ...rec, links: link(rec.id) });
    });
    r.get(`/${path}`, (req, res) => {
      const page = pageOf(req, res);
      if (page)
        res.json({
          items: ctx.repo.listSpecs(kind, page).map((s) => ({ ...s, links: link(s.id) })),
          ...page,
        });
    });
    r.get(`/${path}/:id`, (req, res) => {
      const rec = ctx.repo.getSpec(kind, req.params.id);
      if (!rec) return sendProblem(res, notFound(what, req.params.id));
      res.json({ ...rec, links: link(rec.id) });
    });
    r.delete(`/${path}/:id`, (req, res) => {
      if (!ctx.repo.deleteSpec(kind, req.params.id)) return sendProblem(res, notFound(what, req.params.id));
      res.status(204).end();
    });
  }
  return r;
}

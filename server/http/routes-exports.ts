// Exports for reports: CSV (RFC 4180) and JSON tables of projections and comparisons, and
// the printable HTML report.
import { randomBytes } from "node:crypto";
import { Router, type Response } from "express";
import type { StabilityMargin } from "../../src/equilibria/margin.js";
import type { StabilityAnalysis } from "../../src/equilibria/stability.js";
import { RULE_CATALOGUE } from "../../src/policy/rule-catalogue.js";
import type { StochasticProjection } from "../../src/sim/risk-metrics.js";
import { toCsv } from "../export/csv.js";
import { reportHtml } from "../export/report.js";
import {
  analysisTable,
  comparisonTable,
  fitTable,
  projectionTable,
  riskTable,
  type Table,
} from "../export/tables.js";
import type { ResultKind } from "../store/repository.js";
import { core, parseWith, type AppContext } from "./context.js";
import { notFound, sendIssue, sendProblem } from "./problem.js";
import { parseScenarioSpec, scenarioOnly } from "./scenario-input.js";
import { z } from "zod";

function sendTable(res: Response, t: Table, format: "csv" | "json", file: string): void {
  if (format === "csv")
    res.type("text/csv; charset=utf-8").attachment(`${file}.csv`).send(toCsv(t.header, t.rows));
  else res.json({ columns: t.header, rows: t.rows });
}

const reportQuery = z.strictObject({
  scenario: z.string().min(1),
  fit: z.string().min(1).optional(),
  projection: z.string().min(1).optional(),
  comparison: z.string().min(1).optional(),
});

export function exportRoutes(ctx: AppContext): Router {
  const r = Router();
  const get = (kind: ResultKind, id: string, res: Response) => {
    const rec = ctx.repo.getResult(kind, id);
    if (!rec) sendProblem(res, notFound(kind, id));
    return rec;
  };
  for (const format of ["csv", "json"] as const) {
    r.get(`/projections/:id/table.${format}`, (req, res) => {
      const rec = get("projection", req.params.id, res);
      if (rec)
        sendTable(res, projectionTable(rec.result as StochasticProjection), format, `projection-${rec.id}`);
    });
    r.get(`/projections/:id/risk.${format}`, (req, res) => {
      const rec = get("projection", req.params.id, res);
      if (rec) sendTable(res, riskTable(rec.result as StochasticProjection), format, `risk-${rec.id}`);
    });
    r.get(`/fits/:id/table.${format}`, (req, res) => {
      const rec = get("fit", req.params.id, res);
      if (rec)
        sendTable(res, fitTable(rec.result as Parameters<typeof fitTable>[0]), format, `fit-${rec.id}`);
    });
    r.get(`/analyses/:id/table.${format}`, (req, res) => {
      const rec = get("analysis", req.params.id, res);
      if (rec)
        sendTable(res, analysisTable(rec.result as Record<string, unknown>), format, `analysis-${rec.id}`);
    });
    r.get(`/comparisons/:id/table.${format}`, (req, res) => {
      const rec = get("comparison", req.params.id, res);
      if (rec)
        sendTable(
          res,
          comparisonTable(rec.result as Parameters<typeof comparisonTable>[0]),
          format,
          `comparison-${rec.id}`,
        );
    });
  }

  // GET /api/v1/report?scenario=ID[&fit=ID][&projection=ID][&comparison=ID]
  r.get("/report", async (req, res) => {
    const q = parseWith(reportQuery, req.query, res);
    if (!q) return;
    const rec = ctx.repo.getSpec("scenario", q.scenario);
    if (!rec) return sendProblem(res, notFound("scenario", q.scenario));
    const parsed = core(parseScenarioSpec(rec.spec, "scenario"), res);
    if (!parsed) return;
    const results: Record<string, ReturnType<typeof ctx.repo.getResult>> = {
      fit: null,
      projection: null,
      comparison: null,
    };
    for (const kind of ["fit", "projection", "comparison"] as const) {
      const id = q[kind];
      if (id === undefined) continue;
      const found = get(kind, id, res);
      if (!found) return;
      results[kind] = found;
    }
    const s = parsed.scenario;
    // Both analyses on the quick-analysis thread, as every other stability analysis.
    const scenario = scenarioOnly(parsed.spec);
    const [stability, margin] = await Promise.all([
      ctx.quick.run({ kind: "stability", scenario }),
      ctx.quick.run({ kind: "margin", scenario, parameter: RULE_CATALOGUE[s.rule.kind].main }),
    ]);
    if (!stability.ok) return sendIssue(res, stability.issue, "scenario");
    const nonce = randomBytes(16).toString("base64");
    const html = reportHtml(
      {
        title: `yieldloop report: ${rec.name}`,
        scenario: { id: rec.id, name: rec.name, spec: parsed.spec },
        stability: JSON.parse(stability.json) as StabilityAnalysis,
        margin: margin.ok ? (JSON.parse(margin.json) as StabilityMargin) : null,
        fit: results.fit ?? null,
        projection: results.projection ?? null,
        comparison: results.comparison ?? null,
        programVersion: ctx.version,
        generatedAt: new Date().toISOString(),
      },
      nonce,
    );
    res
      .set(
        "Content-Security-Policy",
        `default-src 'none'; style-src 'nonce-${nonce}'; img-src 'self' data:; base-uri 'none'; form-action 'none'; frame-ancestors 'none'`,
      )
      .type("text/html; charset=utf-8")
      .send(html);
  });
  return r;
}

// /api/v1/series: census and survey series, uploaded as CSV (text/csv or JSON { name, csv }).
import { createHash } from "node:crypto";
import { Router } from "express";
import { parseSeriesCsv, seriesProblems } from "../../src/fit/series.js";
import { describeIssue } from "../../src/issues.js";
import { jsonObject, pageOf, parseWith, type AppContext } from "./context.js";
import { issueProblem, notFound, sendProblem } from "./problem.js";
import { seriesJsonSchema } from "./schemas.js";
import { z } from "zod";

const nameSchema = z.string().min(1).max(200);

export function seriesRoutes(ctx: AppContext): Router {
  const r = Router();
  r.post("/series", (req, res) => {
    let name: string;
    let csv: string;
    if (req.is("text/csv")) {
      const n = parseWith(z.strictObject({ name: nameSchema }), { name: req.query.name ?? "series" }, res);
      if (!n) return;
      if (typeof req.body !== "string" || req.body.length === 0) {
        sendProblem(res, issueProblem({ code: "csv_empty", field: "(body)" }));
        return;
      }
      name = n.name;
      csv = req.body;
    } else {
      const body = jsonObject(req, res);
      if (!body) return;
      const b = parseWith(seriesJsonSchema, body, res);
      if (!b) return;
      name = b.name;
      csv = b.csv;
    }
    const parsed = parseSeriesCsv(csv);
    if (!parsed.ok) {
      // Every problem row by row (up to 100), so they can all be fixed at once.
      const problems = seriesProblems(csv).map((issue) => ({ ...issue, detail: describeIssue(issue) }));
      sendProblem(res, { ...issueProblem(parsed.issue), problems });
      return;
    }
    const series = parsed.value;
    const hash = createHash("sha256").update(csv).digest("hex");
    const rec = ctx.repo.insertSeries(name, csv, hash, series);
    res
      .status(201)
      .location(`/api/v1/series/${rec.id}`)
      .json({ ...rec, columns: series.columns, links: links(rec.id) });
  });
  r.get("/series", (req, res) => {
    const page = pageOf(req, res);
    if (page)
      res.json({ items: ctx.repo.listSeries(page).map((s) => ({ ...s, links: links(s.id) })), ...page });
  });
  r.get("/series/:id", (req, res) => {
    const rec = ctx.repo.getSeries(req.params.id);
    if (!rec) return sendProblem(res, notFound("series", req.params.id));
    res.json({ ...rec, rows: ctx.repo.seriesRows(rec.id), links: links(rec.id) });
  });
  r.get("/series/:id/csv", (req, res) => {
    const csv = ctx.repo.seriesCsv(req.params.id);
    if (csv === null) return sendProblem(res, notFound("series", req.params.id));
    res.type("text/csv; charset=utf-8").attachment(`series-${req.params.id}.csv`).send(csv);
  });
  r.delete("/series/:id", (req, res) => {
    if (!ctx.repo.deleteSeries(req.params.id)) return sendProblem(res, notFound("series", req.params.id));
    res.status(204).end();
  });
  return r;
}

function links(id: string) {
  return { self: `/api/v1/series/${id}`, csv: `/api/v1/series/${id}/csv` };
}

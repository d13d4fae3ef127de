// /api/v1/jobs: a job's state, its progress as server-sent events, and cancellation.
import { Router } from "express";
import type { JobEvent } from "../jobs/job-runner.js";
import type { JobRecord } from "../store/repository.js";
import type { AppContext } from "./context.js";
import { issueProblem, notFound, sendProblem } from "./problem.js";
import { jobLinks, resultLinks } from "./routes-results.js";

const RESULT_KIND: Record<string, "fit" | "analysis" | "projection" | "comparison"> = {
  fit: "fit",
  bifurcation: "analysis",
  "regime-map": "analysis",
  projection: "projection",
  comparison: "comparison",
};

function view(job: JobRecord) {
  const kind = RESULT_KIND[job.kind];
  return {
    ...job,
    links: {
      ...jobLinks(job.id),
      ...(job.resultId && kind ? { result: resultLinks(kind, job.resultId).self } : {}),
    },
  };
}

export function jobRoutes(ctx: AppContext): Router {
  const r = Router();
  r.get("/jobs/:id", (req, res) => {
    const job = ctx.repo.getJob(req.params.id);
    if (!job) return sendProblem(res, notFound("job", req.params.id));
    res.json(view(job));
  });

  // Server-sent events (the HTML Living Standard's text/event-stream): "status" once with
  // the job as stored, then "progress" events, then one "end" event, and the stream closes.
  r.get("/jobs/:id/events", (req, res) => {
    const job = ctx.repo.getJob(req.params.id);
    if (!job) return sendProblem(res, notFound("job", req.params.id));
    res.status(200).set({
      "Content-Type": "text/event-stream; charset=utf-8",
      "Cache-Control": "no-cache",
      Connection: "keep-alive",
    });
    res.flushHeaders();
    const send = (event: string, data: unknown) =>
      res.write(`event: ${event}\ndata: ${JSON.stringify(data)}\n\n`);
    send("status", view(job));
    const finish = () => {
      const final = ctx.repo.getJob(job.id)!;
      send("end", view(final));
      res.end();
    };
    if (!["queued", "running"].includes(job.status)) return finish();
    const unsubscribe = ctx.jobs.subscribe(job.id, (e: JobEvent) => {
      if (e.type === "progress") send("progress", { progress: e.progress });
      else {
        unsubscribe?.();
        finish();
      }
    });
    if (!unsubscribe) return finish();
    req.on("close", () => unsubscribe());
  });

  r.delete("/jobs/:id", (req, res) => {
    const job = ctx.repo.getJob(req.params.id);
    if (!job) return sendProblem(res, notFound("job", req.params.id));
    if (!ctx.jobs.cancel(job.id)) {
      return sendProblem(res, issueProblem({ code: "job_already_ended", id: job.id, status: job.status }));
    }
    res.status(204).end();
  });
  return r;
}

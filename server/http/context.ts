// What every route needs: the store, the job runner, the worker pool and the limits.
import type { Request, Response } from "express";
import type { z } from "zod";
import type { Result } from "../../src/result.js";
import { issueFromZod } from "../../src/zod-issue.js";
import type { JobRunner } from "../jobs/job-runner.js";
import type { Repository } from "../store/repository.js";
import type { AnalysisPool } from "../workers/pool.js";
import type { QuickAnalyses } from "../workers/quick-analyses.js";
import { issueProblem, sendProblem } from "./problem.js";
import { pageSchema } from "./schemas.js";

export interface Limits {
  /** Largest JSON body, e.g. "1mb". */
  readonly jsonBody: string;
  /** Largest CSV body, e.g. "2mb". */
  readonly csvBody: string;
}

export interface AppContext {
  readonly repo: Repository;
  readonly jobs: JobRunner;
  readonly pool: AnalysisPool;
  /** The thread for quick analyses (stability, margin). */
  readonly quick: QuickAnalyses;
  readonly version: string;
  readonly limits: Limits;
}

/** Parses a body with a zod schema, answering 422 naming the field on failure. */
export function parseWith<S extends z.ZodType>(
  schema: S,
  body: unknown,
  res: Response,
): z.output<S> | undefined {
  const r = schema.safeParse(body);
  if (r.success) return r.data;
  sendProblem(res, issueProblem(issueFromZod(r.error, body)));
  return undefined;
}

/** Runs a core parser, answering 422 naming the field on failure. */
export function core<T>(r: Result<T>, res: Response, prefix = ""): T | undefined {
  if (r.ok) return r.value;
  sendProblem(res, issueProblem(r.issue, prefix));
  return undefined;
}

/** limit and offset from the query string (defaults 100 and 0). */
export function pageOf(req: Request, res: Response): { limit: number; offset: number } | undefined {
  return parseWith(pageSchema, req.query, res);
}

/** The body must be a JSON object; the request is answered (400) if it is not. */
export function jsonObject(req: Request, res: Response): Record<string, unknown> | undefined {
  if (!req.is("application/json")) {
    sendProblem(res, issueProblem({ code: "unsupported_media_type", expected: "application/json" }));
    return undefined;
  }
  const b = req.body as unknown;
  if (b === null || typeof b !== "object" || Array.isArray(b)) {
    sendProblem(
      res,
      issueProblem({
        code: "body_not_object",
        received: Array.isArray(b) ? "array" : b === null ? "null" : typeof b,
      }),
    );
    return undefined;
  }
  return b as Record<string, unknown>;
}

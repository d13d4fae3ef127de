// Wires the store, the worker pool, the job runner and the app together.
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import type express from "express";
import { createApp } from "./http/app.js";
import type { Limits } from "./http/context.js";
import { JobRunner } from "./jobs/job-runner.js";
import { openDatabase, type Db } from "./store/database.js";
import { Repository } from "./store/repository.js";
import { createAnalysisPool, type AnalysisPool } from "./workers/pool.js";
import { startQuickAnalyses } from "./workers/quick-analyses.js";

export const PROGRAM_VERSION: string = (
  JSON.parse(readFileSync(fileURLToPath(new URL("../package.json", import.meta.url)), "utf8")) as {
    version: string;
  }
).version;

export const DEFAULT_LIMITS: Limits = { jsonBody: "1mb", csvBody: "2mb" };

export interface RuntimeOptions {
  /** SQLite file, or ":memory:". */
  readonly database: string;
  /** Worker threads for long work (default 2). */
  readonly workers?: number;
  readonly token?: string;
  readonly limits?: Limits;
  readonly staticDir?: string;
}

export interface Runtime {
  readonly app: express.Express;
  readonly db: Db;
  readonly repo: Repository;
  readonly jobs: JobRunner;
  readonly pool: AnalysisPool;
  /** Cancels running jobs, stops the workers and closes the database. */
  close(): Promise<void>;
}

export function createRuntime(o: RuntimeOptions): Runtime {
  const db = openDatabase(o.database);
  const repo = new Repository(db);
  // Jobs a previous process left unfinished cannot resume: mark them so a reload says so.
  repo.interruptUnfinishedJobs();
  const jobs = new JobRunner(repo);
  const pool = createAnalysisPool(o.workers ?? 2);
  const quick = startQuickAnalyses();
  const app = createApp({
    repo,
    jobs,
    pool,
    quick,
    version: PROGRAM_VERSION,
    limits: o.limits ?? DEFAULT_LIMITS,
    ...(o.token ? { token: o.token } : {}),
    ...(o.staticDir ? { staticDir: o.staticDir } : {}),
  });
  return {
    app,
    db,
    repo,
    jobs,
    pool,
    async close() {
      jobs.cancelAll();
      await jobs.idle().catch(() => undefined);
      await pool.close();
      await quick.close();
      db.close();
    },
  };
}

// Long work as jobs: stored in the jobs table, run off the request thread (on the worker
// pool), progress pushed to listeners, cancellable. A job's result and its "done" status
// are written in one transaction (Repository.finishJob).
import { EventEmitter } from "node:events";
import { describeIssue, type Issue } from "../../src/issues.js";
import { ISSUE_TABLE } from "../issue-table.js";
import type { JobRecord, Provenance, Repository, ResultKind } from "../store/repository.js";

export type JobEvent =
  | { type: "progress"; progress: number }
  | { type: "end"; status: "done" | "failed" | "cancelled"; resultId?: string; error?: unknown };

export type JobOutcome =
  | { ok: true; kind: ResultKind; result: unknown; provenance: Provenance }
  | { ok: false; issue: Issue };

export type JobWork = (signal: AbortSignal, progress: (fraction: number) => void) => Promise<JobOutcome>;

interface Live {
  readonly controller: AbortController;
  readonly emitter: EventEmitter;
  readonly done: Promise<void>;
}

export class JobRunner {
  private readonly live = new Map<string, Live>();

  constructor(private readonly repo: Repository) {}

  /** Creates the job (status queued) and starts it; the caller answers 202 with its URL. */
  start(kind: string, request: unknown, work: JobWork): JobRecord {
    const job = this.repo.createJob(kind, request);
    const controller = new AbortController();
    const emitter = new EventEmitter();
    emitter.setMaxListeners(1000);
    const done = this.run(job.id, request, work, controller, emitter).finally(() => this.live.delete(job.id));
    this.live.set(job.id, { controller, emitter, done });
    return job;
  }

  private async run(
    id: string,
    request: unknown,
    work: JobWork,
    controller: AbortController,
    emitter: EventEmitter,
  ): Promise<void> {
    // Start on the next turn so the 202 is sent first.
    await new Promise((r) => setImmediate(r));
    if (!this.repo.setJobStatus(id, "running")) return;
    let last = 0;
    let lastAt = 0;
    const progress = (f: number) => {
      const t = Date.now();
      if (f - last < 0.01 && t - lastAt < 250 && f < 1) return;
      last = f;
      lastAt = t;
      this.repo.setJobProgress(id, f);
      emitter.emit("event", { type: "progress", progress: f } satisfies JobEvent);
    };
    try {
      const outcome = await work(controller.signal, progress);
      if (controller.signal.aborted) return;
      if (!outcome.ok) {
        const error = jobError(outcome.issue);
        this.repo.failJob(id, error);
        emitter.emit("event", { type: "end", status: "failed", error } satisfies JobEvent);
        return;
      }
      const stored = this.repo.finishJob(id, outcome.kind, request, outcome.result, outcome.provenance);
      if (stored)
        emitter.emit("event", { type: "end", status: "done", resultId: stored.id } satisfies JobEvent);
    } catch (err) {
      if (controller.signal.aborted) return;
      // An internal failure: recorded without the stack, which stays in the server log.
      process.stderr.write(
        `job ${id} failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`,
      );
      const error = jobError({ code: "internal" });
      this.repo.failJob(id, error);
      emitter.emit("event", { type: "end", status: "failed", error } satisfies JobEvent);
    }
  }

  /** Cancels a queued or running job; false if it had already ended (or does not exist). */
  cancel(id: string): boolean {
    const ended = !this.repo.setJobStatus(id, "cancelled");
    if (ended) return false;
    const live = this.live.get(id);
    live?.controller.abort();
    live?.emitter.emit("event", { type: "end", status: "cancelled" } satisfies JobEvent);
    return true;
  }

  /** Subscribes to a live job's events; undefined when the job is not running here. */
  subscribe(id: string, listener: (e: JobEvent) => void): (() => void) | undefined {
    const live = this.live.get(id);
    if (!live) return undefined;
    live.emitter.on("event", listener);
    return () => live.emitter.off("event", listener);
  }

  /** Resolves when every job started so far has ended (for tests and shutdown). */
  async idle(): Promise<void> {
    await Promise.all([...this.live.values()].map((l) => l.done));
  }

  /** Cancels every running job (shutdown). */
  cancelAll(): void {
    for (const id of [...this.live.keys()]) this.cancel(id);
  }
}

/** A failed job's error: the issue's data with its title and text (the same as a problem document's). */
export function jobError(issue: Issue): Issue & { title: string; detail: string } {
  return { ...issue, title: ISSUE_TABLE[issue.code].title, detail: describeIssue(issue) };
}

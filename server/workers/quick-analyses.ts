// Quick analyses (stability, margin, robust verdict) on a thread of their own, so that the
// main thread only reads requests, stores and answers. The thread is a one-thread pool of the
// worker-pool library (piscina), apart from the pool for long work, so a quick analysis never
// waits behind a projection. The tasks of one turn of the event loop go to it as one batch
// (TurnBatch): a message costs about as much as a small analysis. If the thread fails, the
// analyses in flight are rejected and piscina starts a new thread for the next batch.
import { Piscina } from "piscina";
import type { Issue } from "../../src/issues.js";
import { TurnBatch } from "../turn-batch.js";
import type { QuickAnswer, QuickRequest, QuickTask } from "./quick-tasks.js";

export type QuickResult = { ok: true; json: string } | { ok: false; issue: Issue };

export interface QuickAnalyses {
  /** The analysis as JSON text, or the issue that stopped it. */
  run(request: QuickRequest): Promise<QuickResult>;
  close(): Promise<void>;
}

interface Pending {
  readonly task: QuickTask;
  resolve(r: QuickResult): void;
  reject(e: Error): void;
}

export function startQuickAnalyses(): QuickAnalyses {
  const pool = new Piscina({
    filename: new URL("./quick-worker.mjs", import.meta.url).href,
    minThreads: 1,
    maxThreads: 1,
    idleTimeout: Number.POSITIVE_INFINITY,
  });
  let nextId = 1;
  let closed = false;
  const send = async (batch: Pending[]) => {
    try {
      const answers = (await pool.run(batch.map((p) => p.task))) as QuickAnswer[];
      batch.forEach((p, i) => {
        const a = answers[i]!;
        if (a.ok) p.resolve({ ok: true, json: a.json });
        else if ("issue" in a) p.resolve({ ok: false, issue: a.issue });
        else p.reject(new Error(`quick analysis failed: ${a.error}`));
      });
    } catch (e) {
      for (const p of batch) p.reject(e instanceof Error ? e : new Error(String(e)));
    }
  };
  const batches = new TurnBatch<Pending>((b) => void send(b));
  return {
    run(request) {
      if (closed) return Promise.reject(new Error("the quick-analysis thread is closed"));
      return new Promise<QuickResult>((resolve, reject) =>
        batches.add({ task: { ...request, id: nextId++ }, resolve, reject }),
      );
    },
    async close() {
      closed = true;
      await pool.destroy();
    },
  };
}

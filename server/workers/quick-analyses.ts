// Quick analyses (stability, margin, robust verdict) on a thread of their own, so that the
// main thread only reads requests, stores and answers; long work never queues here, so a quick
// analysis never waits behind a projection. The tasks of one turn of the event loop go to the
// thread as one message and come back as one (TurnBatch): a message costs about as much as a
// small analysis. A plain worker thread, not the piscina pool: on the load benchmark a
// one-thread piscina pool answered 20% fewer requests (p95 80 ms against 48 ms; bench/NOTES.md).
// If the thread fails, the analyses in flight are rejected and the next batch starts a new one.
import { Worker } from "node:worker_threads";
import type { Issue } from "../../src/issues.js";
import { TurnBatch } from "../turn-batch.js";
import type { QuickAnswer, QuickRequest } from "./quick-tasks.js";

export type QuickResult = { ok: true; json: string } | { ok: false; issue: Issue };

export interface QuickAnalyses {
  /** The analysis as JSON text, or the issue that stopped it. */
  run(request: QuickRequest): Promise<QuickResult>;
  close(): Promise<void>;
}

interface Pending {
  readonly task: QuickRequest;
  resolve(r: QuickResult): void;
  reject(e: Error): void;
}

export function startQuickAnalyses(): QuickAnalyses {
  let worker: Worker | null = null;
  let closed = false;
  // Batches sent and not yet answered, in order (the thread answers them in order).
  const inFlight: Pending[][] = [];

  const failAll = (e: Error) => {
    for (const batch of inFlight.splice(0)) for (const p of batch) p.reject(e);
  };
  const start = (): Worker => {
    const w = new Worker(new URL("./quick-worker.mjs", import.meta.url));
    w.on("message", (answers: QuickAnswer[]) => {
      const batch = inFlight.shift();
      if (!batch) return;
      batch.forEach((p, i) => {
        const a = answers[i]!;
        if (a.ok) p.resolve({ ok: true, json: a.json });
        else if ("issue" in a) p.resolve({ ok: false, issue: a.issue });
        else p.reject(new Error(`quick analysis failed: ${a.error}`));
      });
    });
    const lost = (e: Error) => {
      if (worker === w) worker = null;
      failAll(e);
    };
    w.on("error", (e) => lost(e instanceof Error ? e : new Error(String(e))));
    w.on("exit", () => lost(new Error("the quick-analysis thread stopped")));
    w.unref();
    return w;
  };
  const batches = new TurnBatch<Pending>((batch) => {
    worker ??= start();
    inFlight.push(batch);
    worker.postMessage(batch.map((p) => p.task));
  });
  return {
    run(request) {
      if (closed) return Promise.reject(new Error("the quick-analysis thread is closed"));
      return new Promise<QuickResult>((resolve, reject) => batches.add({ task: request, resolve, reject }));
    },
    async close() {
      closed = true;
      const w = worker;
      worker = null;
      if (w) await w.terminate();
      failAll(new Error("the quick-analysis thread is closed"));
    },
  };
}

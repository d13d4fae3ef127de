// Quick analyses (stability, margin) on a thread of their own, so that the main thread only
// reads requests, stores and answers. The tasks of one turn of the event loop go in one
// message and come back in one (a message costs about as much as a small analysis); long
// work never queues here, so a quick analysis is not held up by a projection. If the thread
// fails, the analyses in flight are rejected and the next one starts a new thread.
import { Worker } from "node:worker_threads";
import type { Issue } from "../../src/issues.js";
import type { QuickAnswer, QuickTask } from "./quick-tasks.js";

export type QuickResult = { ok: true; json: string } | { ok: false; issue: Issue };

export interface QuickAnalyses {
  /** The analysis as JSON text, or the issue that stopped it. */
  run(kind: "stability" | "margin", scenario: unknown, parameter?: string): Promise<QuickResult>;
  close(): Promise<void>;
}

interface Pending {
  resolve(r: QuickResult): void;
  reject(e: Error): void;
}

export function startQuickAnalyses(): QuickAnalyses {
  let worker: Worker | null = null;
  let ready: Promise<void> | null = null;
  let nextId = 1;
  let queue: QuickTask[] = [];
  let scheduled = false;
  const pending = new Map<number, Pending>();
  let closed = false;

  const failAll = (e: Error) => {
    for (const p of pending.values()) p.reject(e);
    pending.clear();
  };
  const start = () => {
    const w = new Worker(new URL("./quick-worker.mjs", import.meta.url));
    worker = w;
    ready = new Promise<void>((resolve, reject) => {
      w.once("message", () => resolve());
      w.once("error", reject);
    });
    w.on("message", (answers: unknown) => {
      if (!Array.isArray(answers)) return;
      for (const a of answers as (QuickAnswer | { id: number; ok: false; error: string })[]) {
        const p = pending.get(a.id);
        if (!p) continue;
        pending.delete(a.id);
        if (a.ok) p.resolve({ ok: true, json: a.json });
        else if ("issue" in a) p.resolve({ ok: false, issue: a.issue });
        else p.reject(new Error(`quick analysis failed: ${a.error}`));
      }
    });
    w.on("error", (e) => {
      worker = null;
      failAll(e instanceof Error ? e : new Error(String(e)));
    });
    w.on("exit", () => {
      if (worker === w) worker = null;
      failAll(new Error("the quick-analysis thread stopped"));
    });
    w.unref();
  };
  const flush = async () => {
    scheduled = false;
    const batch = queue;
    queue = [];
    try {
      if (!worker) start();
      await ready;
      worker!.postMessage(batch);
    } catch (e) {
      for (const t of batch) {
        pending.get(t.id)?.reject(e instanceof Error ? e : new Error(String(e)));
        pending.delete(t.id);
      }
    }
  };

  return {
    run(kind, scenario, parameter) {
      if (closed) return Promise.reject(new Error("the quick-analysis thread is closed"));
      return new Promise<QuickResult>((resolve, reject) => {
        const id = nextId++;
        pending.set(id, { resolve, reject });
        queue.push({ id, kind, scenario, ...(parameter !== undefined ? { parameter } : {}) });
        if (!scheduled) {
          scheduled = true;
          setImmediate(() => void flush());
        }
      });
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

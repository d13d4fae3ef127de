import { readFileSync } from "node:fs";
import request from "supertest";
import { createRuntime, type Runtime } from "../../server/runtime.js";

export const deerCsv = readFileSync(
  new URL("../../data-demo/skerra-deer/series.csv", import.meta.url),
  "utf8",
);

export const scenarioSpec = {
  model: { family: "ricker", params: { r: 1.2, K: 1000 } },
  rule: { kind: "threshold", lowerTrigger: 200, upperTrigger: 500, maxRate: 0.3 },
  start: 600,
  horizon: 20,
  uncertainty: { replicates: 2000, seed: 3, processSd: 0.3 },
};

/** A runtime on an in-memory database with one worker. */
export function testRuntime(extra: { token?: string } = {}): {
  rt: Runtime;
  api: ReturnType<typeof request>;
} {
  const rt = createRuntime({ database: ":memory:", workers: 1, ...extra });
  return { rt, api: request(rt.app) };
}

/** Waits for a job to end and returns its final record. */
export async function finished(
  rt: Runtime,
  api: ReturnType<typeof request>,
  jobId: string,
): Promise<Record<string, unknown>> {
  await rt.jobs.idle();
  const r = await api.get(`/api/v1/jobs/${jobId}`);
  return r.body as Record<string, unknown>;
}

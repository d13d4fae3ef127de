import http from "node:http";
import { mkdtempSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { afterAll, describe, expect, it } from "vitest";
import { createRuntime } from "../../server/runtime.js";
import { finished, scenarioSpec, testRuntime } from "./helpers.js";
import request from "supertest";

const { rt, api } = testRuntime();
afterAll(() => rt.close());

/** Reads a server-sent event stream to its end (the HTML Living Standard's text/event-stream format). */
function readEvents(url: string): Promise<{ event: string; data: unknown }[]> {
  return new Promise((resolve, reject) => {
    http
      .get(url, (res) => {
        expect(res.headers["content-type"]).toMatch(/^text\/event-stream/);
        let text = "";
        res.setEncoding("utf8");
        res.on("data", (c: string) => (text += c));
        res.on("end", () =>
          resolve(
            text
              .split("\n\n")
              .filter((b) => b.trim())
              .map((b) => {
                const event = /^event: (.*)$/m.exec(b)![1]!;
                return { event, data: JSON.parse(/^data: (.*)$/m.exec(b)![1]!) };
              }),
          ),
        );
      })
      .on("error", reject);
  });
}

describe("jobs", () => {
  it("stream their progress as server-sent events: status, progress…, end", async () => {
    const server = rt.app.listen(0, "127.0.0.1");
    await new Promise((r) => server.once("listening", r));
    const port = (server.address() as { port: number }).port;
    const p = await api.post("/api/v1/projections").send({
      scenario: { ...scenarioSpec, uncertainty: { ...scenarioSpec.uncertainty, replicates: 200_000 } },
    });
    const events = await readEvents(`http://127.0.0.1:${port}/api/v1/jobs/${p.body.job.id}/events`);
    server.close();
    expect(events[0]!.event).toBe("status");
    const progress = events
      .filter((e) => e.event === "progress")
      .map((e) => (e.data as { progress: number }).progress);
    expect(progress.length).toBeGreaterThan(1);
    for (let i = 1; i < progress.length; i++) expect(progress[i]!).toBeGreaterThan(progress[i - 1]!);
    const end = events[events.length - 1]!;
    expect(end.event).toBe("end");
    expect(end.data).toMatchObject({ status: "done", progress: 1 });
    // A finished job's stream sends its state and ends at once (a page reloaded later).
    const again = await readEventsAfter(rt, p.body.job.id);
    expect(again.map((e) => e.event)).toEqual(["status", "end"]);
  });

  it("can be cancelled: 204, status cancelled, no result stored; cancelling again is 409", async () => {
    const before = (await api.get("/api/v1/projections")).body.items.length;
    const p = await api.post("/api/v1/projections").send({
      scenario: {
        ...scenarioSpec,
        horizon: 200,
        uncertainty: { ...scenarioSpec.uncertainty, replicates: 1_000_000 },
      },
    });
    const d = await api.delete(`/api/v1/jobs/${p.body.job.id}`);
    expect(d.status).toBe(204);
    const job = await finished(rt, api, p.body.job.id);
    expect(job).toMatchObject({ status: "cancelled", resultId: null });
    expect((await api.get("/api/v1/projections")).body.items.length).toBe(before);
    const again = await api.delete(`/api/v1/jobs/${p.body.job.id}`);
    expect(again.status).toBe(409);
    expect(again.body).toMatchObject({
      type: "urn:yieldloop:problem:job-already-ended",
      title: "The job has already ended",
      issue: { code: "job_already_ended", status: "cancelled" },
    });
    expect((await api.get("/api/v1/jobs/nope")).status).toBe(404);
  });

  it("a job whose work is rejected by the core ends failed, with the issue", async () => {
    const p = await api.post("/api/v1/analyses").send({
      kind: "regime-map",
      scenario: scenarioSpec,
      x: { path: "model.params.r", from: 0.5, to: 3, count: 5 },
      y: { path: "model.params.r", from: 0.5, to: 1, count: 5 },
    });
    const job = await finished(rt, api, p.body.job.id);
    expect(job).toMatchObject({ status: "failed", error: { code: "constraint_violated", field: "y.path" } });
  });

  it("survive a restart: finished results are kept, unfinished jobs are marked interrupted", async () => {
    const dir = mkdtempSync(join(tmpdir(), "yieldloop-"));
    const file = join(dir, "store.db");
    const a = createRuntime({ database: file, workers: 1 });
    const one = request(a.app);
    const done = await one.post("/api/v1/projections").send({ scenario: scenarioSpec });
    await a.jobs.idle();
    // A job row left "running" by a process that died (written as that process would have).
    a.repo.createJob("projection", { scenario: scenarioSpec });
    const stuck = a.repo.createJob("projection", {});
    a.repo.setJobStatus(stuck.id, "running");
    a.db.close();
    await a.pool.close();
    const b = createRuntime({ database: file, workers: 1 });
    const two = request(b.app);
    const first = await two.get(`/api/v1/jobs/${done.body.job.id}`);
    expect(first.body.status).toBe("done");
    expect((await two.get(first.body.links.result)).status).toBe(200);
    expect((await two.get(`/api/v1/jobs/${stuck.id}`)).body.status).toBe("interrupted");
    await b.close();
  });
});

async function readEventsAfter(runtime: typeof rt, id: string) {
  const server = runtime.app.listen(0, "127.0.0.1");
  await new Promise((r) => server.once("listening", r));
  const port = (server.address() as { port: number }).port;
  try {
    return await readEvents(`http://127.0.0.1:${port}/api/v1/jobs/${id}/events`);
  } finally {
    server.close();
  }
}

describe("security defaults", () => {
  it("sends security headers and a strict Content-Security-Policy", async () => {
    const r = await api.get("/api/v1/");
    expect(r.headers["x-content-type-options"]).toBe("nosniff");
    expect(r.headers["x-frame-options"]).toBe("DENY");
    expect(r.headers["content-security-policy"]).toContain("script-src 'self'");
    expect(r.headers["content-security-policy"]).toContain("frame-ancestors 'none'");
    expect(r.headers["x-powered-by"]).toBeUndefined();
  });
  it("says how to build the page when it has not been built", async () => {
    const t = createRuntime({ database: ":memory:", workers: 1, staticDir: "/nonexistent/page" });
    const r = await request(t.app).get("/");
    expect(r.status).toBe(200);
    expect(r.text).toMatch(/npm run build/);
    await t.close();
  });
  it("with a token, every API request needs it", async () => {
    const t = testRuntime({ token: "s3cret-token" });
    const no = await t.api.get("/api/v1/series");
    expect(no.status).toBe(401);
    expect(no.headers["content-type"]).toMatch(/application\/problem\+json/);
    expect((await t.api.get("/api/v1/series").set("Authorization", "Bearer wrong-token!")).status).toBe(401);
    expect((await t.api.get("/api/v1/series").set("Authorization", "Bearer s3cret-token")).status).toBe(200);
    await t.rt.close();
  });
});

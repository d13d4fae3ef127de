// Load on loopback: stability analyses (POST /api/v1/analyses, kind "stability", each with
// its own harvest rate so no two requests are alike) from 100 concurrent connections for a
// bounded time, against the server running in its own process on a real database file.
// The p95 of the response times is computed from every response (autocannon's own summary
// has no p95). Target: p95 < 50 ms.
import { spawn } from "node:child_process";
import { mkdtempSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import autocannon from "autocannon";

const CONNECTIONS = 100;
const SECONDS = 10;
/** The run also stops after this many answers, whichever comes first (bounded in count and time). */
const MAX_REQUESTS = 100_000;

function body(i: number): string {
  return JSON.stringify({
    kind: "stability",
    scenario: {
      model: { family: "ricker", params: { r: 1.2 + (i % 7) * 0.1, K: 1000 } },
      rule: {
        kind: "threshold",
        lowerTrigger: 200,
        upperTrigger: 500,
        maxRate: 0.05 + ((i * 0.618) % 0.6),
        surveyLag: i % 3,
      },
      start: 600,
      horizon: 20,
    },
  });
}

function percentile(sorted: number[], p: number): number {
  const k = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[k]!;
}

async function startServer(): Promise<{ url: string; stop: () => Promise<void> }> {
  const dir = mkdtempSync(join(tmpdir(), "yieldloop-load-"));
  const db = join(dir, "load.db");
  const cli = fileURLToPath(new URL("../server/cli/main.ts", import.meta.url));
  const child = spawn(
    process.execPath,
    ["--import", "tsx", cli, "serve", "--port", "0", "--db", db, "--workers", "1"],
    { stdio: ["ignore", "pipe", "inherit"] },
  );
  const url = await new Promise<string>((resolve, reject) => {
    let out = "";
    child.stdout!.on("data", (c: Buffer) => {
      out += c.toString();
      const m = /serving on (http:\/\/[^/]+)\//.exec(out);
      if (m) resolve(m[1]!);
    });
    child.once("exit", (code) => reject(new Error(`server exited (${code})`)));
  });
  const stop = () =>
    new Promise<void>((resolve) => {
      child.once("exit", () => {
        rmSync(dir, { recursive: true, force: true });
        resolve();
      });
      child.kill("SIGTERM");
    });
  return { url, stop };
}

function run(url: string, seconds: number, latencies: number[] | null): Promise<autocannon.Result> {
  let i = 0;
  return new Promise((resolve, reject) => {
    const instance = autocannon(
      {
        url,
        connections: CONNECTIONS,
        duration: seconds,
        requests: [
          {
            method: "POST",
            path: "/api/v1/analyses",
            headers: { "content-type": "application/json" },
            setupRequest: (req) => ({ ...req, body: body(i++) }),
          },
        ],
      },
      (err, result) => (err ? reject(err) : resolve(result)),
    );
    if (latencies) {
      instance.on("response", (_c: unknown, _status: number, _bytes: number, time: number) => {
        if (latencies.push(time) === MAX_REQUESTS) instance.stop();
      });
    }
  });
}

export async function loadBench(): Promise<void> {
  const server = await startServer();
  try {
    await run(server.url, 2, null); // warm-up: compilation and the first database pages
    const latencies: number[] = [];
    const result = await run(server.url, SECONDS, latencies);
    latencies.sort((a, b) => a - b);
    console.log(
      JSON.stringify({
        bench: "load-stability-analyses",
        impl: "yieldloop",
        connections: CONNECTIONS,
        seconds: SECONDS,
        maxRequests: MAX_REQUESTS,
        requests: latencies.length,
        requestsPerSecond: result.requests.average,
        non2xx: result.non2xx,
        errors: result.errors,
        latencyMs: {
          p50: percentile(latencies, 50),
          p95: percentile(latencies, 95),
          p99: percentile(latencies, 99),
          max: latencies[latencies.length - 1],
        },
        target: { p95Ms: 50 },
      }),
    );
  } finally {
    await server.stop();
  }
}

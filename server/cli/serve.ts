// `yieldloop serve`: the HTTP API (and the page) on one machine.
import { homedir } from "node:os";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { loadDemo } from "../demo-data.js";
import { createRuntime } from "../runtime.js";
import { CliError, EXIT } from "./exit-codes.js";

export interface ServeOptions {
  readonly db?: string;
  readonly host?: string;
  readonly port?: string;
  readonly token?: string;
  readonly workers?: string;
  readonly demo?: boolean;
}

/** The user's data folder for yieldloop: $XDG_DATA_HOME, %LOCALAPPDATA% or ~/.local/share. */
export function defaultDataDir(env = process.env): string {
  const base =
    env.XDG_DATA_HOME ||
    (process.platform === "win32" ? env.LOCALAPPDATA || env.APPDATA : undefined) ||
    join(homedir(), ".local", "share");
  return join(base, "yieldloop");
}

export function isLoopback(host: string): boolean {
  return host === "localhost" || host === "::1" || host.startsWith("127.");
}

export async function serve(o: ServeOptions, env = process.env): Promise<void> {
  const host = o.host ?? env.YIELDLOOP_HOST ?? "127.0.0.1";
  const port = Number(o.port ?? env.YIELDLOOP_PORT ?? 8470);
  if (!Number.isInteger(port) || port < 0 || port > 65535)
    throw new CliError(
      `--port must be a whole number from 0 to 65535 (received ${o.port ?? env.YIELDLOOP_PORT})`,
      EXIT.usage,
    );
  const token = o.token ?? env.YIELDLOOP_TOKEN;
  if (!isLoopback(host) && !token) {
    throw new CliError(
      `listening on ${host} makes the server reachable from other machines, so it needs an API token: give --token or set YIELDLOOP_TOKEN`,
      EXIT.usage,
    );
  }
  const workers = Number(o.workers ?? 2);
  if (!Number.isInteger(workers) || workers < 1 || workers > 64)
    throw new CliError(`--workers must be a whole number from 1 to 64`, EXIT.usage);
  const database = o.db ?? env.YIELDLOOP_DB ?? join(defaultDataDir(env), o.demo ? "demo.db" : "yieldloop.db");
  const staticDir = fileURLToPath(new URL("../../client/dist/", import.meta.url));
  const rt = createRuntime({ database, workers, ...(token ? { token } : {}), staticDir });
  if (o.demo) {
    const added = loadDemo(rt.repo);
    process.stdout.write(
      `demo data: ${added.series} series, ${added.scenarios} scenarios and ${added.rules} rules added (already loaded ones are kept)\n`,
    );
  }
  const server = rt.app.listen(port, host);
  await new Promise<void>((resolve, reject) => {
    server.once("listening", () => resolve());
    server.once("error", (e) =>
      reject(new CliError(`cannot listen on ${host}:${port}: ${(e as Error).message}`, EXIT.internal)),
    );
  });
  const address = server.address();
  const actual = typeof address === "object" && address ? address.port : port;
  const shown = host.includes(":") ? `[${host}]` : host;
  process.stdout.write(`yieldloop is serving on http://${shown}:${actual}/ (database ${database})\n`);
  process.stdout.write(
    `open http://${shown}:${actual}/ in a browser; the API is at http://${shown}:${actual}/api/v1/ — press Ctrl-C to stop\n`,
  );
  const stop = () => {
    server.close();
    server.closeAllConnections();
    void rt.close().then(() => process.exit(EXIT.ok));
  };
  process.once("SIGINT", stop);
  process.once("SIGTERM", stop);
}

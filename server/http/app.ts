// The express app, built by a factory so tests can drive it with supertest without a port.
import { catalogue } from "../../src/catalogue.js";
import { existsSync } from "node:fs";
import { timingSafeEqual } from "node:crypto";
import express, { type ErrorRequestHandler, type RequestHandler } from "express";
import type { AppContext } from "./context.js";
import { openApiDocument } from "./openapi.js";
import { sendIssue } from "./problem.js";
import { exportRoutes } from "./routes-exports.js";
import { jobRoutes } from "./routes-jobs.js";
import { resultRoutes } from "./routes-results.js";
import { seriesRoutes } from "./routes-series.js";
import { specRoutes } from "./routes-specs.js";

export interface AppOptions extends AppContext {
  /** When set, every /api request needs `Authorization: Bearer <token>`. */
  readonly token?: string;
  /** A folder of built page files to serve at / (the web page), if present. */
  readonly staticDir?: string;
}

/** The page's Content-Security-Policy: only our own scripts, styles and API. */
export const PAGE_CSP =
  "default-src 'self'; script-src 'self'; style-src 'self'; img-src 'self' data: blob:; connect-src 'self'; object-src 'none'; base-uri 'none'; form-action 'self'; frame-ancestors 'none'";

const securityHeaders: RequestHandler = (_req, res, next) => {
  res.set({
    "X-Content-Type-Options": "nosniff",
    "X-Frame-Options": "DENY",
    "Referrer-Policy": "no-referrer",
    "Cross-Origin-Opener-Policy": "same-origin",
    "Cross-Origin-Resource-Policy": "same-origin",
    "Content-Security-Policy": PAGE_CSP,
    "Permissions-Policy": "camera=(), microphone=(), geolocation=()",
  });
  next();
};

function bearer(token: string): RequestHandler {
  const expected = Buffer.from(token);
  return (req, res, next) => {
    const got = Buffer.from((req.get("authorization") ?? "").replace(/^Bearer\s+/i, ""));
    if (got.length === expected.length && timingSafeEqual(got, expected)) return next();
    res.set("WWW-Authenticate", 'Bearer realm="yieldloop"');
    sendIssue(res, { code: "unauthorised" });
  };
}

export function createApp(opts: AppOptions): express.Express {
  const app = express();
  app.disable("x-powered-by");
  // No ETag: every answer of this API is either just made (a POST) or cheap to send again,
  // and hashing each body costs more than it saves.
  app.set("etag", false);
  app.set("query parser", "simple");
  app.use(securityHeaders);
  const api = express.Router();
  if (opts.token) api.use(bearer(opts.token));
  api.use(express.json({ limit: opts.limits.jsonBody, type: ["application/json", "application/*+json"] }));
  api.use(express.text({ limit: opts.limits.csvBody, type: ["text/csv", "text/plain"] }));
  api.get("/", (_req, res) => {
    res.json({
      name: "yieldloop",
      version: opts.version,
      links: Object.fromEntries(
        ["series", "models", "rules", "scenarios", "fits", "analyses", "projections", "comparisons"].map(
          (k) => [k, `/api/v1/${k}`],
        ),
      ),
      openapi: "/api/v1/openapi.json",
      catalogue: "/api/v1/catalogue",
    });
  });
  const doc = openApiDocument(opts.version);
  api.get("/openapi.json", (_req, res) => res.json(doc));
  // The catalogue of families, rules and settings the page and the command line are built from.
  const described = JSON.stringify(catalogue());
  api.get("/catalogue", (_req, res) => res.type("json").send(described));
  // Results first: a quick analysis is by far the most frequent request (the page asks for one
  // on every slider move), and express tries each router's routes in order.
  api.use(resultRoutes(opts));
  api.use(seriesRoutes(opts));
  api.use(specRoutes(opts));
  api.use(exportRoutes(opts));
  api.use(jobRoutes(opts));
  api.use((req, res) =>
    sendIssue(res, { code: "route_not_found", method: req.method, path: `${req.baseUrl}${req.path}` }),
  );
  app.use("/api/v1", api);
  if (opts.staticDir && existsSync(opts.staticDir))
    app.use(express.static(opts.staticDir, { index: "index.html", maxAge: "1h" }));
  else if (opts.staticDir) {
    app.get("/", (_req, res) =>
      res
        .type("text/plain; charset=utf-8")
        .send(
          "The web page has not been built yet: run `npm run build` (or start with `npm start`, which builds it). The API is at /api/v1/.\n",
        ),
    );
  }
  app.use((req, res) => sendIssue(res, { code: "route_not_found", method: req.method, path: req.path }));
  app.use(errors);
  return app;
}

// Body-parser failures become 400/413/415 problems; anything else is a 500 without details
// (the stack goes to the server's log, never to the client).
const errors: ErrorRequestHandler = (
  err: { type?: string; status?: number; message?: string; stack?: string; limit?: number },
  _req,
  res,
  _next,
) => {
  if (res.headersSent) return res.end();
  if (err.type === "entity.parse.failed")
    return sendIssue(res, { code: "malformed_json", detail: jsonError(err.message) });
  if (err.type === "entity.too.large")
    return sendIssue(res, {
      code: "body_too_large",
      limit: err.limit !== undefined ? `at most ${err.limit} bytes` : "see the server's limits",
    });
  if (err.type === "encoding.unsupported" || err.type === "charset.unsupported")
    return sendIssue(res, { code: "unsupported_encoding" });
  if (typeof err.status === "number" && err.status >= 400 && err.status < 500)
    return sendIssue(res, { code: "bad_request" });
  process.stderr.write(`internal error: ${err.stack ?? err.message ?? String(err)}\n`);
  sendIssue(res, { code: "internal" });
};

/** JSON.parse's complaint without the body it quotes (which could be long or private). */
function jsonError(message: string | undefined): string {
  const m = /^(Unexpected [^,]*?|Expected [^,]*?)(?: in JSON)? at position (\d+)/.exec(message ?? "");
  return m ? `${m[1]} at position ${m[2]}` : "it could not be parsed";
}

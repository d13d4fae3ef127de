// The OpenAPI 3.1 document, generated from the zod request schemas (never written by hand).
import { z } from "zod";
import {
  analysisBodySchema,
  comparisonBodySchema,
  fitBodySchema,
  modelBodySchema,
  projectionBodySchema,
  ruleBodySchema,
  scenarioBodySchema,
  seriesJsonSchema,
} from "./schemas.js";

interface Op {
  readonly method: "get" | "post" | "delete";
  readonly path: string;
  readonly summary: string;
  readonly body?: z.ZodType;
  readonly csvBody?: boolean;
  readonly ok: number;
  readonly produces?: string;
}

const resources: [string, string, z.ZodType | undefined][] = [
  ["series", "census or survey series", seriesJsonSchema],
  ["models", "growth model specs", modelBodySchema],
  ["rules", "harvest rule specs", ruleBodySchema],
  ["scenarios", "scenarios (model, rule, start, horizon, uncertainty)", scenarioBodySchema],
  ["fits", "model comparisons fitted to a series (a job)", fitBodySchema],
  [
    "analyses",
    "stability, margins (immediate), bifurcation diagrams and regime maps (jobs)",
    analysisBodySchema,
  ],
  ["projections", "stochastic projections (a job)", projectionBodySchema],
  ["comparisons", "rule comparisons on common random numbers (a job)", comparisonBodySchema],
];

const OPS: Op[] = [
  ...resources.flatMap(([name, what, body]): Op[] => [
    {
      method: "post",
      path: `/${name}`,
      summary: `Create: ${what}`,
      ...(body ? { body } : {}),
      ...(name === "series" ? { csvBody: true } : {}),
      ok: ["fits", "projections", "comparisons"].includes(name) ? 202 : 201,
    },
    { method: "get", path: `/${name}`, summary: `List ${what} (limit, offset)`, ok: 200 },
    { method: "get", path: `/${name}/{id}`, summary: `One of the ${what}`, ok: 200 },
    { method: "delete", path: `/${name}/{id}`, summary: `Delete one of the ${what}`, ok: 204 },
  ]),
  {
    method: "get",
    path: "/series/{id}/csv",
    summary: "The series as uploaded",
    ok: 200,
    produces: "text/csv",
  },
  {
    method: "get",
    path: "/projections/{id}/table.csv",
    summary: "Percentiles of abundance and catch per year",
    ok: 200,
    produces: "text/csv",
  },
  { method: "get", path: "/projections/{id}/table.json", summary: "The same table as JSON", ok: 200 },
  {
    method: "get",
    path: "/projections/{id}/risk.csv",
    summary: "Risk and yield metrics",
    ok: 200,
    produces: "text/csv",
  },
  { method: "get", path: "/projections/{id}/risk.json", summary: "The same metrics as JSON", ok: 200 },
  {
    method: "get",
    path: "/fits/{id}/table.csv",
    summary: "One row per fitted model: AICc, weight, r or R0 and K with intervals",
    ok: 200,
    produces: "text/csv",
  },
  { method: "get", path: "/fits/{id}/table.json", summary: "The same table as JSON", ok: 200 },
  {
    method: "get",
    path: "/analyses/{id}/table.csv",
    summary: "An analysis as a table (equilibria, margin sides, diagram values or map cells)",
    ok: 200,
    produces: "text/csv",
  },
  { method: "get", path: "/analyses/{id}/table.json", summary: "The same table as JSON", ok: 200 },
  {
    method: "get",
    path: "/comparisons/{id}/table.csv",
    summary: "One row per candidate rule",
    ok: 200,
    produces: "text/csv",
  },
  { method: "get", path: "/comparisons/{id}/table.json", summary: "The same table as JSON", ok: 200 },
  {
    method: "get",
    path: "/catalogue",
    summary:
      "Every growth family, harvest rule kind and setting: labels, unit kinds, ranges, defaults and sweep ranges",
    ok: 200,
  },
  { method: "get", path: "/jobs/{id}", summary: "A job's status and progress", ok: 200 },
  {
    method: "get",
    path: "/jobs/{id}/events",
    summary: "A job's progress as server-sent events (status, progress, end)",
    ok: 200,
    produces: "text/event-stream",
  },
  { method: "delete", path: "/jobs/{id}", summary: "Cancel a queued or running job", ok: 204 },
  {
    method: "get",
    path: "/report",
    summary: "Printable HTML report (query: scenario, fit, projection, comparison)",
    ok: 200,
    produces: "text/html",
  },
];

const problem = {
  type: "object",
  description: "RFC 9457 problem details",
  properties: {
    type: { type: "string" },
    title: { type: "string" },
    status: { type: "integer" },
    detail: { type: "string" },
    field: { type: "string", description: "the failing field, as a dotted path" },
    issue: { type: "object", description: "the core's issue, machine-readable" },
  },
  required: ["type", "title", "status", "detail"],
};

export function openApiDocument(version: string): Record<string, unknown> {
  const paths: Record<string, Record<string, unknown>> = {};
  for (const op of OPS) {
    const path = `/api/v1${op.path}`;
    const entry: Record<string, unknown> = {
      summary: op.summary,
      operationId: `${op.method}${op.path.replace(/[{}]/g, "").replace(/[/.](\w)/g, (_, c: string) => c.toUpperCase())}`,
      responses: {
        [String(op.ok)]: {
          description:
            op.ok === 202 ? "accepted: a job was started (see Location)" : op.ok === 204 ? "done" : "ok",
          ...(op.ok === 204 ? {} : { content: { [op.produces ?? "application/json"]: {} } }),
        },
        ...(op.method === "post"
          ? {
              "422": {
                description: "invalid input (the field is named)",
                content: { "application/problem+json": { schema: problem } },
              },
              "413": { description: "body too large" },
              "400": { description: "malformed JSON" },
            }
          : {}),
        ...(op.path.includes("{id}")
          ? {
              "404": {
                description: "unknown id",
                content: { "application/problem+json": { schema: problem } },
              },
            }
          : {}),
      },
    };
    if (op.path.includes("{id}"))
      entry.parameters = [{ name: "id", in: "path", required: true, schema: { type: "string" } }];
    if (op.body) {
      const content: Record<string, unknown> = {
        "application/json": { schema: z.toJSONSchema(op.body, { io: "input" }) },
      };
      if (op.csvBody)
        content["text/csv"] = {
          schema: { type: "string" },
          description: "the CSV itself; name in the query string (?name=…)",
        };
      entry.requestBody = { required: true, content };
    }
    (paths[path] ??= {})[op.method] = entry;
  }
  return {
    openapi: "3.1.0",
    info: {
      title: "yieldloop API",
      version,
      description:
        "Fit growth models to survey counts, test harvest rules for stability, project stock and catch. Results are model-based and uncertain; decisions follow the management authority's own procedures.",
    },
    paths,
    components: {
      schemas: { Problem: problem },
      securitySchemes: { bearer: { type: "http", scheme: "bearer" } },
    },
  };
}

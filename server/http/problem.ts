// RFC 9457 problem details: every error the API answers with, never a stack trace.
import type { Response } from "express";
import { describeIssue, type Issue } from "../../src/issues.js";

export interface Problem {
  readonly type: string;
  readonly title: string;
  readonly status: number;
  readonly detail: string;
  /** The failing field as a dotted path (`scenario.rule.rate`), when there is one. */
  readonly field?: string;
  /** The core's issue, machine-readable. */
  readonly issue?: Issue;
  readonly [extra: string]: unknown;
}

export const PROBLEM_TYPES = {
  invalid: "urn:yieldloop:problem:invalid-input",
  csv: "urn:yieldloop:problem:csv",
  malformed: "urn:yieldloop:problem:malformed-json",
  notFound: "urn:yieldloop:problem:not-found",
  tooLarge: "urn:yieldloop:problem:too-large",
  mediaType: "urn:yieldloop:problem:unsupported-media-type",
  unauthorised: "urn:yieldloop:problem:unauthorised",
  conflict: "urn:yieldloop:problem:conflict",
  internal: "urn:yieldloop:problem:internal",
} as const;

export function sendProblem(res: Response, problem: Problem): void {
  res.status(problem.status).type("application/problem+json").send(JSON.stringify(problem));
}

/** 422 for a core issue, naming the field (with `prefix` before it) or the CSV row and column. */
export function issueProblem(issue: Issue, prefix = ""): Problem {
  const named =
    prefix && "field" in issue
      ? ({
          ...issue,
          field: issue.field.startsWith(prefix) ? issue.field : `${prefix}.${issue.field}`,
        } as Issue)
      : issue;
  const csv = named.code.startsWith("csv_");
  const field =
    "field" in named
      ? named.field
      : "column" in named
        ? `row ${"row" in named ? named.row : "?"}, column ${named.column}`
        : undefined;
  return {
    type: csv ? PROBLEM_TYPES.csv : PROBLEM_TYPES.invalid,
    title: csv ? "The CSV could not be read" : "The request is not valid",
    status: 422,
    detail: describeIssue(named),
    ...(field !== undefined ? { field } : {}),
    ...("row" in named ? { row: named.row } : {}),
    ...("column" in named ? { column: named.column } : {}),
    issue: named,
  };
}

export function notFound(what: string, id: string): Problem {
  return {
    type: PROBLEM_TYPES.notFound,
    title: "Not found",
    status: 404,
    detail: `no ${what} with id "${id}"`,
  };
}

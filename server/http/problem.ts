// RFC 9457 problem details: every error the API answers with, never a stack trace. Each is
// made from a core issue: its status and title from the one table (../issue-table.ts), its
// detail from the issue's data (describeIssue).
import type { Response } from "express";
import { describeIssue, type Issue } from "../../src/issues.js";
import { ISSUE_TABLE, problemType } from "../issue-table.js";

export interface Problem {
  readonly type: string;
  readonly title: string;
  readonly status: number;
  readonly detail: string;
  /** The failing field as a dotted path (`scenario.rule.rate`), when there is one. */
  readonly field?: string;
  /** The core's issue, machine-readable. */
  readonly issue: Issue;
  readonly [extra: string]: unknown;
}

export function sendProblem(res: Response, problem: Problem): void {
  res.status(problem.status).type("application/problem+json").send(JSON.stringify(problem));
}

/** The problem document of an issue, naming the field (with `prefix` before it) or the CSV row and column. */
export function issueProblem(issue: Issue, prefix = ""): Problem {
  const named =
    prefix && "field" in issue
      ? ({
          ...issue,
          field: issue.field.startsWith(prefix) ? issue.field : `${prefix}.${issue.field}`,
        } as Issue)
      : issue;
  const field =
    "field" in named
      ? named.field
      : "column" in named
        ? `row ${"row" in named ? named.row : "?"}, column ${named.column}`
        : undefined;
  const { status, title } = ISSUE_TABLE[named.code];
  return {
    type: problemType(named.code),
    title,
    status,
    detail: describeIssue(named),
    ...(field !== undefined ? { field } : {}),
    ...("row" in named ? { row: named.row } : {}),
    ...("column" in named ? { column: named.column } : {}),
    issue: named,
  };
}

/** Answers with the problem document of an issue. */
export function sendIssue(res: Response, issue: Issue, prefix = ""): void {
  sendProblem(res, issueProblem(issue, prefix));
}

export function notFound(what: string, id: string): Problem {
  return issueProblem({ code: "not_found", what, id });
}

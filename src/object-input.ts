import type { Issue } from "./issues.js";

/**
 * The issue of an input that should be a JSON object and is not: missing when it is
 * undefined, else the wrong type with what it was ("array", "null", "string", …).
 */
export function objectIssue(input: unknown, field: string): Issue | undefined {
  if (input === undefined) return { code: "missing_field", field };
  if (input !== null && typeof input === "object" && !Array.isArray(input)) return undefined;
  return {
    code: "wrong_type",
    field,
    expected: "object",
    received: input === null ? "null" : Array.isArray(input) ? "array" : typeof input,
  };
}

import type { Issue } from "./issues.js";

/**
 * The outcome of a core call that a user's input can make fail.
 *
 * A failure is a value carrying an `Issue` (data, not prose); the HTTP and CLI edges turn
 * it into words. Exceptions are kept for broken invariants (bugs).
 */
export type Result<T> = { ok: true; value: T } | { ok: false; issue: Issue };

/** Wraps a value as a successful Result. */
export function ok<T>(value: T): Result<T> {
  return { ok: true, value };
}

/** Wraps an issue as a failed Result. */
export function fail<T = never>(issue: Issue): Result<T> {
  return { ok: false, issue };
}

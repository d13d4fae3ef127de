import type { z } from "zod";
import type { Issue } from "./issues.js";
import type { ParamInfo } from "./params.js";

/**
 * Turns the first issue of a zod error into the core's Issue, naming the field by its dotted
 * path (with `prefix` before it) and, for a range failure, the allowed range taken from the
 * ParamInfo table so the message matches the documented bounds.
 */
export function issueFromZod(
  error: z.ZodError,
  input: unknown,
  lookup: (path: readonly PropertyKey[]) => ParamInfo | undefined = () => undefined,
  prefix = "",
): Issue {
  const first = error.issues[0];
  if (first === undefined) throw new Error("issueFromZod: a zod error without issues");
  const path = first.path;
  const field = joinPath(prefix, path);
  const value = valueAt(input, path);
  switch (first.code) {
    case "invalid_type": {
      if (value === undefined) return { code: "missing_field", field };
      if (typeof value === "number" && !Number.isFinite(value)) {
        return { code: "not_finite", field, received: String(value) };
      }
      if (first.expected === "int" && typeof value === "number") {
        return { code: "not_an_integer", field, value };
      }
      return { code: "wrong_type", field, expected: first.expected, received: typeName(value) };
    }
    case "too_small":
    case "too_big": {
      if (typeof value === "number" && !Number.isFinite(value)) {
        return { code: "not_finite", field, received: String(value) };
      }
      // A string's or an array's length: "name is 300 characters; at most 200".
      if (typeof value === "string" || Array.isArray(value)) {
        const unit = typeof value === "string" ? "characters" : "items";
        const bound = Number(first.code === "too_small" ? first.minimum : first.maximum);
        return first.code === "too_small"
          ? { code: "too_short", field, length: value.length, minimum: bound, unit }
          : { code: "too_long", field, length: value.length, maximum: bound, unit };
      }
      const info = lookup(path);
      if (info) {
        return {
          code: "param_out_of_range",
          field,
          value: Number(value),
          min: info.min,
          max: info.max,
          minInclusive: info.minInclusive,
          maxInclusive: info.maxInclusive,
        };
      }
      const bound = Number(first.code === "too_small" ? first.minimum : first.maximum);
      return first.code === "too_small"
        ? {
            code: "param_out_of_range",
            field,
            value: Number(value),
            min: bound,
            minInclusive: first.inclusive ?? true,
          }
        : {
            code: "param_out_of_range",
            field,
            value: Number(value),
            max: bound,
            maxInclusive: first.inclusive ?? true,
          };
    }
    case "invalid_value":
      return {
        code: "unknown_option",
        field,
        value: String(value),
        allowed: first.values.map((v) => String(v)),
      };
    case "unrecognized_keys":
      return { code: "unknown_field", field: joinPath(prefix, [...path, first.keys[0] ?? "?"]) };
    default:
      return { code: "constraint_violated", field, constraint: first.message };
  }
}

/** Joins a prefix and a zod path as `a.b[2].c`. */
export function joinPath(prefix: string, path: readonly PropertyKey[]): string {
  let out = prefix;
  for (const key of path) {
    if (typeof key === "number") out += `[${key}]`;
    else out += out === "" ? String(key) : `.${String(key)}`;
  }
  return out === "" ? "(input)" : out;
}

function valueAt(input: unknown, path: readonly PropertyKey[]): unknown {
  let v: unknown = input;
  for (const key of path) {
    if (v === null || typeof v !== "object") return undefined;
    v = (v as Record<PropertyKey, unknown>)[key];
  }
  return v;
}

function typeName(v: unknown): string {
  if (v === null) return "null";
  if (Array.isArray(v)) return "array";
  return typeof v;
}

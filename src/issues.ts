/**
 * The core's issue union: every way a user's input can make a core call fail.
 *
 * Issues carry data, not prose. `field` is a dotted path into the input that was given
 * (`params.K`, `rule.surveyLag`, `start[2]`), so an edge can name it to the user.
 */
export type Issue =
  | {
      code: "param_out_of_range";
      field: string;
      value: number;
      min?: number;
      max?: number;
      minInclusive?: boolean;
      maxInclusive?: boolean;
    }
  | { code: "not_finite"; field: string; received: string }
  | { code: "missing_field"; field: string }
  | { code: "wrong_type"; field: string; expected: string; received: string }
  | { code: "not_an_integer"; field: string; value: number }
  | { code: "unknown_family"; field: string; value: string; allowed: readonly string[] }
  | { code: "unknown_rule"; field: string; value: string; allowed: readonly string[] }
  | { code: "unknown_option"; field: string; value: string; allowed: readonly string[] }
  | { code: "unknown_field"; field: string }
  | { code: "constraint_violated"; field: string; constraint: string }
  | {
      code: "settings_out_of_order";
      field: string;
      value: number;
      other: string;
      otherValue: number;
      relation: "below" | "above";
    }
  | { code: "no_finite_msy"; field: string; value: number; family: string }
  | { code: "csv_malformed"; row: number; detail: string }
  | { code: "csv_missing_column"; column: string; allowed: readonly string[] }
  | { code: "csv_unrecognised_column"; column: string; allowed: readonly string[] }
  | { code: "csv_cell"; row: number; column: string; value: string; expected: string }
  | { code: "csv_duplicate_year"; row: number; column: string; year: number; firstRow: number }
  | { code: "csv_no_observations"; column: string }
  | { code: "csv_implausible_catch"; row: number; column: string; value: number; limit: number }
  | { code: "csv_too_large"; rows: number; maximum: number }
  | { code: "series_too_short"; minimum: number; actual: number }
  | { code: "fit_not_converged"; iterations: number }
  | { code: "too_long"; field: string; length: number; maximum: number; unit: "characters" | "items" }
  | { code: "too_short"; field: string; length: number; minimum: number; unit: "characters" | "items" }
  | { code: "csv_empty"; field: string }
  // Issues of the request itself, raised at the edges (HTTP and command line).
  | { code: "malformed_json"; detail: string }
  | { code: "body_not_object"; received: string }
  | { code: "body_too_large"; limit: string }
  | { code: "unsupported_media_type"; expected: string }
  | { code: "unsupported_encoding" }
  | { code: "bad_request" }
  | { code: "unauthorised" }
  | { code: "not_found"; what: string; id: string }
  | { code: "route_not_found"; method: string; path: string }
  | { code: "job_already_ended"; id: string; status: string }
  | { code: "internal" };

/** The list of issue codes, derived from the union. */
export type IssueCode = Issue["code"];

/**
 * A one-line English rendering of an issue, for logs, the CLI and problem `detail` fields.
 * The issue itself stays the contract; this text may change.
 */
export function describeIssue(issue: Issue): string {
  switch (issue.code) {
    case "param_out_of_range":
      return `${issue.field} = ${num(issue.value)} is outside the allowed range ${rangeText(issue)}`;
    case "not_finite":
      return `${issue.field} must be a finite number (received "${issue.received}")`;
    case "missing_field":
      return `${issue.field} is required`;
    case "wrong_type":
      return `${issue.field} must be ${issue.expected} (received ${issue.received})`;
    case "not_an_integer":
      return `${issue.field} must be a whole number (received ${num(issue.value)})`;
    case "unknown_family":
    case "unknown_rule":
    case "unknown_option":
      return `${issue.field} = "${issue.value}" is not one of: ${issue.allowed.join(", ")}`;
    case "unknown_field":
      return `${issue.field} is not a recognised field`;
    case "constraint_violated":
      return `${issue.field}: ${issue.constraint}`;
    case "settings_out_of_order":
      return `${issue.field} = ${num(issue.value)} must be ${issue.relation} ${issue.other} = ${num(issue.otherValue)}`;
    case "no_finite_msy":
      return `the ${issue.family} model has no finite MSY at ${issue.field} = ${num(issue.value)} (production grows without bound at low stock)`;
    case "csv_malformed":
      return `row ${issue.row}: the CSV is malformed (${issue.detail})`;
    case "csv_missing_column":
      return `the CSV needs a "${issue.column}" column (one of: ${issue.allowed.join(", ")})`;
    case "csv_unrecognised_column":
      return `column "${issue.column}" looks like a catch, stocking or error column but is not one of the names read (${issue.allowed.join(", ")}; a unit may follow in brackets, as "catch (t)"); rename it, or remove it if it is not needed`;
    case "csv_cell":
      return `row ${issue.row}, column "${issue.column}": "${issue.value}" is not ${issue.expected}`;
    case "csv_duplicate_year":
      return `row ${issue.row}, column "${issue.column}": year ${issue.year} already appears in row ${issue.firstRow}`;
    case "csv_no_observations":
      return `column "${issue.column}" has no observed values`;
    case "csv_implausible_catch":
      return `row ${issue.row}, column "${issue.column}": a catch of ${num(issue.value)} is larger than any plausible stock (more than ${num(issue.limit)}, 100 times the largest count)`;
    case "csv_too_large":
      return `the CSV has ${issue.rows} rows; at most ${issue.maximum} are accepted`;
    case "series_too_short":
      return `the series has ${issue.actual} usable points; at least ${issue.minimum} are needed`;
    case "fit_not_converged":
      return `the fit did not converge after ${issue.iterations} iterations`;
    case "too_long":
      return `${issue.field} is ${issue.length} ${issue.unit}; at most ${issue.maximum}`;
    case "too_short":
      return `${issue.field} is ${issue.length} ${issue.unit}; at least ${issue.minimum}`;
    case "csv_empty":
      return `${issue.field}: the CSV is empty`;
    case "malformed_json":
      return `the request body is not valid JSON (${issue.detail})`;
    case "body_not_object":
      return `the request body must be a JSON object (received ${issue.received})`;
    case "body_too_large":
      return `the request body is larger than this server accepts (${issue.limit})`;
    case "unsupported_media_type":
      return `send the body as ${issue.expected}`;
    case "unsupported_encoding":
      return "send the body as UTF-8";
    case "bad_request":
      return "the request could not be read";
    case "unauthorised":
      return "this server needs an API token: send Authorization: Bearer <token>";
    case "not_found":
      return `no ${issue.what} with id "${issue.id}"`;
    case "route_not_found":
      return `no route ${issue.method} ${issue.path}`;
    case "job_already_ended":
      return `job "${issue.id}" is ${issue.status}; only queued or running jobs can be cancelled`;
    case "internal":
      return "the server failed to answer this request; it has been logged";
  }
}

/** Renders a numeric range such as "(0, 1)" or "[0, 20]"; open ends print as ∞. */
export function rangeText(r: {
  min?: number;
  max?: number;
  minInclusive?: boolean;
  maxInclusive?: boolean;
}): string {
  const lo = r.min === undefined ? "(−∞" : `${r.minInclusive ? "[" : "("}${num(r.min)}`;
  const hi = r.max === undefined ? "∞)" : `${num(r.max)}${r.maxInclusive ? "]" : ")"}`;
  return `${lo}, ${hi}`;
}

/** A number as a message writes it: never "NaN" or "Infinity" (issues may carry what a user typed). */
export function num(x: number): string {
  if (Number.isFinite(x)) return String(x);
  return Number.isNaN(x) ? "not a number" : x > 0 ? "∞" : "−∞";
}

// The one table from an issue code to its HTTP status and its title, for the API's problem
// documents (http/problem.ts) and the command line's one-line messages. The text of an
// issue (its detail) is made from its data by describeIssue in src/issues.ts.
//
// A body that cannot be read as a request (not JSON, not an object, too large, the wrong
// media type) is 400/413/415; a well-formed request with a bad value is 422 naming the
// field; something that does not exist is 404.
import type { IssueCode } from "../src/issues.js";

export interface IssueEntry {
  readonly status: number;
  readonly title: string;
}

const invalid = (title: string): IssueEntry => ({ status: 422, title });
const csv = invalid("The CSV could not be read");

export const ISSUE_TABLE: Readonly<Record<IssueCode, IssueEntry>> = {
  param_out_of_range: invalid("A value is outside its allowed range"),
  not_finite: invalid("A value is not a finite number"),
  missing_field: invalid("A required field is missing"),
  wrong_type: invalid("A value has the wrong type"),
  not_an_integer: invalid("A value must be a whole number"),
  unknown_family: invalid("Unknown growth family"),
  unknown_rule: invalid("Unknown harvest rule"),
  unknown_option: invalid("Not one of the allowed options"),
  unknown_field: invalid("Unknown field"),
  constraint_violated: invalid("The request is not valid"),
  settings_out_of_order: invalid("Two settings are out of order"),
  no_finite_msy: invalid("The model has no finite MSY"),
  too_long: invalid("A value is too long"),
  too_short: invalid("A value is too short"),
  csv_malformed: csv,
  csv_missing_column: csv,
  csv_unrecognised_column: csv,
  csv_cell: csv,
  csv_duplicate_year: csv,
  csv_no_observations: csv,
  csv_implausible_catch: csv,
  csv_too_large: csv,
  csv_empty: csv,
  series_too_short: invalid("The series is too short for this model"),
  // A fit that does not converge is reported inside the fit's result (its skipped models);
  // this entry is for the command line and for a job that could fit nothing at all.
  fit_not_converged: invalid("The fit did not converge"),
  malformed_json: { status: 400, title: "Malformed JSON" },
  body_not_object: { status: 400, title: "The body is not a JSON object" },
  body_too_large: { status: 413, title: "Body too large" },
  unsupported_media_type: { status: 415, title: "Unsupported media type" },
  unsupported_encoding: { status: 415, title: "Unsupported encoding" },
  bad_request: { status: 400, title: "Bad request" },
  unauthorised: { status: 401, title: "Unauthorised" },
  not_found: { status: 404, title: "Not found" },
  route_not_found: { status: 404, title: "Not found" },
  job_already_ended: { status: 409, title: "The job has already ended" },
  internal: { status: 500, title: "Internal error" },
};

/** The stable `type` URI of an issue code's problem documents. */
export function problemType(code: IssueCode): string {
  return `urn:yieldloop:problem:${code.replace(/_/g, "-")}`;
}

import { parse } from "csv-parse/sync";
import type { Issue } from "../issues.js";
import { fail, ok, type Result } from "../result.js";
import { type ColumnRole, mapColumns, type SeriesColumn } from "./series-columns.js";

/** Largest number of data rows accepted in one series. */
export const MAX_SERIES_ROWS = 10_000;

/** A census or survey series on an annual timeline from the first to the last year. */
export interface Series {
  readonly years: number[];
  /** The count or abundance index; null where not observed (a gap or an empty cell). */
  readonly count: (number | null)[];
  /** Catch taken each year (0 where not recorded, with a warning). */
  readonly catch: number[];
  /** Animals released each year (0 where not recorded). */
  readonly stocking: number[];
  /** Coefficient of variation of each count, null where not given. */
  readonly cv: (number | null)[];
  /** Further index columns by name, aligned with `years`. */
  readonly indices: Record<string, (number | null)[]>;
  readonly warnings: SeriesWarning[];
  /** Every column of the file: what it was read as, and the unit its header declared (absent for a series built in code). */
  readonly columns?: SeriesColumn[];
}

export type SeriesWarning =
  | { code: "years_sorted" }
  | { code: "years_missing"; years: number[] }
  | { code: "catch_not_recorded"; years: number[] };

/**
 * Parses a tidy series CSV (RFC 4180, one header row): `year`, `count` (or `index` /
 * `abundance`), optional `catch`, `stocking`, `cv`, and any further numeric index columns.
 *
 * Every failure names the row (the file's line, header = row 1) and the column: a malformed
 * line, a non-numeric or negative cell, a fractional or duplicate year, a count column with
 * no observation, a catch above 100× the largest count (no stock the counts describe could
 * yield it, even for a survey that sees 1% of the stock — common practice, no source).
 * Unsorted years are sorted with a warning; missing years become unobserved rows; empty
 * cells mean "not observed" (an unrecorded catch or stocking is taken as 0, with a warning).
 */
export function parseSeriesCsv(text: string): Result<Series> {
  return readSeries(text, null);
}

/** Most problems seriesProblems lists. */
export const MAX_LISTED_PROBLEMS = 100;

/**
 * Every cell-level problem of a series CSV (bad cells, duplicate years), row by row, up to
 * MAX_LISTED_PROBLEMS, so a user can fix them all at once; or the one problem that stops
 * the file being read at all (malformed CSV, a missing column). Empty when the CSV is valid.
 */
export function seriesProblems(text: string): Issue[] {
  const list: Issue[] = [];
  const r = readSeries(text, list);
  if (!r.ok && list.length === 0) list.push(r.issue);
  return list;
}

function readSeries(text: string, collect: Issue[] | null): Result<Series> {
  let records: string[][];
  try {
    records = parse(text, {
      skip_empty_lines: true,
      trim: true,
      bom: true,
      relax_column_count: false,
    }) as string[][];
  } catch (e) {
    const err = e as { lines?: number; message?: string };
    return fail({
      code: "csv_malformed",
      row: err.lines ?? 1,
      detail: (err.message ?? "unreadable").split("\n")[0]!.slice(0, 200),
    });
  }
  if (records.length === 0) return fail({ code: "csv_missing_column", column: "year", allowed: ["year"] });
  if (records.length - 1 > MAX_SERIES_ROWS)
    return fail({ code: "csv_too_large", rows: records.length - 1, maximum: MAX_SERIES_ROWS });
  const mapped = mapColumns(records[0]!);
  if (!mapped.ok) return fail(mapped.issue);
  const columns = mapped.columns;
  const col = (role: ColumnRole) => columns.findIndex((c) => c.readAs === role);
  const yearCol = col("year");
  const countCol = col("count");
  const catchCol = col("catch");
  const stockCol = col("stocking");
  const cvCol = col("cv");
  const extra = columns.map((_c, i) => i).filter((i) => columns[i]!.readAs === "index");

  type Row = {
    line: number;
    year: number;
    count: number | null;
    catch: number | null;
    stocking: number | null;
    cv: number | null;
    extra: (number | null)[];
  };
  const rows: Row[] = [];
  const seen = new Map<number, number>();
  // A problem in a row: stop at the first one (parseSeriesCsv), or note it and skip the row.
  let collected: Issue | null = null;
  const problem = (issue: Issue): boolean => {
    if (!collect) return true;
    if (collect.length < MAX_LISTED_PROBLEMS) collect.push(issue);
    collected ??= issue;
    return false;
  };
  for (let r = 1; r < records.length; r++) {
    const rec = records[r]!;
    const line = r + 1;
    const cell = (col: number, expected: "year" | "nonneg" | "positive"): Result<number | null> => {
      const raw = rec[col] ?? "";
      if (raw === "" || raw.toUpperCase() === "NA") return ok(null);
      const v = Number(raw);
      const name = records[0]![col]!;
      if (!/^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(raw) || !Number.isFinite(v)) {
        return fail({
          code: "csv_cell",
          row: line,
          column: name,
          value: raw,
          expected: expected === "year" ? "a whole year" : "a number",
        });
      }
      if (expected === "year" && !Number.isInteger(v))
        return fail({ code: "csv_cell", row: line, column: name, value: raw, expected: "a whole year" });
      if (expected === "nonneg" && v < 0)
        return fail({ code: "csv_cell", row: line, column: name, value: raw, expected: "a number ≥ 0" });
      if (expected === "positive" && !(v > 0))
        return fail({ code: "csv_cell", row: line, column: name, value: raw, expected: "a number > 0" });
      return ok(v);
    };
    const year = cell(yearCol, "year");
    if (!year.ok) {
      if (problem(year.issue)) return year;
      continue;
    }
    if (year.value === null) {
      const issue: Issue = {
        code: "csv_cell",
        row: line,
        column: records[0]![yearCol]!,
        value: "",
        expected: "a whole year",
      };
      if (problem(issue)) return fail(issue);
      continue;
    }
    const first = seen.get(year.value);
    if (first !== undefined) {
      const issue: Issue = {
        code: "csv_duplicate_year",
        row: line,
        column: records[0]![yearCol]!,
        year: year.value,
        firstRow: first,
      };
      if (problem(issue)) return fail(issue);
      continue;
    }
    seen.set(year.value, line);
    let rowBad = false;
    const values: (number | null)[] = [];
    for (const [col, kind] of [
      [countCol, "nonneg"],
      [catchCol, "nonneg"],
      [stockCol, "nonneg"],
      [cvCol, "positive"],
    ] as const) {
      if (col < 0) {
        values.push(null);
        continue;
      }
      const v = cell(col, kind);
      if (!v.ok) {
        if (problem(v.issue)) return v;
        rowBad = true;
      }
      values.push(v.ok ? v.value : null);
    }
    const extras: (number | null)[] = [];
    for (const col of extra) {
      const v = cell(col, "nonneg");
      if (!v.ok) {
        if (problem(v.issue)) return v;
        rowBad = true;
      }
      extras.push(v.ok ? v.value : null);
    }
    if (rowBad) continue;
    rows.push({
      line,
      year: year.value,
      count: values[0]!,
      catch: values[1]!,
      stocking: values[2]!,
      cv: values[3]!,
      extra: extras,
    });
  }
  if (collected) return fail(collected);
  const warnings: SeriesWarning[] = [];
  const sorted = [...rows].sort((a, b) => a.year - b.year);
  if (sorted.some((r, i) => r !== rows[i])) warnings.push({ code: "years_sorted" });
  if (!sorted.some((r) => r.count !== null))
    return fail({ code: "csv_no_observations", column: records[0]![countCol]! });
  const maxCount = Math.max(...sorted.map((r) => r.count ?? 0));
  for (const r of sorted) {
    if (r.catch !== null && r.catch > 100 * maxCount) {
      return fail({
        code: "csv_implausible_catch",
        row: r.line,
        column: records[0]![catchCol]!,
        value: r.catch,
        limit: 100 * maxCount,
      } satisfies Issue);
    }
  }
  const y0 = sorted[0]!.year;
  const y1 = sorted[sorted.length - 1]!.year;
  if (y1 - y0 + 1 > MAX_SERIES_ROWS)
    return fail({ code: "csv_too_large", rows: y1 - y0 + 1, maximum: MAX_SERIES_ROWS });
  const byYear = new Map(sorted.map((r) => [r.year, r]));
  const years: number[] = [];
  const missingYears: number[] = [];
  const unrecordedCatch: number[] = [];
  const series = {
    count: [] as (number | null)[],
    catch: [] as number[],
    stocking: [] as number[],
    cv: [] as (number | null)[],
  };
  const indices: Record<string, (number | null)[]> = {};
  for (const col of extra) indices[records[0]![col]!] = [];
  for (let y = y0; y <= y1; y++) {
    years.push(y);
    const r = byYear.get(y);
    if (!r) missingYears.push(y);
    if (catchCol >= 0 && (r === undefined || r.catch === null)) unrecordedCatch.push(y);
    series.count.push(r?.count ?? null);
    series.catch.push(r?.catch ?? 0);
    series.stocking.push(r?.stocking ?? 0);
    series.cv.push(r?.cv ?? null);
    extra.forEach((col, k) => indices[records[0]![col]!]!.push(r?.extra[k] ?? null));
  }
  if (missingYears.length > 0) warnings.push({ code: "years_missing", years: missingYears });
  if (unrecordedCatch.length > 0) warnings.push({ code: "catch_not_recorded", years: unrecordedCatch });
  return ok({ years, ...series, indices, warnings, columns });
}

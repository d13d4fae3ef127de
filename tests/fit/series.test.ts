import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { parseSeriesCsv, seriesProblems } from "../../src/fit/series.js";
import { describeIssue } from "../../src/issues.js";
import { unwrap } from "../helpers.js";

// Rules of the series format (RFC 4180 CSV, documented in src/fit/series.ts); the expected
// row numbers count the header as row 1, as a spreadsheet shows them.

describe("series CSV", () => {
  it("reads the demo lake series: 32 years, two lost surveys, catches, stocking and cv", () => {
    const s = unwrap(
      parseSeriesCsv(
        readFileSync(new URL("../../data-demo/tarnvell-perch/series.csv", import.meta.url), "utf8"),
      ),
    );
    expect(s.years.length).toBe(32);
    expect(s.count.filter((c) => c === null).length).toBe(2);
    expect(s.stocking.filter((a) => a > 0).length).toBe(10);
    expect(s.cv.every((c) => c === 0.2)).toBe(true);
  });

  it("sorts unsorted years with a warning and fills missing years as unobserved", () => {
    const s = unwrap(parseSeriesCsv("year,count,catch\n2003,10,1\n2001,12,\n2000,11,2\n"));
    expect(s.years).toEqual([2000, 2001, 2002, 2003]);
    expect(s.count).toEqual([11, 12, null, 10]);
    expect(s.catch).toEqual([2, 0, 0, 1]);
    expect(s.warnings).toEqual([
      { code: "years_sorted" },
      { code: "years_missing", years: [2002] },
      { code: "catch_not_recorded", years: [2001, 2002] },
    ]);
  });

  it("keeps further index columns and accepts 'index' for the count", () => {
    const s = unwrap(parseSeriesCsv("year,index,trawl\n1,3,4\n2,5,\n"));
    expect(s.count).toEqual([3, 5]);
    expect(s.indices).toEqual({ trawl: [4, null] });
  });

  const cases: [string, string, object][] = [
    [
      "a non-numeric cell",
      "year,count\n2000,12\n2001,lots\n",
      { code: "csv_cell", row: 3, column: "count", value: "lots", expected: "a number" },
    ],
    [
      "a negative count",
      "year,count\n2000,-4\n",
      { code: "csv_cell", row: 2, column: "count", value: "-4", expected: "a number ≥ 0" },
    ],
    [
      "a fractional year",
      "year,count\n2000.5,4\n",
      { code: "csv_cell", row: 2, column: "year", value: "2000.5", expected: "a whole year" },
    ],
    [
      "a duplicate year",
      "year,count\n2000,4\n2001,5\n2000,6\n",
      { code: "csv_duplicate_year", row: 4, column: "year", year: 2000, firstRow: 2 },
    ],
    ["no count column", "year,catch\n2000,4\n", { code: "csv_missing_column", column: "count" }],
    [
      "all counts missing",
      "year,count,catch\n2000,,4\n2001,,3\n",
      { code: "csv_no_observations", column: "count" },
    ],
    [
      "a catch no stock could yield",
      "year,count,catch\n2000,10,5\n2001,12,5000\n",
      { code: "csv_implausible_catch", row: 3, column: "catch", value: 5000, limit: 1200 },
    ],
    [
      "a zero cv",
      "year,count,cv\n2000,10,0\n",
      { code: "csv_cell", row: 2, column: "cv", expected: "a number > 0" },
    ],
    ["a ragged row", "year,count\n2000,10\n2001,11,7\n", { code: "csv_malformed", row: 3 }],
  ];
  for (const [what, text, issue] of cases) {
    it(`names the row and column of ${what}`, () => {
      const r = parseSeriesCsv(text);
      expect(r.ok).toBe(false);
      if (r.ok) return;
      expect(r.issue).toMatchObject(issue);
      expect(describeIssue(r.issue).length).toBeGreaterThan(10);
    });
  }
});

// The page lists every problem at once; the rule (one line per bad cell, in row order, the
// first one also the error of parseSeriesCsv) is common practice, no source.
describe("every problem of a CSV, row by row", () => {
  it("lists each bad cell and duplicate year with its row and column", () => {
    const text = "year,count,catch\n2000,10,1\n2001,ten,1\n2002,5,-3\n2001,7,1\n2004,x,y\n";
    const list = seriesProblems(text);
    expect(list.map((p) => ("row" in p ? p.row : 0))).toEqual([3, 4, 5, 6, 6]);
    expect(list[0]).toMatchObject({ code: "csv_cell", column: "count", value: "ten" });
    expect(list[1]).toMatchObject({ code: "csv_cell", column: "catch", expected: "a number ≥ 0" });
    expect(list[2]).toMatchObject({ code: "csv_duplicate_year", year: 2001, firstRow: 3 });
    expect(list[4]).toMatchObject({ column: "catch", value: "y" });
    const first = parseSeriesCsv(text);
    expect(first.ok ? null : first.issue).toEqual(list[0]);
  });
  it("is empty for a valid CSV and holds the one problem that stops reading", () => {
    expect(seriesProblems("year,count\n2000,1\n2001,2\n")).toEqual([]);
    expect(seriesProblems("year,total\n2000,1\n")).toMatchObject([
      { code: "csv_missing_column", column: "count" },
    ]);
  });
});

// Column mapping: what each column was read as is said, and a column that looks like a catch
// but is not one of the names read is refused rather than read as an index (rules of this
// project, no external source).
describe("series columns", () => {
  it("reads a unit from the header and says what every column was read as", () => {
    const s = unwrap(parseSeriesCsv("Year,Index (kg/h),Catch (t),survey2\n2000,10,1,3\n2001,12,2,4\n"));
    expect(s.columns).toEqual([
      { column: "Year", readAs: "year", unit: null },
      { column: "Index (kg/h)", readAs: "count", unit: "kg/h" },
      { column: "Catch (t)", readAs: "catch", unit: "t" },
      { column: "survey2", readAs: "index", unit: null },
    ]);
    expect(s.catch).toEqual([1, 2]);
    expect(unwrap(parseSeriesCsv("year,count,catch_kg\n2000,10,5\n2001,11,6\n")).catch).toEqual([5, 6]);
  });

  it("refuses a catch-like column it does not recognise, naming it and the names it reads", () => {
    for (const header of ["landings", "Harvest", "catch_total_kg", "releases", "se"]) {
      const r = parseSeriesCsv(`year,count,${header}\n2000,10,5\n2001,11,6\n`);
      expect(r.ok || r.issue, header).toEqual({
        code: "csv_unrecognised_column",
        column: header,
        allowed: ["catch", "stocking", "cv"],
      });
    }
    // A plain further index is still read as one.
    expect(unwrap(parseSeriesCsv("year,count,trawl\n2000,10,5\n2001,11,6\n")).indices.trawl).toEqual([5, 6]);
  });
});

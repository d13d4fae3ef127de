import { describe, expect, it } from "vitest";
import { loadDemo } from "../../server/demo-data.js";
import { csvField, toCsv } from "../../server/export/csv.js";
import { niceTicks } from "../../server/export/svg-chart.js";
import { openDatabase } from "../../server/store/database.js";
import { MIGRATIONS } from "../../server/store/migrations.js";
import { Repository } from "../../server/store/repository.js";

describe("demo data", () => {
  it("loads once: a second load adds nothing", () => {
    const repo = new Repository(openDatabase(":memory:"));
    expect(loadDemo(repo)).toEqual({ series: 2, scenarios: 2, rules: 6 });
    expect(loadDemo(repo)).toEqual({ series: 0, scenarios: 0, rules: 0 });
    expect(repo.listSpecs("scenario", { limit: 10, offset: 0 }).map((s) => s.name)).toEqual([
      "Skerra island deer: a fixed annual cull against a cull rate",
      "Tarn Vell perch: a threshold rule on last year's net survey",
    ]);
  });
});

describe("the store", () => {
  it("records its schema version and applies migrations once", () => {
    const db = openDatabase(":memory:");
    expect(db.prepare("SELECT MAX(version) AS v FROM schema_version").get()).toEqual({
      v: MIGRATIONS.length,
    });
    expect(db.pragma("foreign_keys", { simple: true })).toBe(1);
  });
});

// RFC 4180 §2: fields containing commas, double quotes or line breaks are enclosed in double
// quotes; a double quote inside is escaped by doubling it; records end with CRLF.
describe("CSV export (RFC 4180)", () => {
  it("quotes only where needed and doubles quotes", () => {
    expect(csvField("plain")).toBe("plain");
    expect(csvField("a,b")).toBe('"a,b"');
    expect(csvField('say "hi"')).toBe('"say ""hi"""');
    expect(csvField("two\nlines")).toBe('"two\nlines"');
    expect(csvField(null)).toBe("");
    expect(csvField(0.1 + 0.2)).toBe("0.3");
    expect(
      toCsv(
        ["x", "y (unit)"],
        [
          [1, "a,b"],
          [null, 2],
        ],
      ),
    ).toBe('x,y (unit)\r\n1,"a,b"\r\n,2\r\n');
  });
  it("axis ticks are steps of 1, 2 or 5 × 10^k (common practice, no source)", () => {
    expect(niceTicks(0, 1050)).toEqual([0, 500, 1000]);
    expect(niceTicks(0, 700)).toEqual([0, 200, 400, 600]);
    expect(niceTicks(2027, 2052, 8)).toEqual([2030, 2035, 2040, 2045, 2050]);
  });
});

// Prints "N passed, N failed[, N skipped]" from vitest's JSON report, for CI logs.
// Exits non-zero when the report is missing, has failures, or ran no test at all.
import { existsSync, readFileSync } from "node:fs";

const file = process.argv[2] ?? ".vitest-report.json";
if (!existsSync(file)) {
  console.error(`test summary: no vitest report at ${file}`);
  process.exit(1);
}
const report = JSON.parse(readFileSync(file, "utf8"));
const passed = report.numPassedTests ?? 0;

const skipped = (report.numPendingTests ?? 0) + (report.numTodoTests ?? 0);
console.log(`${passed} passed, ${report.numFailedTests ?? 0} failed${skipped ? `, ${skipped} skipped` : ""}`);
// Say plainly when the browser tests did not run, and how to run them.
const browserSkipped = (report.testResults ?? []).some(
  (f) =>
    /tests[\\/]e2e[\\/]/.test(f.name) &&
    (f.assertionResults ?? []).some((t) => t.status === "pending" || t.status === "skipped"),
);
if (browserSkipped)
  console.log(
    "browser tests skipped: Debian's chromium was not found at /usr/bin/chromium (install it with `apt-get install -y chromium`, or set YIELDLOOP_CHROMIUM to its path)",
  );
if ((report.numFailedTests ?? 0) > 0 || (report.numFailedTestSuites ?? 0) > 0 || passed === 0)
  process.exit(1);

// Plain-text analysis of the bundled demo scenario (`npm start`), until the server exists.
// Reads the invented scenario in data-demo/, calls src/, and prints; no mathematics here.
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { describeIssue, msy, parseScenario, project, type Projection } from "../src/index.js";
import { parseSeriesCsv } from "../src/fit/series.js";
import { compareModels } from "../src/fit/compare-models.js";

const file = fileURLToPath(new URL("../data-demo/scenarios/tarnvell-perch.json", import.meta.url));
const demo = JSON.parse(readFileSync(file, "utf8")) as {
  title: string;
  note: string;
  model: unknown;
  rule: unknown;
  alternatives: { label: string; rule: unknown }[];
  start: unknown;
  horizon: number;
  startYear: number;
};

function fail(message: string): never {
  process.stderr.write(`yieldloop: ${message}\n`);
  process.exit(2);
}

const fmt = (v: number) => Math.round(v).toLocaleString("en-GB");
const scenario = parseScenario({ model: demo.model, rule: demo.rule, start: demo.start, horizon: demo.horizon, startYear: demo.startYear });
if (!scenario.ok) fail(describeIssue(scenario.issue));
const s = scenario.value;
const yields = msy(s.model, s.rule.timing);

const lines: string[] = [];
lines.push(`yieldloop demo: ${demo.title}`);
lines.push(demo.note, "");
lines.push(`Model: ${s.model.growth.title}, ${s.model.growth.equation}`);
lines.push(`       ${Object.entries(s.model.params).map(([k, v]) => `${k} = ${v}`).join(", ")}; delay T = ${s.model.delay}`);
lines.push(`       source: ${s.model.growth.source}`);
if (yields.ok) {
  const y = yields.value;
  lines.push(`MSY under a constant rate (${y.method}): ${fmt(y.msy)} fish/year at N_MSY = ${fmt(y.nMsy)}, h_MSY = ${(100 * y.hMsy).toFixed(1)}%`);
}
lines.push(`Rule:  ${s.rule.kind}, harvest ${s.rule.timing} reproduction, survey lag ${s.rule.surveyLag} year(s)`, "");

function table(p: Projection): string[] {
  const out = ["  year   survey    quota    catch  abundance next year"];
  for (let t = 0; t < p.years.length; t++) {
    out.push(`  ${p.years[t]}  ${fmt(p.survey[t]!).padStart(7)}  ${fmt(p.quota[t]!).padStart(7)}  ${fmt(p.catch[t]!).padStart(7)}  ${fmt(p.abundance[t + 1]!).padStart(9)}`);
  }
  if (p.status === "unbounded") out.push("  (the run left all bounds and was stopped: unbounded)");
  if (p.extinctionYear !== null) out.push(`  the stock was extinct from ${p.extinctionYear}`);
  return out;
}

const main = project(s);
lines.push(`Deterministic projection, ${s.horizon} years:`, ...table(main), "");
lines.push("Candidate rules, deterministic projection (mean catch, final abundance):");
for (const alt of [{ label: "the threshold rule above", rule: demo.rule }, ...demo.alternatives]) {
  const sc = parseScenario({ model: demo.model, rule: alt.rule, start: demo.start, horizon: demo.horizon, startYear: demo.startYear });
  if (!sc.ok) fail(`${alt.label}: ${describeIssue(sc.issue)}`);
  const p = project(sc.value);
  const mean = p.catch.reduce((a, b) => a + b, 0) / Math.max(1, p.catch.length);
  const fate = p.extinctionYear !== null ? `extinct from ${p.extinctionYear}` : `ends at ${fmt(p.abundance.at(-1)!)}`;
  lines.push(`  ${alt.label.padEnd(40)} mean catch ${fmt(mean).padStart(6)}   ${fate}`);
}
// Fit every family to the invented lake survey and show the ranking.
const csv = readFileSync(fileURLToPath(new URL("../data-demo/tarnvell-perch/series.csv", import.meta.url)), "utf8");
const series = parseSeriesCsv(csv);
if (!series.ok) fail(describeIssue(series.issue));
const cmp = compareModels(series.value, { delays: [0] });
if (cmp.ok) {
  lines.push("", "Fits to the invented Tarn Vell survey (observation error, lognormal), best first:");
  lines.push("  model                              AICc   ΔAICc  weight  trustworthy  verdict");
  for (const f of cmp.value.fits) {
    lines.push(`  ${f.family.padEnd(32)} ${f.aicc.toFixed(1).padStart(6)} ${f.deltaAicc.toFixed(1).padStart(7)} ${f.weight.toFixed(2).padStart(7)}  ${(f.identifiability.trustworthy ? "yes" : "no").padEnd(11)}  ${f.management.verdictLabel ?? "-"}`);
  }
}
lines.push(
  "",
  "Caution: these are model projections from invented data, without uncertainty. Real",
  "projections are uncertain; quota decisions follow the management authority's own",
  "procedures, peer review and local regulations. yieldloop informs them and does not replace them.",
);
process.stdout.write(lines.join("\n") + "\n");

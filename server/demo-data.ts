// Loads the invented demonstration data (data-demo/) into a store: each series and scenario
// once, by name, so a restart adds nothing twice. The candidate rules of each scenario are
// stored as named rules too.
import { createHash } from "node:crypto";
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import { parseSeriesCsv } from "../src/fit/series.js";
import { describeIssue } from "../src/issues.js";
import { parseRule } from "../src/policy/rule-spec.js";
import { parseScenarioSpec, ruleJson } from "./http/scenario-input.js";
import type { Repository } from "./store/repository.js";

export const DEMO_DIR = fileURLToPath(new URL("../data-demo/", import.meta.url));

export interface DemoScenarioFile {
  readonly title: string;
  readonly note?: string;
  readonly series?: string;
  readonly model: unknown;
  readonly rule: unknown;
  readonly alternatives?: { label: string; rule: unknown }[];
  readonly start: unknown;
  readonly horizon: unknown;
  readonly startYear?: unknown;
  readonly uncertainty?: unknown;
}

/** A scenario file's scenario spec (model, rule, start, horizon, startYear, uncertainty). */
export function scenarioOfFile(d: DemoScenarioFile): Record<string, unknown> {
  const spec: Record<string, unknown> = { model: d.model, rule: d.rule, start: d.start, horizon: d.horizon };
  if (d.startYear !== undefined) spec.startYear = d.startYear;
  if (d.uncertainty !== undefined) spec.uncertainty = d.uncertainty;
  return spec;
}

/** Loads the demo data; returns what was added (nothing on a second run). */
export function loadDemo(
  repo: Repository,
  dir = DEMO_DIR,
): { series: number; scenarios: number; rules: number } {
  const added = { series: 0, scenarios: 0, rules: 0 };
  const files = readdirSync(join(dir, "scenarios"))
    .filter((f) => f.endsWith(".json"))
    .sort();
  for (const f of files) {
    const d = JSON.parse(readFileSync(join(dir, "scenarios", f), "utf8")) as DemoScenarioFile;
    if (d.series) {
      const csv = readFileSync(join(dir, d.series), "utf8");
      const hash = createHash("sha256").update(csv).digest("hex");
      // Named after the stock (the title up to its colon), so the page can pair a demo's
      // series with its scenario ("Tarn Vell perch" and "Tarn Vell perch: …").
      const name = d.title.split(":")[0]!;
      if (!repo.seriesIdByHash(hash, name)) {
        const s = parseSeriesCsv(csv);
        if (!s.ok) throw new Error(`demo series ${d.series}: ${describeIssue(s.issue)}`);
        repo.insertSeries(name, csv, hash, s.value);
        added.series++;
      }
    }
    if (!repo.specIdByName("scenario", d.title)) {
      const sc = parseScenarioSpec(scenarioOfFile(d));
      if (!sc.ok) throw new Error(`demo scenario ${f}: ${describeIssue(sc.issue)}`);
      repo.insertSpec("scenario", d.title, sc.value.spec);
      added.scenarios++;
    }
    for (const alt of d.alternatives ?? []) {
      const name = `${d.title.split(":")[0]}: ${alt.label}`;
      if (repo.specIdByName("rule", name)) continue;
      const r = parseRule(alt.rule);
      if (!r.ok) throw new Error(`demo rule ${name}: ${describeIssue(r.issue)}`);
      repo.insertSpec("rule", name, ruleJson(r.value));
      added.rules++;
    }
  }
  return added;
}

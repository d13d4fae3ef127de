// Reads a scenario file: the JSON of a stored scenario spec, or the demo format (with a
// title, candidate rules under "alternatives" and an optional uncertainty).
import { readFileSync } from "node:fs";
import { describeIssue } from "../../src/issues.js";
import type { Scenario } from "../../src/sim/scenario.js";
import { parseScenarioSpec } from "../http/scenario-input.js";
import { scenarioOfFile, type DemoScenarioFile } from "../demo-data.js";
import { ISSUE_TABLE } from "../issue-table.js";
import { CliError, EXIT } from "./exit-codes.js";

export interface ScenarioFile {
  readonly title: string;
  readonly spec: Record<string, unknown>;
  readonly scenario: Scenario;
  readonly alternatives: { label: string; rule: unknown }[];
}

export function readJsonFile(path: string): unknown {
  let text: string;
  try {
    text = readFileSync(path, "utf8");
  } catch (e) {
    throw new CliError(`cannot read ${path}: ${(e as Error).message}`, EXIT.invalidInput);
  }
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new CliError(`${path} is not valid JSON: ${(e as Error).message}`, EXIT.invalidInput);
  }
}

export function readScenarioFile(path: string): ScenarioFile {
  const raw = readJsonFile(path) as DemoScenarioFile & Record<string, unknown>;
  const spec = raw && typeof raw === "object" && "model" in raw ? scenarioOfFile(raw) : raw;
  const parsed = parseScenarioSpec(spec, "scenario");
  if (!parsed.ok)
    throw new CliError(
      `${path}: ${ISSUE_TABLE[parsed.issue.code].title}: ${describeIssue(parsed.issue)}`,
      EXIT.invalidInput,
    );
  return {
    title: typeof raw.title === "string" ? raw.title : path,
    spec: parsed.value.spec,
    scenario: parsed.value.scenario,
    alternatives: Array.isArray(raw.alternatives) ? raw.alternatives : [],
  };
}

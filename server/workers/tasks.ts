// Work that runs inside a worker thread: validates the plain-JSON specs it is sent, calls
// src/, and returns plain data (typed arrays are transferred back).
import { parseModel } from "../../src/models/model-spec.js";
import { parseRule } from "../../src/policy/rule-spec.js";
import { type RegimeMap, regimeMap, type RegimeMapOptions } from "../../src/equilibria/regime-map.js";
import {
  bifurcationDiagram,
  type BifurcationOptions,
  type SweepAxis,
} from "../../src/equilibria/bifurcation.js";
import { compareModels } from "../../src/fit/compare-models.js";
import { parseSeriesCsv } from "../../src/fit/series.js";
import type { Issue } from "../../src/issues.js";
import { parseScenario } from "../../src/sim/scenario.js";
import { parseUncertainty } from "../../src/sim/uncertainty.js";
import type { ProjectionParts } from "../../src/sim/projection-parts.js";
import { simulateBlocks } from "../../src/sim/simulate-blocks.js";

export interface RegimeMapTask {
  readonly kind: "regime-map";
  readonly model: unknown;
  readonly rule: unknown;
  readonly x: SweepAxis;
  readonly y: SweepAxis;
  readonly options: Omit<RegimeMapOptions, "columns">;
  readonly columns: readonly [number, number];
}

/** Replicate blocks [from, to) of a stochastic projection, optionally under another rule. */
export interface ProjectionTask {
  readonly kind: "projection-blocks";
  readonly scenario: unknown;
  readonly uncertainty: unknown;
  readonly rule?: unknown;
  readonly blocks: readonly [number, number];
}

export type ProjectionTaskResult = { ok: true; parts: ProjectionParts } | { ok: false; issue: Issue };

/** Every model family fitted to a series and ranked (compareModels). */
export interface FitTask {
  readonly kind: "fit-compare";
  readonly csv: string;
  readonly options: Record<string, unknown>;
}

/** A bifurcation diagram over one parameter. */
export interface BifurcationTask {
  readonly kind: "bifurcation";
  readonly model: unknown;
  readonly rule: unknown;
  readonly axis: SweepAxis;
  readonly options: BifurcationOptions;
}

export type ValueTaskResult = { ok: true; value: unknown } | { ok: false; issue: Issue };

export type TaskResult =
  | {
      ok: true;
      regimes: Uint8Array;
      periods: Uint8Array;
      boundary: RegimeMap["boundary"];
      columns: readonly [number, number];
    }
  | { ok: false; issue: Issue };

export function runTask(
  task: RegimeMapTask | ProjectionTask | FitTask | BifurcationTask,
): TaskResult | ProjectionTaskResult | ValueTaskResult {
  switch (task.kind) {
    case "regime-map":
      return runRegimeMap(task);
    case "projection-blocks":
      return runProjection(task);
    case "fit-compare": {
      const series = parseSeriesCsv(task.csv);
      if (!series.ok) return series;
      return compareModels(series.value, task.options);
    }
    case "bifurcation": {
      const model = parseModel(task.model);
      if (!model.ok) return model;
      const rule = parseRule(task.rule);
      if (!rule.ok) return rule;
      return bifurcationDiagram(model.value, rule.value, task.axis, task.options);
    }
  }
}

function runProjection(task: ProjectionTask): ProjectionTaskResult {
  const scenario = parseScenario(task.scenario);
  if (!scenario.ok) return scenario;
  const uncertainty = parseUncertainty(task.uncertainty, scenario.value.model);
  if (!uncertainty.ok) return uncertainty;
  let rule = scenario.value.rule;
  if (task.rule !== undefined) {
    const r = parseRule(task.rule);
    if (!r.ok) return r;
    rule = r.value;
  }
  return {
    ok: true,
    parts: simulateBlocks(scenario.value, uncertainty.value, task.blocks[0], task.blocks[1], rule),
  };
}

function runRegimeMap(task: RegimeMapTask): TaskResult {
  const model = parseModel(task.model);
  if (!model.ok) return model;
  const rule = parseRule(task.rule);
  if (!rule.ok) return rule;
  const map = regimeMap(model.value, rule.value, task.x, task.y, { ...task.options, columns: task.columns });
  if (!map.ok) return map;
  return {
    ok: true,
    regimes: map.value.regimes,
    periods: map.value.periods,
    boundary: map.value.boundary,
    columns: map.value.columns,
  };
}

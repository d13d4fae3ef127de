// Work that runs inside a worker thread: validates the plain-JSON specs it is sent, calls
// src/, and returns plain data (typed arrays are transferred back).
import { parseModel } from "../../src/models/model-spec.js";
import { parseRule } from "../../src/policy/rule-spec.js";
import { regimeMap, type RegimeMapOptions } from "../../src/equilibria/regime-map.js";
import type { SweepAxis } from "../../src/equilibria/bifurcation.js";
import type { Issue } from "../../src/issues.js";

export interface RegimeMapTask {
  readonly kind: "regime-map";
  readonly model: unknown;
  readonly rule: unknown;
  readonly x: SweepAxis;
  readonly y: SweepAxis;
  readonly options: Omit<RegimeMapOptions, "columns">;
  readonly columns: readonly [number, number];
}

export type TaskResult =
  | { ok: true; regimes: Uint8Array; periods: Uint8Array; boundary: { x: number; y: number; from: number; to: number }[]; columns: readonly [number, number] }
  | { ok: false; issue: Issue };

export function runTask(task: RegimeMapTask): TaskResult {
  const model = parseModel(task.model);
  if (!model.ok) return model;
  const rule = parseRule(task.rule);
  if (!rule.ok) return rule;
  const map = regimeMap(model.value, rule.value, task.x, task.y, { ...task.options, columns: task.columns });
  if (!map.ok) return map;
  return { ok: true, regimes: map.value.regimes, periods: map.value.periods, boundary: map.value.boundary, columns: map.value.columns };
}

import type { Rule } from "../policy/rule-spec.js";
import { summariseProjection, type StochasticProjection } from "./risk-metrics.js";
import type { Scenario } from "./scenario.js";
import type { ProjectionParts } from "./projection-parts.js";
import { projectionBlocks, simulateBlocks } from "./simulate-blocks.js";
import type { Uncertainty } from "./uncertainty.js";

/**
 * A whole stochastic projection on the calling thread (see simulateBlocks for the model of
 * the noise and summariseProjection for the metrics). For large runs off the main thread,
 * use the worker pool, which gives the same numbers bit for bit.
 * `onProgress(done, total)` is called after each block of replicates.
 */
export function projectStochastic(
  scenario: Scenario,
  uncertainty: Uncertainty,
  options: { rule?: Rule; onProgress?: (done: number, total: number) => void } = {},
): StochasticProjection {
  const total = projectionBlocks(uncertainty);
  const parts: ProjectionParts[] = [];
  for (let b = 0; b < total; b++) {
    parts.push(simulateBlocks(scenario, uncertainty, b, b + 1, options.rule));
    options.onProgress?.(b + 1, total);
  }
  return summariseProjection(parts, scenario, uncertainty);
}

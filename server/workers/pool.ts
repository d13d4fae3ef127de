// A worker pool for long analyses (piscina), splitting a regime map by columns.
import { setMaxListeners } from "node:events";
import { Piscina } from "piscina";
import { REGIMES, type Regime } from "../../src/equilibria/long-run.js";
import { axisValues, type SweepAxis } from "../../src/equilibria/bifurcation.js";
import type { RegimeMap, RegimeMapOptions } from "../../src/equilibria/regime-map.js";
import type { Issue } from "../../src/issues.js";
import { parseRule } from "../../src/policy/rule-spec.js";
import { summariseProjection, type StochasticProjection } from "../../src/sim/risk-metrics.js";
import { parseScenario } from "../../src/sim/scenario.js";
import { projectionBlocks } from "../../src/sim/simulate-blocks.js";
import { parseRules, ruleOutcome, type RuleOutcome } from "../../src/sim/rule-comparison.js";
import { parseUncertainty } from "../../src/sim/uncertainty.js";
import type {
  BifurcationTask,
  FitTask,
  ProjectionTask,
  ProjectionTaskResult,
  RegimeMapTask,
  TaskResult,
  ValueTaskResult,
} from "./tasks.js";

export interface AnalysisPool {
  readonly threads: number;
  regimeMap(
    req: {
      model: unknown;
      rule: unknown;
      x: SweepAxis;
      y: SweepAxis;
      options?: Omit<RegimeMapOptions, "columns">;
    },
    signal?: AbortSignal,
    onProgress?: (done: number, total: number) => void,
  ): Promise<PooledRegimeMap>;
  /**
   * A stochastic projection split by replicate blocks across the workers; the same numbers,
   * bit for bit, as projectStochastic on one thread. `rule` (a rule spec) replaces the
   * scenario's rule. Rejects with an AbortError when the signal fires.
   */
  projection(
    req: { scenario: unknown; uncertainty: unknown; rule?: unknown },
    signal?: AbortSignal,
    onProgress?: (done: number, total: number) => void,
  ): Promise<{ ok: true; value: StochasticProjection } | { ok: false; issue: Issue }>;
  /** Candidate rules compared on the same draws (see compareRules in src/sim/rule-comparison.ts). */
  compareRules(
    req: { scenario: unknown; uncertainty: unknown; rules: unknown },
    signal?: AbortSignal,
    onProgress?: (done: number, total: number) => void,
  ): Promise<{ ok: true; value: RuleOutcome[] } | { ok: false; issue: Issue }>;
  /** Runs a fit comparison or a bifurcation diagram on a worker. */
  run(task: FitTask | BifurcationTask, signal?: AbortSignal): Promise<ValueTaskResult>;
  close(): Promise<void>;
}

export type PooledRegimeMap =
  | {
      ok: true;
      x: { path: string; values: number[] };
      y: { path: string; values: number[] };
      /** Each cell's long-run regime by name, row-major: cell (i, j) at [j·nx + i]. */
      regimes: Regime[];
      /** Each cell's cycle period in years, null where it is not a cycle. */
      periods: (number | null)[];
      boundary: RegimeMap["boundary"];
    }
  | { ok: false; issue: Issue };

/** Starts a pool of `threads` workers (default: the machine's cores, at least 1). */
export function createAnalysisPool(threads: number): AnalysisPool {
  const piscina = new Piscina({
    filename: new URL("./worker.mjs", import.meta.url).href,
    minThreads: threads,
    maxThreads: threads,
    idleTimeout: 60_000,
  });
  return {
    threads,
    async regimeMap(req, signal, onProgress) {
      if (signal) setMaxListeners(1000, signal);
      const nx = req.x.count;
      // Interleave column blocks so every worker gets a similar mix of easy and hard cells.
      const blocks = Math.max(threads * 16, 1);
      const width = Math.max(1, Math.ceil(nx / blocks));
      const tasks: RegimeMapTask[] = [];
      for (let c = 0; c < nx; c += width) {
        tasks.push({
          kind: "regime-map",
          model: req.model,
          rule: req.rule,
          x: req.x,
          y: req.y,
          options: req.options ?? {},
          columns: [c, Math.min(nx, c + width)],
        });
      }
      let done = 0;
      const results = await Promise.all(
        tasks.map(async (t) => {
          const r = (await piscina.run(t, { signal })) as TaskResult;
          onProgress?.(++done, tasks.length);
          return r;
        }),
      );
      const ny = req.y.count;
      // The workers send regime indices (small typed arrays travel cheaply); names from here on.
      const regimes = new Array<Regime>(nx * ny);
      const periods = new Array<number | null>(nx * ny);
      const boundary: RegimeMap["boundary"] = [];
      for (const r of results) {
        if (!r.ok) return r;
        const [c0, c1] = r.columns;
        for (let j = 0; j < ny; j++) {
          for (let i = c0; i < c1; i++) {
            regimes[j * nx + i] = REGIMES[r.regimes[j * nx + i]!]!;
            periods[j * nx + i] = r.periods[j * nx + i]! || null;
          }
        }
        boundary.push(...r.boundary);
      }
      boundary.sort((a, b) => a.x - b.x || a.y - b.y);
      return {
        ok: true,
        x: { path: req.x.path, values: axisValues(req.x) },
        y: { path: req.y.path, values: axisValues(req.y) },
        regimes,
        periods,
        boundary,
      };
    },
    async projection(req, signal, onProgress) {
      // One signal is shared by every chunk's task (each adds an abort listener).
      if (signal) setMaxListeners(1000, signal);
      // Validate here too: a bad request fails before any worker starts, with the field named.
      const scenario = parseScenario(req.scenario);
      if (!scenario.ok) return scenario;
      const uncertainty = parseUncertainty(req.uncertainty, scenario.value.model);
      if (!uncertainty.ok) return uncertainty;
      if (req.rule !== undefined) {
        const r = parseRule(req.rule);
        if (!r.ok) return r;
      }
      const blocks = projectionBlocks(uncertainty.value);
      // A few chunks per worker, so progress moves and the last chunks balance the load, but
      // none much under 2.5 million population-steps (about 60 ms): each chunk carries its own
      // histograms, and small chunks spend more on those than on the simulation.
      const steps = uncertainty.value.replicates * scenario.value.horizon;
      const chunks = Math.min(blocks, threads * 4, Math.max(threads, Math.ceil(steps / 2.5e6)));
      const tasks: ProjectionTask[] = [];
      for (let c = 0; c < chunks; c++) {
        const from = Math.floor((c * blocks) / chunks);
        const to = Math.floor(((c + 1) * blocks) / chunks);
        tasks.push({
          kind: "projection-blocks",
          scenario: req.scenario,
          uncertainty: req.uncertainty,
          ...(req.rule !== undefined ? { rule: req.rule } : {}),
          blocks: [from, to],
        });
      }
      let done = 0;
      const results = await Promise.all(
        tasks.map(async (t) => {
          const r = (await piscina.run(t, { signal })) as ProjectionTaskResult;
          done += t.blocks[1] - t.blocks[0];
          onProgress?.(done, blocks);
          return r;
        }),
      );
      const parts = [];
      for (const r of results) {
        if (!r.ok) return r;
        parts.push(r.parts);
      }
      return { ok: true, value: summariseProjection(parts, scenario.value, uncertainty.value) };
    },
    async compareRules(req, signal, onProgress) {
      const scenario = parseScenario(req.scenario);
      if (!scenario.ok) return scenario;
      const rules = parseRules(req.rules);
      if (!rules.ok) return rules;
      const specs = req.rules as unknown[];
      const out: RuleOutcome[] = [];
      for (let i = 0; i < specs.length; i++) {
        const p = await this.projection(
          { scenario: req.scenario, uncertainty: req.uncertainty, rule: specs[i] },
          signal,
          (d, total) => onProgress?.(i * total + d, specs.length * total),
        );
        if (!p.ok) return p;
        out.push(ruleOutcome(scenario.value, rules.value[i]!, p.value));
      }
      return { ok: true, value: out };
    },
    run: async (task, signal) => (await piscina.run(task, { signal })) as ValueTaskResult,
    close: () => piscina.destroy(),
  };
}

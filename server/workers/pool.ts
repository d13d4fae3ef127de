// A worker pool for long analyses (piscina), splitting a regime map by columns.
import { Piscina } from "piscina";
import { REGIMES } from "../../src/equilibria/long-run.js";
import { axisValues, type SweepAxis } from "../../src/equilibria/bifurcation.js";
import type { RegimeMapOptions } from "../../src/equilibria/regime-map.js";
import type { Issue } from "../../src/issues.js";
import type { RegimeMapTask, TaskResult } from "./tasks.js";

export interface AnalysisPool {
  readonly threads: number;
  regimeMap(req: { model: unknown; rule: unknown; x: SweepAxis; y: SweepAxis; options?: Omit<RegimeMapOptions, "columns"> }, signal?: AbortSignal, onProgress?: (done: number, total: number) => void): Promise<PooledRegimeMap>;
  close(): Promise<void>;
}

export type PooledRegimeMap =
  | { ok: true; x: { path: string; values: number[] }; y: { path: string; values: number[] }; regimes: Uint8Array; periods: Uint8Array; regimeNames: readonly string[]; boundary: { x: number; y: number; from: number; to: number }[] }
  | { ok: false; issue: Issue };

/** Starts a pool of `threads` workers (default: the machine's cores, at least 1). */
export function createAnalysisPool(threads: number): AnalysisPool {
  const piscina = new Piscina({ filename: new URL("./worker.mjs", import.meta.url).href, minThreads: threads, maxThreads: threads, idleTimeout: 60_000 });
  return {
    threads,
    async regimeMap(req, signal, onProgress) {
      const nx = req.x.count;
      // Interleave column blocks so every worker gets a similar mix of easy and hard cells.
      const blocks = Math.max(threads * 16, 1);
      const width = Math.max(1, Math.ceil(nx / blocks));
      const tasks: RegimeMapTask[] = [];
      for (let c = 0; c < nx; c += width) {
        tasks.push({ kind: "regime-map", model: req.model, rule: req.rule, x: req.x, y: req.y, options: req.options ?? {}, columns: [c, Math.min(nx, c + width)] });
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
      const regimes = new Uint8Array(nx * ny);
      const periods = new Uint8Array(nx * ny);
      const boundary: { x: number; y: number; from: number; to: number }[] = [];
      for (const r of results) {
        if (!r.ok) return r;
        const [c0, c1] = r.columns;
        for (let j = 0; j < ny; j++) {
          for (let i = c0; i < c1; i++) {
            regimes[j * nx + i] = r.regimes[j * nx + i]!;
            periods[j * nx + i] = r.periods[j * nx + i]!;
          }
        }
        boundary.push(...r.boundary);
      }
      boundary.sort((a, b) => a.x - b.x || a.y - b.y);
      return { ok: true, x: { path: req.x.path, values: axisValues(req.x) }, y: { path: req.y.path, values: axisValues(req.y) }, regimes, periods, regimeNames: REGIMES, boundary };
    },
    close: () => piscina.destroy(),
  };
}

import type { Model } from "../models/model-spec.js";
import { closedLoop, type ClosedLoop } from "../policy/closed-loop.js";
import type { Rule } from "../policy/rule-spec.js";
import { fail, ok, type Result } from "../result.js";
import { axisValues, checkSweepAxis, sweepAt, type SweepAxis } from "./bifurcation.js";
import { longRun, longRunBatch, REGIMES, type LongRunOptions } from "./long-run.js";
import { type OperatingVerdict, operatingVerdict } from "./operating-verdict.js";

export interface RegimeMapOptions extends LongRunOptions {
  /** Start abundance and history (default K/2). */
  readonly start?: readonly number[];
  /** Compute only columns [from, to) of the x axis (for splitting across workers). */
  readonly columns?: readonly [number, number];
  /** Rows between Jury checks before bisection (default 8). */
  readonly boundaryStride?: number;
}

export interface RegimeMap {
  readonly x: { readonly path: string; readonly values: number[] };
  readonly y: { readonly path: string; readonly values: number[] };
  readonly columns: readonly [number, number];
  /** Regime index into REGIMES for cell (i, j) at [j·nx + i] (only the computed columns are filled). */
  readonly regimes: Uint8Array;
  /** Cycle period (0 when not a cycle). */
  readonly periods: Uint8Array;
  /** Points where the Jury verdict of the largest positive equilibrium changes along y, per column. */
  readonly boundary: { x: number; y: number; from: OperatingVerdict; to: OperatingVerdict }[];
}

/**
 * Regime map over two parameters: every cell's long-run regime by iteration (longRun) and,
 * column by column, the Jury stability boundary of the largest positive equilibrium so it
 * can be drawn over the cells. The verdict is checked every `boundaryStride` rows (default 8) and each
 * change is located by 30 bisection steps in y (to about 1e-9 of the y range).
 * Sources: May, R. M. (1976). Nature 261: 459–467; Jury, E. I. (1964). Theory and
 * Application of the z-Transform Method. Wiley.
 */
export function regimeMap(
  model: Model,
  rule: Rule,
  xAxis: SweepAxis,
  yAxis: SweepAxis,
  options: RegimeMapOptions = {},
): Result<RegimeMap> {
  const ax = checkSweepAxis(model, rule, xAxis, "x");
  if (!ax.ok) return ax;
  const ay = checkSweepAxis(model, rule, yAxis, "y");
  if (!ay.ok) return ay;
  if (xAxis.path === yAxis.path)
    return fail({
      code: "constraint_violated",
      field: "y.path",
      constraint: "the two axes must be different parameters",
    });
  const xs = axisValues(xAxis);
  const ys = axisValues(yAxis);
  const nx = xs.length;
  const [c0, c1] = options.columns ?? [0, nx];
  const K = model.params.K!;
  const start = options.start ?? [K / 2];
  const regimes = new Uint8Array(nx * ys.length);
  const periods = new Uint8Array(nx * ys.length);
  const boundary: RegimeMap["boundary"] = [];
  const stride = Math.max(1, options.boundaryStride ?? 8);
  for (let i = c0; i < c1; i++) {
    const xv = xs[i]!;
    const column = sweepAt(model, rule, ax.value, xv);
    if (!column.ok) continue;
    const at = (yv: number) => {
      const m2 = sweepAt(column.value.model, column.value.rule, ay.value, yv);
      return m2.ok ? closedLoop(m2.value.model, m2.value.rule) : null;
    };
    let tracked: number | undefined;
    const verdict = (yv: number) => {
      const loop = at(yv);
      if (!loop) return "none";
      const v = operatingVerdict(loop, tracked);
      tracked = v.verdict === "none" ? undefined : v.abundance;
      return v.verdict;
    };
    const rows: number[] = [];
    const loops: ClosedLoop[] = [];
    for (let j = 0; j < ys.length; j++) {
      const loop = at(ys[j]!);
      if (!loop) continue;
      rows.push(j);
      loops.push(loop);
    }
    const starts = loops.length > 0 ? loops[0]!.initialState(start) : new Float64Array(1);
    const runs = loops.every((l) => l.layout.dimension === 1)
      ? longRunBatch(loops, starts, { ...options, points: false })
      : loops.map((l) => longRun(l, l.initialState(start), { ...options, points: false }));
    for (let r = 0; r < rows.length; r++) {
      const j = rows[r]!;
      regimes[j * nx + i] = REGIMES.indexOf(runs[r]!.regime);
      periods[j * nx + i] = runs[r]!.period ?? 0;
    }
    let prevY = ys[0]!;
    let prev = verdict(prevY);
    for (let j = stride; j < ys.length + stride - 1; j += stride) {
      const yv = ys[Math.min(j, ys.length - 1)]!;
      const v = verdict(yv);
      if (v !== prev) {
        let a = prevY;
        let b = yv;
        for (let k = 0; k < 30 && !ay.value.integer; k++) {
          const mid = 0.5 * (a + b);
          if (verdict(mid) === prev) a = mid;
          else b = mid;
        }
        boundary.push({ x: xv, y: ay.value.integer ? b : 0.5 * (a + b), from: prev, to: v });
      }
      prev = v;
      prevY = yv;
    }
  }
  return ok({
    x: { path: xAxis.path, values: xs },
    y: { path: yAxis.path, values: ys },
    columns: [c0, c1],
    regimes,
    periods,
    boundary,
  });
}

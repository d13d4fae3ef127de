import type { Model } from "../models/model-spec.js";
import { closedLoop } from "../policy/closed-loop.js";
import type { Rule } from "../policy/rule-spec.js";
import { fail, ok, type Result } from "../result.js";
import { longRun, type Regime } from "./long-run.js";
import { type OperatingVerdict, operatingVerdict } from "./operating-verdict.js";
import { parameterAxis, withParameter, type ParameterAxis } from "./parameter-path.js";

export interface SweepAxis {
  /** Parameter path, e.g. `model.params.r` or `rule.rate`. */
  readonly path: string;
  readonly from: number;
  readonly to: number;
  /** Number of values, from and to included (2 … 2000). */
  readonly count: number;
}

export interface BifurcationOptions {
  readonly burnIn?: number;
  readonly observe?: number;
  /** Start abundance and history, as in a scenario (default K/2). */
  readonly start?: readonly number[];
}

export interface BifurcationDiagram {
  readonly parameter: string;
  readonly values: number[];
  /** The distinct long-run abundances at each value (one for an equilibrium, k for a k-cycle, up to `observe`). */
  readonly points: number[][];
  readonly regimes: Regime[];
  readonly periods: (number | null)[];
  /** N* of the largest positive equilibrium at each value (null: none, the stock collapses). */
  readonly equilibrium: (number | null)[];
  /** The Jury verdict of the largest positive equilibrium at each value ("none" when there is none). */
  readonly stability: OperatingVerdict[];
  /** Values at which that verdict changes, located by bisection between neighbouring values. */
  readonly boundaries: { value: number; from: OperatingVerdict; to: OperatingVerdict }[];
}

/**
 * Validates a sweep axis: a known parameter path (`<name>.path`), 2 … 2000 values
 * (`<name>.count`), and both ends inside the parameter's range (`<name>.from`, `<name>.to`).
 */
export function checkSweepAxis(
  model: Model,
  rule: Rule,
  axis: SweepAxis,
  name: string,
): Result<ParameterAxis> {
  const ax = parameterAxis(model, rule, axis.path, `${name}.path`);
  if (!ax.ok) return ax;
  if (!Number.isInteger(axis.count) || axis.count < 2 || axis.count > 2000) {
    return fail({
      code: "param_out_of_range",
      field: `${name}.count`,
      value: axis.count,
      min: 2,
      max: 2000,
      minInclusive: true,
      maxInclusive: true,
    });
  }
  for (const [end, v] of [
    ["from", axis.from],
    ["to", axis.to],
  ] as const) {
    const check = sweepAt(model, rule, ax.value, v);
    if (!check.ok) return fail({ ...check.issue, field: `${name}.${end}` } as typeof check.issue);
  }
  return ax;
}

/** The model and rule at one value of a sweep (integer parameters rounded to whole years). */
export function sweepAt(
  model: Model,
  rule: Rule,
  axis: ParameterAxis,
  value: number,
): Result<{ model: Model; rule: Rule }> {
  return withParameter(model, rule, axis, axis.integer ? Math.round(value) : value);
}

/** The `count` evenly spaced values of an axis, ends included. */
export function axisValues(axis: SweepAxis): number[] {
  const out: number[] = [];
  for (let i = 0; i < axis.count; i++)
    out.push(axis.count === 1 ? axis.from : axis.from + ((axis.to - axis.from) * i) / (axis.count - 1));
  return out;
}

/**
 * Bifurcation diagram over one parameter: for each value the long-run abundances by
 * iteration (longRun: burn-in, then the observed points, cycles and irregular orbits told
 * apart), and the largest positive equilibrium with its Jury verdict, whose changes are
 * returned as boundaries (located by 40 bisection steps) to draw over the points.
 * Source: May, R. M. (1976). Nature 261: 459–467 (the diagram for the logistic map).
 */
export function bifurcationDiagram(
  model: Model,
  rule: Rule,
  axis: SweepAxis,
  options: BifurcationOptions = {},
): Result<BifurcationDiagram> {
  const ax = checkSweepAxis(model, rule, axis, "axis");
  if (!ax.ok) return ax;
  const values = axisValues(axis);
  const K = model.params.K!;
  const start = options.start ?? [K / 2];
  const points: number[][] = [];
  const regimes: Regime[] = [];
  const periods: (number | null)[] = [];
  const equilibrium: (number | null)[] = [];
  const stability: OperatingVerdict[] = [];
  const verdictAt = (v: number) => {
    const varied = sweepAt(model, rule, ax.value, v);
    if (!varied.ok) return { verdict: "none", abundance: null } as const;
    const res = operatingVerdict(closedLoop(varied.value.model, varied.value.rule));
    return res.verdict === "none" ? ({ verdict: "none", abundance: null } as const) : res;
  };
  for (const v of values) {
    const varied = sweepAt(model, rule, ax.value, v);
    if (!varied.ok) return varied;
    const loop = closedLoop(varied.value.model, varied.value.rule);
    const run = longRun(loop, loop.initialState(start), options);
    const distinct =
      run.regime === "cycle" || run.regime === "equilibrium" || run.regime === "extinct"
        ? run.points
        : dedupe(run.points, 1e-9 * K);
    points.push(distinct);
    regimes.push(run.regime);
    periods.push(run.period);
    const vd = verdictAt(v);
    equilibrium.push(vd.abundance);
    stability.push(vd.verdict);
  }
  const boundaries: BifurcationDiagram["boundaries"] = [];
  for (let i = 1; i < values.length; i++) {
    if (stability[i] === stability[i - 1]) continue;
    let a = values[i - 1]!;
    let b = values[i]!;
    if (!ax.value.integer) {
      for (let k = 0; k < 40; k++) {
        const mid = 0.5 * (a + b);
        if (verdictAt(mid).verdict === stability[i - 1]) a = mid;
        else b = mid;
      }
    }
    boundaries.push({
      value: ax.value.integer ? b : 0.5 * (a + b),
      from: stability[i - 1]!,
      to: stability[i]!,
    });
  }
  return ok({ parameter: axis.path, values, points, regimes, periods, equilibrium, stability, boundaries });
}

function dedupe(values: readonly number[], tol: number): number[] {
  const sorted = [...values].sort((p, q) => p - q);
  const out: number[] = [];
  for (const v of sorted) if (out.length === 0 || v - out[out.length - 1]! > tol) out.push(v);
  return out;
}
